/**
 * Correlation with a covariate: Pearson's product-moment correlation and its t test
 * (t = r√((n − 2)/(1 − r²)), n − 2 degrees of freedom) with a Fisher-z confidence interval, computed
 * by @stdlib/stats-pcorrtest. The effect is r, r² (the share of variation the covariate explains
 * linearly) and the interval.
 *
 * Refusals (thrown SpcInputError): non-finite values, unequal lengths, fewer than 4 pairs (the Fisher
 * interval needs n > 3), or a constant series (r is undefined).
 */
import pcorrtest from "@stdlib/stats-pcorrtest";
import { SpcInputError } from "../types";
import { sampleVariance } from "./groups";
import { requireFiniteValues, requireSameLength } from "./input";
import { type EvidenceLabels, type EvidenceResult, formatNumber, formatPValue, variableName } from "./sentence";

export interface CorrelationEffect {
  readonly r: number;
  readonly rSquared: number;
  readonly confidenceInterval?: readonly [number, number];
}

/** Checks paired data for a correlation test. */
export function requirePairs(values: ArrayLike<number>, covariate: ArrayLike<number>, name: string): void {
  requireSameLength(values, covariate, name);
  requireFiniteValues(values, name, 4);
  requireFiniteValues(covariate, `${name} (covariate)`, 4);
  if (sampleVariance(values) === 0 || sampleVariance(covariate) === 0) {
    throw new SpcInputError(`${name}: one of the series is constant, so the correlation is undefined`);
  }
}

/** "weight rises with barrel temperature (r = 0.8)" and its weaker forms. */
export function correlationSentence(r: number, symbol: string, labels: EvidenceLabels): string {
  const verb = r >= 0 ? "rises" : "falls";
  return `${variableName(labels)} ${verb} with ${labels.covariate ?? "the covariate"} (${symbol} = ${formatNumber(r, 2)})`;
}

export function pearsonCorrelation(
  values: ArrayLike<number>,
  covariate: ArrayLike<number>,
  labels: EvidenceLabels = {},
): EvidenceResult<CorrelationEffect> {
  requirePairs(values, covariate, "Pearson correlation");
  const result = pcorrtest(Array.from(values), Array.from(covariate));
  const r = result.pcorr;
  const [low, high] = result.ci as [number, number];
  return {
    test: "Pearson correlation",
    statistic: result.statistic,
    df: values.length - 2,
    pValue: result.pValue,
    effect: { r, rSquared: r * r, confidenceInterval: [low, high] },
    sentence: `${correlationSentence(r, "r", labels)}; Pearson t = ${formatNumber(result.statistic)}, ${formatPValue(result.pValue)}`,
  };
}
