/**
 * Kruskal–Wallis rank test across the levels of a tag, computed by @stdlib/stats-kruskal-test
 * (H statistic with the tie correction, χ² approximation with k − 1 degrees of freedom; Kruskal &
 * Wallis 1952, JASA 47, 583–621; Hollander & Wolfe, Nonparametric Statistical Methods, §6.1).
 * The effect is the largest gap between level medians and ε² = H/(N − 1) (Tomczak & Tomczak 2014,
 * Trends in Sport Sciences 21(1), as we recall it: from memory).
 *
 * Refusals (thrown SpcInputError): non-finite values, fewer than 2 levels, a level with fewer than
 * 2 values, or all values equal (no ranks to compare).
 */
import kruskalTest from "@stdlib/stats-kruskal-test";
import { SpcInputError } from "../types";
import { gapSentence, type LevelComparisonEffect, levelsPhrase } from "./anova";
import { groupByLevel, largestGap, median } from "./groups";
import { type EvidenceLabels, type EvidenceResult, formatNumber, formatPValue } from "./sentence";

export interface KruskalWallisEffect extends LevelComparisonEffect {
  readonly epsilonSquared: number;
}

export function kruskalWallis(
  values: ArrayLike<number>,
  levels: readonly string[],
  labels: EvidenceLabels = {},
): EvidenceResult<KruskalWallisEffect> {
  const groups = groupByLevel(values, levels, "Kruskal–Wallis", 2);
  const first = groups[0]?.values[0];
  if (groups.every((group) => group.values.every((value) => value === first))) {
    throw new SpcInputError("Kruskal–Wallis: all values are equal, so there are no ranks to compare");
  }
  const [head, ...rest] = groups.map((group) => group.values);
  const result = kruskalTest(head as Float64Array, ...rest);
  const total = groups.reduce((sum, group) => sum + group.values.length, 0);
  const summaries = groups.map((group) => ({ level: group.level, count: group.values.length, location: median(group.values) }));
  const gap = largestGap(summaries);
  return {
    test: "Kruskal–Wallis",
    statistic: result.statistic,
    df: result.df,
    pValue: result.pValue,
    effect: { levels: summaries, largestGap: gap, epsilonSquared: result.statistic / (total - 1) },
    sentence:
      `${gapSentence(gap, labels, "median")}; Kruskal–Wallis across ${levelsPhrase(groups.length, labels)}, ` +
      `H = ${formatNumber(result.statistic)} (df ${result.df}), ${formatPValue(result.pValue)}`,
  };
}
