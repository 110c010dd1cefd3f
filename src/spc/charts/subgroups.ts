/**
 * X-bar & R and X-bar & S charts for subgroups of equal size n (2..25).
 *
 * σ̂ = R̄/d2(n) (X-bar & R) or S̄/c4(n) (X-bar & S) from the baseline subgroups; X-bar chart
 * CL = x̿, σ_x̄ = σ̂/√n, limits x̿ ± 3σ̂/√n (= x̿ ± A2·R̄ or x̿ ± A3·S̄); R chart CL = d2σ̂ = R̄,
 * σ_R = d3σ̂, limits D3·R̄, D4·R̄; S chart CL = c4σ̂ = S̄, σ_S = σ̂√(1 − c4²), limits B3·S̄, B4·S̄
 * (Montgomery, Introduction to Statistical Quality Control, §6.2–6.3; NIST/SEMATECH e-Handbook §6.3.2.1).
 *
 * Both charts require equal subgroup sizes: the first subgroup of another size is named in the error.
 * (Montgomery §6.3.2 gives variable-size S-chart formulas; they are not implemented here.)
 */
import { controlConstants } from "../constants";
import { commonSubgroupSize, subgroupCount, subgroupMeans } from "../data";
import type { ChartData, ChartParameters, StatisticSeries } from "../types";
import { resolveBaseline } from "./baseline";
import { requireVariables, type EstimateOptions } from "./chart-input";
import { constantSigma, limitSeries } from "./series";
import { summaryArray, type SubgroupSummaries } from "./summaries";
import { meanSigmaOf, rangeSigma, standardDeviationSigma, usedMean } from "./within-sigma";

type SubgroupChart = "xbar-r" | "xbar-s";

export function estimateSubgroups(chart: SubgroupChart, data: ChartData, options: EstimateOptions): ChartParameters {
  const variables = requireVariables(data, chart);
  const subgroupSize = commonSubgroupSize(variables, options.subgroupSize);
  controlConstants(subgroupSize); // rejects sizes outside 2..25 before any work
  const baseline = resolveBaseline(subgroupCount(variables), options.baseline);
  const sigma =
    chart === "xbar-r"
      ? rangeSigma(variables, subgroupSize, baseline.used)
      : standardDeviationSigma(variables, subgroupSize, baseline.used);
  return {
    chart,
    center: options.target ?? usedMean(subgroupMeans(variables), baseline.used),
    sigma,
    subgroupSize,
    baseline: baseline.summary,
  };
}

/** The X-bar and R (or S) statistics from the subgroup means and spreads (ranges or standard deviations). */
export function subgroupSeries(chart: SubgroupChart, summaries: SubgroupSummaries, parameters: ChartParameters): StatisticSeries[] {
  const { d2, d3, c4 } = controlConstants(parameters.subgroupSize);
  const { sigma } = parameters;
  const means = summaryArray(summaries, "means", chart);
  const spreads = summaryArray(summaries, "spreads", chart);
  const count = means.length;
  const mean = limitSeries({
    key: "xbar",
    points: means,
    center: parameters.center,
    sigma: constantSigma(count, meanSigmaOf(parameters)),
    floor: -Infinity,
    zoneRulesByDefault: true,
  });
  const spread =
    chart === "xbar-r"
      ? limitSeries({
          key: "r",
          points: spreads,
          center: d2 * sigma,
          sigma: constantSigma(count, d3 * sigma),
          floor: 0,
          zoneRulesByDefault: false,
        })
      : limitSeries({
          key: "s",
          points: spreads,
          center: c4 * sigma,
          sigma: constantSigma(count, Math.sqrt(1 - c4 * c4) * sigma),
          floor: 0,
          zoneRulesByDefault: false,
        });
  return [mean, spread];
}
