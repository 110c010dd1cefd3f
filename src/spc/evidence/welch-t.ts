/**
 * Before/after an event: Welch's two-sample t test (unequal variances; Welch 1947, Biometrika 34,
 * 28–35, with the Welch–Satterthwaite degrees of freedom), computed by @stdlib/stats-ttest2, whose
 * default is the unequal-variance form. The effect is the change in mean (after − before) with its
 * confidence interval.
 *
 * Refusals (thrown SpcInputError): non-finite values, fewer than 2 values on either side, or no
 * variation on both sides (the standard error is zero and t is undefined).
 */
import ttest2 from "@stdlib/stats-ttest2";
import { SpcInputError } from "../types";
import { mean, sampleVariance } from "./groups";
import { requireFiniteValues } from "./input";
import { direction, type EvidenceLabels, type EvidenceResult, formatAmount, formatNumber, formatPValue, variableName } from "./sentence";

export interface MeanChangeEffect {
  readonly meanBefore: number;
  readonly meanAfter: number;
  /** meanAfter − meanBefore. */
  readonly difference: number;
  /** Confidence interval of the difference (after − before) at `level`. */
  readonly confidenceInterval: readonly [number, number];
  readonly level: number;
}

export function welchTTest(
  before: ArrayLike<number>,
  after: ArrayLike<number>,
  labels: EvidenceLabels = {},
  level = 0.95,
): EvidenceResult<MeanChangeEffect> {
  requireFiniteValues(before, "Welch t test (before)", 2);
  requireFiniteValues(after, "Welch t test (after)", 2);
  if (sampleVariance(before) === 0 && sampleVariance(after) === 0) {
    throw new SpcInputError("Welch t test: no variation before or after, so t is undefined");
  }
  // stdlib tests x − y; pass (after, before) so the effect reads as the change after the event.
  const result = ttest2(Array.from(after), Array.from(before), { variance: "unequal", alpha: 1 - level });
  const meanBefore = mean(before);
  const meanAfter = mean(after);
  const difference = meanAfter - meanBefore;
  const [low, high] = result.ci as [number, number];
  return {
    test: "Welch t test",
    statistic: result.statistic,
    df: result.df,
    pValue: result.pValue,
    effect: { meanBefore, meanAfter, difference, confidenceInterval: [low, high], level },
    sentence:
      `after the event ${variableName(labels)} runs ${formatAmount(Math.abs(difference), labels)} ${direction(difference)} ` +
      `(${Math.round(level * 100)} % interval ${formatAmount(low, labels)} to ${formatAmount(high, labels)}); ` +
      `Welch t = ${formatNumber(result.statistic)}, df = ${formatNumber(result.df)}, ${formatPValue(result.pValue)}`,
  };
}
