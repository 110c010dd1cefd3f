/**
 * Individuals and moving range (I-MR) chart.
 *
 * σ̂ = MR̄/d2(2) with MRᵢ = |xᵢ − xᵢ₋₁|; x chart CL = x̄, limits x̄ ± 3σ̂ (= x̄ ± E2·MR̄);
 * MR chart CL = MR̄ = d2σ̂, σ_MR = d3σ̂, UCL = D4·MR̄, LCL = D3·MR̄ = 0
 * (Montgomery, Introduction to Statistical Quality Control, §6.4; NIST/SEMATECH e-Handbook of Statistical
 * Methods, §6.3.2.2). The first moving range is undefined and plotted as NaN.
 */
import { controlConstants } from "../constants";
import { commonSubgroupSize, subgroupCount } from "../data";
import type { ChartData, ChartParameters, StatisticSeries } from "../types";
import { resolveBaseline } from "./baseline";
import { requireVariables, type EstimateOptions } from "./chart-input";
import { constantSigma, limitSeries } from "./series";
import { movingRangeSigma, usedMean } from "./within-sigma";

export function estimateIndividuals(data: ChartData, options: EstimateOptions): ChartParameters {
  const variables = requireVariables(data, "imr");
  commonSubgroupSize(variables, 1);
  const baseline = resolveBaseline(subgroupCount(variables), options.baseline);
  return {
    chart: "imr",
    center: options.target ?? usedMean(variables.values, baseline.used),
    sigma: movingRangeSigma(variables.values, baseline.used),
    subgroupSize: 1,
    baseline: baseline.summary,
  };
}

export function evaluateIndividuals(data: ChartData, parameters: ChartParameters): StatisticSeries[] {
  const variables = requireVariables(data, "imr");
  commonSubgroupSize(variables, 1);
  const { values } = variables;
  const { d2, d3 } = controlConstants(2);
  const movingRanges = new Float64Array(values.length);
  movingRanges[0] = NaN;
  for (let index = 1; index < values.length; index++) {
    movingRanges[index] = Math.abs(values[index]! - values[index - 1]!);
  }
  return [
    limitSeries({
      key: "x",
      points: values,
      center: parameters.center,
      sigma: constantSigma(values.length, parameters.sigma),
      floor: -Infinity,
      zoneRulesByDefault: true,
    }),
    limitSeries({
      key: "mr",
      points: movingRanges,
      center: d2 * parameters.sigma,
      sigma: constantSigma(values.length, d3 * parameters.sigma),
      floor: 0,
      zoneRulesByDefault: false,
    }),
  ];
}
