/**
 * Tabular CUSUM (Page, E.S. (1954), "Continuous inspection schemes", Biometrika 41, 100–115; Lucas &
 * Crosier (1982), Technometrics 24, 199–205; Montgomery, Introduction to Statistical Quality Control, §9.1).
 *
 * On standardised values zᵢ = (x̄ᵢ − μ₀)/σ_x̄: C⁺ᵢ = max(0, zᵢ − k + C⁺ᵢ₋₁), C⁻ᵢ = max(0, −zᵢ − k + C⁻ᵢ₋₁),
 * C⁺₀ = C⁻₀ = 0 (no head start); a signal when either exceeds h. Reported in the units of the data: both
 * statistics are multiplied by σ_x̄ (computed directly as max(0, ±(x̄ᵢ − μ₀) − kσ_x̄ + Cᵢ₋₁), which also
 * stays defined when σ_x̄ = 0), so both series `cusum-upper` and `cusum-lower` are ≥ 0 with centre 0,
 * UCL = h·σ_x̄ (the decision interval) and LCL = 0. Their sigma is NaN: zones do not apply. A slice that
 * starts inside a limit segment continues from the previous point's C⁺ and C⁻.
 *
 * Default design k = 0.5, h = 5 (common practice; Montgomery's recommendation, from memory), which has
 * a two-sided in-control ARL of about 465 (published-values §2b, computed).
 */
import { SpcInputError, type ChartData, type ChartParameters, type CusumDesign, type StatisticSeries } from "../types";
import type { EstimateOptions } from "./chart-input";
import { constantSigma } from "./series";
import { estimateSmoothed } from "./smoothed-input";
import { carriedState, summaryArray, type SliceStart, type SubgroupSummaries } from "./summaries";
import { meanSigmaOf } from "./within-sigma";

export const DEFAULT_CUSUM_DESIGN: CusumDesign = { k: 0.5, h: 5 };

function checkedDesign(design: CusumDesign): CusumDesign {
  if (!(design.k >= 0 && Number.isFinite(design.k))) {
    throw new SpcInputError(`CUSUM reference value k must be a non-negative number, got ${design.k}`);
  }
  if (!(design.h > 0 && Number.isFinite(design.h))) {
    throw new SpcInputError(`CUSUM decision interval h must be a positive number, got ${design.h}`);
  }
  return design;
}

export function estimateCusum(data: ChartData, options: EstimateOptions): ChartParameters {
  return { ...estimateSmoothed("cusum", data, options), cusum: checkedDesign(options.cusum ?? DEFAULT_CUSUM_DESIGN) };
}

/** The upper and lower CUSUM of a slice from its subgroup means, continuing from the previous point's sums. */
export function cusumSeries(summaries: SubgroupSummaries, parameters: ChartParameters, start: SliceStart): StatisticSeries[] {
  const { k, h } = checkedDesign(parameters.cusum ?? DEFAULT_CUSUM_DESIGN);
  const means = summaryArray(summaries, "means", "cusum");
  const meanSigma = meanSigmaOf(parameters);
  const count = means.length;
  const upper = new Float64Array(count);
  const lower = new Float64Array(count);
  const allowance = k * meanSigma;
  let upperSum = carriedState(start, "cusumUpper", "cusum", 0);
  let lowerSum = carriedState(start, "cusumLower", "cusum", 0);
  for (let index = 0; index < count; index++) {
    const deviation = means[index]! - parameters.center;
    upperSum = Math.max(0, deviation - allowance + upperSum);
    lowerSum = Math.max(0, -deviation - allowance + lowerSum);
    upper[index] = upperSum;
    lower[index] = lowerSum;
  }
  const decisionInterval = constantSigma(count, h * meanSigma);
  const zeros = new Float64Array(count);
  const noZones = constantSigma(count, NaN);
  const series = (key: "cusum-upper" | "cusum-lower", points: Float64Array): StatisticSeries => ({
    key,
    points,
    center: 0,
    ucl: decisionInterval,
    lcl: zeros,
    sigma: noZones,
    floor: 0,
    zoneRulesByDefault: false,
  });
  return [series("cusum-upper", upper), series("cusum-lower", lower)];
}
