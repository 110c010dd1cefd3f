/**
 * Individuals and moving range (I-MR) chart.
 *
 * σ̂ = MR̄/d2(2) with MRᵢ = |xᵢ − xᵢ₋₁|; x chart CL = x̄, limits x̄ ± 3σ̂ (= x̄ ± E2·MR̄);
 * MR chart CL = MR̄ = d2σ̂, σ_MR = d3σ̂, UCL = D4·MR̄, LCL = D3·MR̄ = 0
 * (Montgomery, Introduction to Statistical Quality Control, §6.4; NIST/SEMATECH e-Handbook of Statistical
 * Methods, §6.3.2.2). The first moving range of a segment is undefined and plotted as NaN; a slice that
 * starts later takes its first moving range from the previous point's value.
 */
import { controlConstants } from "../constants";
import { commonSubgroupSize, subgroupCount } from "../data";
import type { ChartData, ChartParameters, StatisticSeries } from "../types";
import { resolveBaseline } from "./baseline";
import { requireVariables, type EstimateOptions } from "./chart-input";
import { constantSigma, limitSeries } from "./series";
import { carriedState, summaryArray, type SliceStart, type SubgroupSummaries } from "./summaries";
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

/**
 * The x and MR statistics of a slice from its values (the means of subgroups of one); the first moving
 * range is taken from the previous point's value, and is NaN at a segment's first point.
 */
export function individualsSeries(summaries: SubgroupSummaries, parameters: ChartParameters, start: SliceStart): StatisticSeries[] {
  const values = summaryArray(summaries, "means", "imr");
  const { d2, d3 } = controlConstants(2);
  const ranges = movingRanges(values, carriedState(start, "mean", "imr", NaN));
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
      points: ranges,
      center: d2 * parameters.sigma,
      sigma: constantSigma(values.length, d3 * parameters.sigma),
      floor: 0,
      zoneRulesByDefault: false,
    }),
  ];
}

/** Moving ranges MRᵢ = |xᵢ − xᵢ₋₁|, the first against `before` (NaN: the first has no moving range). */
export function movingRanges(values: Float64Array, before: number): Float64Array {
  const ranges = new Float64Array(values.length);
  let previous = before;
  for (let index = 0; index < values.length; index++) {
    const value = values[index]!;
    ranges[index] = Math.abs(value - previous);
    previous = value;
  }
  return ranges;
}
