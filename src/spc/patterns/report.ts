/**
 * The pattern part of the analyze report: the patterns read from a chart's signals and, for those
 * with one, their change points listed on their own (what the investigator searches the event log with).
 * For src/spc/analyze.ts to call after it has evaluated the chart and the rules.
 */
import type { ChartData, ChartResult, Signal, StatisticKey } from "../types";
import type { Pattern, PatternChangePoint, PatternKind } from "./pattern";
import { readPatterns, type ReadPatternsOptions } from "./read-patterns";

export interface ChangePointReport extends PatternChangePoint {
  readonly chart: StatisticKey;
  readonly kind: PatternKind;
}

export interface PatternReport {
  readonly patterns: readonly Pattern[];
  readonly changePoints: readonly ChangePointReport[];
}

export function patternReport(
  result: ChartResult,
  signals: readonly Signal[],
  data: ChartData,
  options: ReadPatternsOptions = {},
): PatternReport {
  const patterns = readPatterns(result, signals, data, options);
  const changePoints = patterns.flatMap((pattern) =>
    pattern.changePoint ? [{ chart: pattern.chart, kind: pattern.kind, ...pattern.changePoint }] : [],
  );
  return { patterns, changePoints };
}
