/**
 * Mann–Kendall test for a monotonic trend (Mann, H.B. (1945), "Nonparametric tests against trend",
 * Econometrica 13, 245–259; Kendall, M.G. (1975), Rank Correlation Methods, 4th ed., Griffin), with
 * Sen's slope as its effect (Sen, P.K. (1968), "Estimates of the regression coefficient based on
 * Kendall's tau", JASA 63, 1379–1389). Formulas as in Gilbert, R.O. (1987), Statistical Methods for
 * Environmental Pollution Monitoring, §16.4 (from memory):
 *   S = Σ_{i<j} sign(x_j − x_i),
 *   Var(S) = [n(n−1)(2n+5) − Σ_g t_g(t_g−1)(2t_g+5)] / 18   (t_g = size of the g-th group of ties),
 *   Z = (S − 1)/√Var(S) if S > 0, 0 if S = 0, (S + 1)/√Var(S) if S < 0   (continuity correction),
 *   two-sided p = 2(1 − Φ(|Z|)) (normal approximation, adequate from about n = 10);
 *   Kendall's τ = S / (n(n−1)/2); Sen's slope = median over i < j of (x_j − x_i)/(j − i),
 * in units per subgroup (the series is taken as equally spaced).
 * Cost: O(n²) pairs (n up to a few thousand).
 *
 * Refusals (thrown SpcInputError): non-finite values, fewer than 4 values, all values equal.
 */
import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import { SpcInputError } from "../types";
import { median } from "./groups";
import { requireFiniteValues } from "./input";
import { direction, type EvidenceLabels, type EvidenceResult, formatAmount, formatNumber, formatPValue, variableName } from "./sentence";

export interface TrendEffect {
  /** Sen's slope, change per subgroup. */
  readonly senSlope: number;
  readonly kendallTau: number;
  /** The Mann–Kendall S score and its tie-corrected variance. */
  readonly score: number;
  readonly variance: number;
}

/** Tie-corrected variance of S under no trend. */
export function mannKendallVariance(values: ArrayLike<number>): number {
  const count = values.length;
  const sorted = Float64Array.from(values).sort();
  let tieTerm = 0;
  let start = 0;
  while (start < count) {
    let end = start;
    while (end + 1 < count && sorted[end + 1] === sorted[start]) end++;
    const ties = end - start + 1;
    tieTerm += ties * (ties - 1) * (2 * ties + 5);
    start = end + 1;
  }
  return (count * (count - 1) * (2 * count + 5) - tieTerm) / 18;
}

export function mannKendall(values: ArrayLike<number>, labels: EvidenceLabels = {}): EvidenceResult<TrendEffect> {
  requireFiniteValues(values, "Mann–Kendall", 4);
  const count = values.length;
  let score = 0;
  const slopes = new Float64Array((count * (count - 1)) / 2);
  let pair = 0;
  for (let first = 0; first < count - 1; first++) {
    for (let second = first + 1; second < count; second++) {
      const difference = (values[second] as number) - (values[first] as number);
      score += Math.sign(difference);
      slopes[pair++] = difference / (second - first);
    }
  }
  const variance = mannKendallVariance(values);
  if (variance === 0) throw new SpcInputError("Mann–Kendall: all values are equal, so there is no trend to test");
  const statistic = score === 0 ? 0 : (score - Math.sign(score)) / Math.sqrt(variance);
  const pValue = Math.min(1, 2 * (1 - normalCdf(Math.abs(statistic), 0, 1)));
  const senSlope = median(slopes);
  const kendallTau = score / slopes.length;
  return {
    test: "Mann–Kendall trend test",
    statistic,
    pValue,
    effect: { senSlope, kendallTau, score, variance },
    sentence:
      `${variableName(labels)} drifts ${direction(senSlope)} by ${formatAmount(Math.abs(senSlope), labels)} per subgroup ` +
      `(Sen's slope; Kendall τ = ${formatNumber(kendallTau, 2)}); Mann–Kendall Z = ${formatNumber(statistic)}, ${formatPValue(pValue)}`,
  };
}
