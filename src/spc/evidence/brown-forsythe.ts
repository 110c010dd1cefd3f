/**
 * Brown–Forsythe test of equal spread across groups (Brown & Forsythe 1974, JASA 69, 364–367): the
 * one-way ANOVA F test applied to the absolute deviations of each value from its group MEDIAN
 * (Levene's 1960 test with the median, robust to non-normal data; NIST/SEMATECH e-Handbook §1.3.5.10).
 * The ANOVA is @stdlib/stats-anova1. Works across the levels of a tag, and before/after an event
 * through `brownForsytheBeforeAfter`. The effect is the ratio of the largest to the smallest group
 * standard deviation.
 *
 * Refusals (thrown SpcInputError): as one-way ANOVA (at least 2 levels, 2 values each, finite
 * values), plus: no variation in the absolute deviations (e.g. every group constant).
 */
import anova1 from "@stdlib/stats-anova1";
import { SpcInputError } from "../types";
import { beforeAfterGroups, groupByLevel, median, sampleVariance } from "./groups";
import { type EvidenceLabels, type EvidenceResult, formatNumber, formatPValue, variableName } from "./sentence";

export interface SpreadComparisonEffect {
  readonly levels: readonly { readonly level: string; readonly count: number; readonly sd: number }[];
  /** Level with the largest and the smallest standard deviation, and their ratio. */
  readonly widest: string;
  readonly narrowest: string;
  readonly sdRatio: number;
}

export function brownForsythe(
  values: ArrayLike<number>,
  levels: readonly string[],
  labels: EvidenceLabels = {},
): EvidenceResult<SpreadComparisonEffect> {
  const groups = groupByLevel(values, levels, "Brown–Forsythe", 2);
  const deviations: number[] = [];
  const factor: string[] = [];
  for (const group of groups) {
    const center = median(group.values);
    for (const value of group.values) {
      deviations.push(Math.abs(value - center));
      factor.push(group.level);
    }
  }
  const result = anova1(deviations, factor);
  if (!(result.error.ss > 0)) {
    throw new SpcInputError("Brown–Forsythe: the absolute deviations do not vary within the groups, so F is undefined");
  }
  const summaries = groups.map((group) => ({ level: group.level, count: group.values.length, sd: Math.sqrt(sampleVariance(group.values)) }));
  const widest = summaries.reduce((best, summary) => (summary.sd > best.sd ? summary : best));
  const narrowest = summaries.reduce((best, summary) => (summary.sd < best.sd ? summary : best));
  const df: readonly [number, number] = [result.treatment.df, result.error.df];
  const tag = labels.tag ?? "level";
  return {
    test: "Brown–Forsythe",
    statistic: result.statistic,
    df,
    pValue: result.pValue,
    effect: { levels: summaries, widest: widest.level, narrowest: narrowest.level, sdRatio: widest.sd / narrowest.sd },
    sentence:
      `the spread of ${variableName(labels)} at ${tag} ${widest.level} is ${formatNumber(widest.sd / narrowest.sd)} times ` +
      `that at ${tag} ${narrowest.level} (standard deviations); Brown–Forsythe F(${df[0]}, ${df[1]}) = ` +
      `${formatNumber(result.statistic)}, ${formatPValue(result.pValue)}`,
  };
}

/** Brown–Forsythe for two samples, before and after an event. */
export function brownForsytheBeforeAfter(
  before: ArrayLike<number>,
  after: ArrayLike<number>,
  labels: EvidenceLabels = {},
): EvidenceResult<SpreadComparisonEffect> {
  const { values, levels } = beforeAfterGroups(before, after);
  return brownForsythe(values, levels, { ...labels, tag: labels.tag ?? "the period" });
}
