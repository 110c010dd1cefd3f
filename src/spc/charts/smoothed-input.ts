/**
 * Shared Phase I estimate for the EWMA and CUSUM charts, which plot individual values (n = 1) or
 * subgroup means (n ≥ 2): centre = target or baseline mean, σ̂ from moving ranges or R̄/d2 (within-sigma.ts).
 */
import { commonSubgroupSize, subgroupCount } from "../data";
import type { ChartData, ChartParameters, ChartType } from "../types";
import { resolveBaseline } from "./baseline";
import { requireVariables, type EstimateOptions } from "./chart-input";
import { individualsOrSubgroupSigma, usedMean } from "./within-sigma";

export function estimateSmoothed(
  chart: Extract<ChartType, "ewma" | "cusum">,
  data: ChartData,
  options: EstimateOptions,
): Omit<ChartParameters, "ewma" | "cusum"> {
  const variables = requireVariables(data, chart);
  const subgroupSize = commonSubgroupSize(variables, options.subgroupSize);
  const baseline = resolveBaseline(subgroupCount(variables), options.baseline);
  const { means, sigma } = individualsOrSubgroupSigma(variables, subgroupSize, baseline.used);
  return {
    chart,
    center: options.target ?? usedMean(means, baseline.used),
    sigma,
    subgroupSize,
    baseline: baseline.summary,
  };
}
