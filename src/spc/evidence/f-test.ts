/**
 * Before/after an event: the F test of two variances, F = s²_after / s²_before with
 * (n_after − 1, n_before − 1) degrees of freedom (NIST/SEMATECH e-Handbook §1.3.5.9, "F-Test for
 * Equality of Two Variances"), p-value from the F distribution of @stdlib/stats-base-dists-f-cdf.
 * Two-sided p = 2·min(P(F ≤ f), P(F ≥ f)); "greater" tests whether the spread grew (the question a
 * verification asks), "less" whether it shrank. Sensitive to non-normal data: Brown–Forsythe is the
 * robust companion (./brown-forsythe.ts).
 *
 * Refusals (thrown SpcInputError): non-finite values, fewer than 2 values on either side, zero
 * variance before (the ratio is undefined).
 */
import fCdf from "@stdlib/stats-base-dists-f-cdf";
import { SpcInputError } from "../types";
import { sampleVariance } from "./groups";
import { requireFiniteValues } from "./input";
import { type EvidenceLabels, type EvidenceResult, formatNumber, formatPValue, variableName } from "./sentence";

export type Alternative = "two-sided" | "greater" | "less";

export interface SpreadChangeEffect {
  readonly sdBefore: number;
  readonly sdAfter: number;
  /** sdAfter / sdBefore. */
  readonly sdRatio: number;
}

/** The plain words for a ratio of standard deviations. */
export function spreadSentence(ratio: number, labels: EvidenceLabels): string {
  const change = ratio >= 1 ? `${formatNumber((ratio - 1) * 100, 2)} % wider` : `${formatNumber((1 - ratio) * 100, 2)} % narrower`;
  return `after the event the spread of ${variableName(labels)} is ${change} (standard deviation × ${formatNumber(ratio)})`;
}

export function varianceRatioTest(
  before: ArrayLike<number>,
  after: ArrayLike<number>,
  labels: EvidenceLabels = {},
  alternative: Alternative = "two-sided",
): EvidenceResult<SpreadChangeEffect> {
  requireFiniteValues(before, "F test (before)", 2);
  requireFiniteValues(after, "F test (after)", 2);
  const varianceBefore = sampleVariance(before);
  if (varianceBefore === 0) throw new SpcInputError("F test: no variation before the event, so the ratio is undefined");
  const varianceAfter = sampleVariance(after);
  const statistic = varianceAfter / varianceBefore;
  const df: readonly [number, number] = [after.length - 1, before.length - 1];
  const lower = fCdf(statistic, df[0], df[1]);
  const pValue = alternative === "greater" ? 1 - lower : alternative === "less" ? lower : Math.min(1, 2 * Math.min(lower, 1 - lower));
  const sdRatio = Math.sqrt(statistic);
  return {
    test: alternative === "two-sided" ? "F test of variances" : `F test of variances (one-sided, ${alternative})`,
    statistic,
    df,
    pValue,
    effect: { sdBefore: Math.sqrt(varianceBefore), sdAfter: Math.sqrt(varianceAfter), sdRatio },
    sentence: `${spreadSentence(sdRatio, labels)}; F(${df[0]}, ${df[1]}) = ${formatNumber(statistic)}, ${formatPValue(pValue)}`,
  };
}
