/**
 * Spearman's rank correlation (Spearman 1904): Pearson's r computed on the ranks, ties given their
 * average rank, which is the definition that stays exact with ties. The p-value uses the t
 * approximation t = ρ√((n − 2)/(1 − ρ²)) on n − 2 degrees of freedom (as @stdlib/stats-pcorrtest
 * computes it on the ranks); it is an approximation, reasonable from about 10 pairs, and not the
 * exact permutation distribution.
 *
 * Refusals (thrown SpcInputError): as Pearson (finite, equal lengths, at least 4 pairs, not constant).
 */
import pcorrtest from "@stdlib/stats-pcorrtest";
import { correlationSentence, type CorrelationEffect, requirePairs } from "./pearson";
import { type EvidenceLabels, type EvidenceResult, formatNumber, formatPValue } from "./sentence";

/** Ranks 1..n, ties sharing the average of the ranks they span. */
export function averageRanks(values: ArrayLike<number>): Float64Array {
  const order = Array.from({ length: values.length }, (_, index) => index).sort(
    (first, second) => (values[first] as number) - (values[second] as number),
  );
  const ranks = new Float64Array(values.length);
  let start = 0;
  while (start < order.length) {
    let end = start;
    while (end + 1 < order.length && values[order[end + 1] as number] === values[order[start] as number]) end++;
    const rank = (start + end) / 2 + 1;
    for (let position = start; position <= end; position++) ranks[order[position] as number] = rank;
    start = end + 1;
  }
  return ranks;
}

export function spearmanCorrelation(
  values: ArrayLike<number>,
  covariate: ArrayLike<number>,
  labels: EvidenceLabels = {},
): EvidenceResult<CorrelationEffect> {
  requirePairs(values, covariate, "Spearman correlation");
  const result = pcorrtest(averageRanks(values), averageRanks(covariate));
  const rho = result.pcorr;
  return {
    test: "Spearman rank correlation",
    statistic: result.statistic,
    df: values.length - 2,
    pValue: result.pValue,
    effect: { r: rho, rSquared: rho * rho },
    sentence:
      `${correlationSentence(rho, "ρ", labels)}; Spearman (t approximation) t = ${formatNumber(result.statistic)}, ` +
      formatPValue(result.pValue),
  };
}
