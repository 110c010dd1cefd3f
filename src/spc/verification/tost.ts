/**
 * Two one-sided tests (TOST) for equivalence of a mean to a reference within ±margin (Schuirmann, D.J.
 * (1987), "A comparison of the two one-sided tests procedure and the power approach for assessing the
 * equivalence of average bioavailability", Journal of Pharmacokinetics and Biopharmaceutics 15(6),
 * 657–680). With an estimated difference d, its standard error se and ν degrees of freedom:
 *   t_lower = (d + margin)/se tests H0: true difference ≤ −margin against > −margin,
 *   t_upper = (d − margin)/se tests H0: true difference ≥ +margin against < +margin,
 * with p_lower = P(T_ν ≥ t_lower), p_upper = P(T_ν ≤ t_upper). Equivalence is shown at level α when
 * both nulls are rejected, i.e. when max(p_lower, p_upper) < α — the same as the (1 − 2α) confidence
 * interval d ± t_{1−α,ν}·se lying inside (−margin, +margin).
 * Forms: one sample against a fixed reference (se = s/√n, ν = n − 1) and two independent samples with
 * Welch's standard error and Welch–Satterthwaite degrees of freedom (Welch 1947, Biometrika 34).
 * t probabilities and quantiles from @stdlib/stats-base-dists-t-cdf / -t-quantile.
 * Refusals (SpcInputError): fewer than 2 values, non-finite values, a margin that is not positive,
 * zero variance (the standard error would be 0 and the statistics undefined).
 */
import tCdf from "@stdlib/stats-base-dists-t-cdf";
import tQuantile from "@stdlib/stats-base-dists-t-quantile";
import { SpcInputError } from "../types";

export interface EquivalenceTest {
  readonly test: string;
  /** Estimated difference (mean − reference, or first mean − second mean). */
  readonly difference: number;
  readonly standardError: number;
  readonly degreesOfFreedom: number;
  readonly margin: number;
  readonly lower: { readonly statistic: number; readonly pValue: number };
  readonly upper: { readonly statistic: number; readonly pValue: number };
  /** max of the two one-sided p-values: the p-value of the equivalence test. */
  readonly pValue: number;
  /** The (1 − 2α) confidence interval of the difference. */
  readonly interval: { readonly lower: number; readonly upper: number; readonly level: number };
  readonly alpha: number;
  readonly equivalent: boolean;
}

function meanAndVariance(values: ArrayLike<number>, name: string): { mean: number; variance: number; count: number } {
  const count = values.length;
  if (count < 2) throw new SpcInputError(`${name}: equivalence needs at least 2 values, got ${count}`);
  let sum = 0;
  for (let index = 0; index < count; index++) {
    const value = values[index]!;
    if (!Number.isFinite(value)) throw new SpcInputError(`${name}: value at index ${index} is not a finite number`, index);
    sum += value;
  }
  const mean = sum / count;
  let squares = 0;
  for (let index = 0; index < count; index++) squares += (values[index]! - mean) ** 2;
  return { mean, variance: squares / (count - 1), count };
}

/** TOST from a difference, its standard error and degrees of freedom. */
export function twoOneSidedTests(
  test: string,
  difference: number,
  standardError: number,
  degreesOfFreedom: number,
  margin: number,
  alpha = 0.05,
): EquivalenceTest {
  if (!(margin > 0) || !Number.isFinite(margin)) throw new SpcInputError(`equivalence margin must be a positive number, got ${margin}`);
  if (!(alpha > 0 && alpha < 0.5)) throw new SpcInputError(`alpha must lie strictly between 0 and 0.5, got ${alpha}`);
  if (!(standardError > 0)) throw new SpcInputError("equivalence: the values do not vary, so the standard error is 0");
  const lowerStatistic = (difference + margin) / standardError;
  const upperStatistic = (difference - margin) / standardError;
  const lowerP = 1 - tCdf(lowerStatistic, degreesOfFreedom);
  const upperP = tCdf(upperStatistic, degreesOfFreedom);
  const pValue = Math.max(lowerP, upperP);
  const halfWidth = tQuantile(1 - alpha, degreesOfFreedom) * standardError;
  return {
    test,
    difference,
    standardError,
    degreesOfFreedom,
    margin,
    lower: { statistic: lowerStatistic, pValue: lowerP },
    upper: { statistic: upperStatistic, pValue: upperP },
    pValue,
    interval: { lower: difference - halfWidth, upper: difference + halfWidth, level: 1 - 2 * alpha },
    alpha,
    equivalent: pValue < alpha,
  };
}

/** One-sample TOST: is the mean of `values` within ±margin of `reference`? */
export function oneSampleEquivalence(values: ArrayLike<number>, reference: number, margin: number, alpha = 0.05): EquivalenceTest {
  const { mean, variance, count } = meanAndVariance(values, "one-sample TOST");
  if (!Number.isFinite(reference)) throw new SpcInputError("one-sample TOST: the reference must be finite");
  return twoOneSidedTests("two one-sided t-tests (one sample)", mean - reference, Math.sqrt(variance / count), count - 1, margin, alpha);
}

/** Two-sample TOST with Welch's standard error: is mean(first) − mean(second) within ±margin? */
export function welchEquivalence(first: ArrayLike<number>, second: ArrayLike<number>, margin: number, alpha = 0.05): EquivalenceTest {
  const a = meanAndVariance(first, "Welch TOST (first sample)");
  const b = meanAndVariance(second, "Welch TOST (second sample)");
  const shareA = a.variance / a.count;
  const shareB = b.variance / b.count;
  const standardError = Math.sqrt(shareA + shareB);
  const degreesOfFreedom = (shareA + shareB) ** 2 / (shareA ** 2 / (a.count - 1) + shareB ** 2 / (b.count - 1));
  return twoOneSidedTests("two one-sided t-tests (Welch)", a.mean - b.mean, standardError, degreesOfFreedom, margin, alpha);
}
