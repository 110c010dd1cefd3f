/**
 * Control charts: Phase I estimation and Phase II evaluation.
 *
 * `estimateParameters` estimates the centre and σ from a baseline window, leaving out excluded
 * subgroups (confirmed assignable causes), so limits are recomputed without them. `evaluateChart`
 * applies frozen parameters to every point of (possibly later) data: limits for each point follow from
 * the parameters and that point's own size. Evaluation works on per-subgroup summaries (summaries.ts):
 * `evaluateChart` summarises the data, `evaluateSummaries` takes summaries cached elsewhere and a slice
 * start, and both run the same formulas. Formulas and sources are in each family's file.
 */
import type { ChartData, ChartParameters, ChartResult, ChartType, StatisticSeries } from "../types";
import { attributesSeries, estimateAttributes } from "./attributes";
import type { EstimateOptions } from "./chart-input";
import { cusumSeries, estimateCusum } from "./cusum";
import { estimateEwma, ewmaSeries } from "./ewma";
import { estimateIndividuals, individualsSeries } from "./individuals";
import { estimateSubgroups, subgroupSeries } from "./subgroups";
import { assertSliceStart, assertSummaries, summariesOf, type SliceStart, type SubgroupSummaries } from "./summaries";

export type { EstimateOptions } from "./chart-input";
export { SUMMARY_FIELDS, type CarriedState, type SliceStart, type SubgroupSummaries, type SummaryField } from "./summaries";
export { warningLimitsAt, zoneOf } from "./series";
export { movingRanges } from "./individuals";
export { rates } from "./attributes";
export { DEFAULT_EWMA_DESIGN } from "./ewma";
export { DEFAULT_CUSUM_DESIGN } from "./cusum";
export { MINIMUM_BASELINE_SUBGROUPS } from "./baseline";

export function estimateParameters(chart: ChartType, data: ChartData, options: EstimateOptions = {}): ChartParameters {
  switch (chart) {
    case "imr":
      return estimateIndividuals(data, options);
    case "xbar-r":
    case "xbar-s":
      return estimateSubgroups(chart, data, options);
    case "p":
    case "np":
    case "c":
    case "u":
      return estimateAttributes(chart, data, options);
    case "ewma":
      return estimateEwma(data, options);
    case "cusum":
      return estimateCusum(data, options);
  }
}

/**
 * The chart's statistics from per-subgroup summaries (SUMMARY_FIELDS[chart] says which), under frozen
 * parameters, for a slice of a limit segment that starts at `start` (default: the segment's first point).
 * The one implementation of every chart's formulas: `evaluateChart` summarises measurements and calls it.
 * The plotted points may share the summaries' arrays; neither is written afterwards.
 */
export function evaluateSummaries(summaries: SubgroupSummaries, parameters: ChartParameters, start: SliceStart = { firstIndex: 0 }): ChartResult {
  assertSliceStart(start);
  assertSummaries(summaries, parameters.chart);
  return { chart: parameters.chart, parameters, statistics: evaluateStatistics(summaries, parameters, start) };
}

function evaluateStatistics(summaries: SubgroupSummaries, parameters: ChartParameters, start: SliceStart): StatisticSeries[] {
  const { chart } = parameters;
  switch (chart) {
    case "imr":
      return individualsSeries(summaries, parameters, start);
    case "xbar-r":
    case "xbar-s":
      return subgroupSeries(chart, summaries, parameters);
    case "p":
    case "np":
    case "c":
    case "u":
      return [attributesSeries(chart, summaries, parameters)];
    case "ewma":
      return [ewmaSeries(summaries, parameters, start)];
    case "cusum":
      return cusumSeries(summaries, parameters, start);
  }
}

/** The chart's statistics for measurements or counts, whole: their summaries evaluated from the segment's start. */
export function evaluateChart(data: ChartData, parameters: ChartParameters): ChartResult {
  // Chart data is validated when it is built, so its summaries skip evaluateSummaries' second check.
  const statistics = evaluateStatistics(summariesOf(data, parameters), parameters, { firstIndex: 0 });
  return { chart: parameters.chart, parameters, statistics };
}
