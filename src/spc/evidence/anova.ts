/**
 * One-way analysis of variance across the levels of a tag (cavity, lot, operator, shift), computed by
 * @stdlib/stats-anova1 (F = MS_between/MS_within with k − 1 and N − k degrees of freedom; e.g.
 * Montgomery, Design and Analysis of Experiments, ch. 3). The effect is the largest gap between
 * level means and η² = SS_between/SS_total, the share of the variation the tag explains.
 *
 * Refusals (thrown SpcInputError): non-finite values, fewer than 2 levels, a level with fewer than
 * 2 values, or no variation within the levels (the F ratio is undefined).
 */
import anova1 from "@stdlib/stats-anova1";
import { SpcInputError } from "../types";
import { groupByLevel, largestGap, type LargestGap, type LevelSummary, mean } from "./groups";
import { type EvidenceLabels, type EvidenceResult, formatAmount, formatNumber, formatPValue, variableName } from "./sentence";

export interface LevelComparisonEffect {
  readonly levels: readonly LevelSummary[];
  readonly largestGap: LargestGap;
}

export interface AnovaEffect extends LevelComparisonEffect {
  readonly etaSquared: number;
}

/** The "variable at tag A runs X higher than at tag B" part shared by the k-group tests. */
export function gapSentence(gap: LargestGap, labels: EvidenceLabels, measure: "mean" | "median"): string {
  const tag = labels.tag ?? "level";
  const subject = measure === "mean" ? variableName(labels) : `median ${variableName(labels)}`;
  return `${subject} at ${tag} ${gap.higher} runs ${formatAmount(gap.difference, labels)} higher than at ${tag} ${gap.lower}`;
}

/** "4 levels of cavity" (no plural of the tag name is guessed). */
export function levelsPhrase(count: number, labels: EvidenceLabels): string {
  return labels.tag ? `${count} levels of ${labels.tag}` : `${count} levels`;
}

export function oneWayAnova(values: ArrayLike<number>, levels: readonly string[], labels: EvidenceLabels = {}): EvidenceResult<AnovaEffect> {
  const groups = groupByLevel(values, levels, "one-way ANOVA", 2);
  const flat = groups.flatMap((group) => Array.from(group.values));
  const factor = groups.flatMap((group) => Array<string>(group.values.length).fill(group.level));
  const result = anova1(flat, factor);
  if (!(result.error.ss > 0)) {
    throw new SpcInputError("one-way ANOVA: no variation within the levels, so the F ratio is undefined");
  }
  const summaries = groups.map((group) => ({ level: group.level, count: group.values.length, location: mean(group.values) }));
  const gap = largestGap(summaries);
  const df: readonly [number, number] = [result.treatment.df, result.error.df];
  const statistic = result.statistic;
  return {
    test: "one-way ANOVA",
    statistic,
    df,
    pValue: result.pValue,
    effect: { levels: summaries, largestGap: gap, etaSquared: result.treatment.ss / (result.treatment.ss + result.error.ss) },
    sentence:
      `${gapSentence(gap, labels, "mean")}; one-way ANOVA across ${levelsPhrase(groups.length, labels)}, ` +
      `F(${df[0]}, ${df[1]}) = ${formatNumber(statistic)}, ${formatPValue(result.pValue)}`,
  };
}
