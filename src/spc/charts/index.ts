/**
 * Control charts: Phase I estimation and Phase II evaluation.
 *
 * `estimateParameters` estimates the centre and σ from a baseline window, leaving out excluded
 * subgroups (confirmed assignable causes), so limits are recomputed without them. `evaluateChart`
 * applies frozen parameters to every point of (possibly later) data: limits for each point follow from
 * the parameters and that point's own size. Formulas and sources are in each family's file.
 */
import type { ChartData, ChartParameters, ChartResult, ChartType, StatisticSeries } from "../types";
import { estimateAttributes, evaluateAttributes } from "./attributes";
import type { EstimateOptions } from "./chart-input";
import { estimateCusum, evaluateCusum } from "./cusum";
import { estimateEwma, evaluateEwma } from "./ewma";
import { estimateIndividuals, evaluateIndividuals } from "./individuals";
import { estimateSubgroups, evaluateSubgroups } from "./subgroups";

export type { EstimateOptions } from "./chart-input";
export { zoneOf } from "./series";
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

function evaluateStatistics(data: ChartData, parameters: ChartParameters): StatisticSeries[] {
  const { chart } = parameters;
  switch (chart) {
    case "imr":
      return evaluateIndividuals(data, parameters);
    case "xbar-r":
    case "xbar-s":
      return evaluateSubgroups(chart, data, parameters);
    case "p":
    case "np":
    case "c":
    case "u":
      return [evaluateAttributes(chart, data, parameters)];
    case "ewma":
      return [evaluateEwma(data, parameters)];
    case "cusum":
      return evaluateCusum(data, parameters);
  }
}

export function evaluateChart(data: ChartData, parameters: ChartParameters): ChartResult {
  return { chart: parameters.chart, parameters, statistics: evaluateStatistics(data, parameters) };
}
