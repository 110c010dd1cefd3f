/**
 * Exponentially weighted moving average (EWMA) chart (Roberts, S.W. (1959), "Control chart tests based on
 * geometric moving averages", Technometrics 1, 239–250; Montgomery, Introduction to Statistical Quality
 * Control, §9.2).
 *
 * zᵢ = λ·x̄ᵢ + (1 − λ)·zᵢ₋₁, z₀ = centre. The standard deviation of zᵢ (i = 1, 2, ... from the first
 * plotted point) is σᵢ = σ_x̄·√(λ/(2 − λ)·[1 − (1 − λ)^{2i}]), σ_x̄ = σ̂/√n, and the limits are
 * centre ± L·σᵢ: exact, time-varying limits that widen to the asymptotic centre ± L·σ_x̄·√(λ/(2 − λ)).
 * `asymptoticLimits` uses the asymptotic width from the first point, as the published ARL tables do
 * (Lucas & Saccucci (1990), Technometrics 32, 1–12).
 *
 * A slice that starts inside a limit segment continues from the previous point's zᵢ₋₁, with i counted
 * from the segment's first point.
 *
 * Default design λ = 0.2, L = 3 (common practice). The series carries σᵢ, so warning limits are
 * centre ± 2σᵢ; zone rules do not apply by default (successive EWMA values are correlated).
 */
import { SpcInputError, type ChartData, type ChartParameters, type EwmaDesign, type StatisticSeries } from "../types";
import type { EstimateOptions } from "./chart-input";
import { limitSeries } from "./series";
import { estimateSmoothed } from "./smoothed-input";
import { carriedState, summaryArray, type SliceStart, type SubgroupSummaries } from "./summaries";
import { meanSigmaOf } from "./within-sigma";

export const DEFAULT_EWMA_DESIGN: EwmaDesign = { lambda: 0.2, L: 3 };

function checkedDesign(design: EwmaDesign): EwmaDesign {
  if (!(design.lambda > 0 && design.lambda <= 1)) {
    throw new SpcInputError(`EWMA weight lambda must be in (0, 1], got ${design.lambda}`);
  }
  if (!(design.L > 0 && Number.isFinite(design.L))) {
    throw new SpcInputError(`EWMA limit width L must be a positive number, got ${design.L}`);
  }
  return design;
}

export function estimateEwma(data: ChartData, options: EstimateOptions): ChartParameters {
  return { ...estimateSmoothed("ewma", data, options), ewma: checkedDesign(options.ewma ?? DEFAULT_EWMA_DESIGN) };
}

/**
 * (1 − λ)^{2i} by the same repeated product as the series, so a slice starting at segment position i gets
 * the limits of the whole segment to the bit. The product stops once 1 − power rounds to 1: every later
 * factor is then 1 as well (the power only shrinks), so it takes at most about 19/λ steps (84 at λ = 0.2)
 * whatever i.
 */
function carrySquaredPowerAt(carry: number, index: number): number {
  let power = 1;
  for (let step = 0; step < index && 1 - power !== 1; step++) power *= carry * carry;
  return power;
}

/** The EWMA statistic of a slice from its subgroup means, continuing from the previous point's EWMA. */
export function ewmaSeries(summaries: SubgroupSummaries, parameters: ChartParameters, start: SliceStart): StatisticSeries {
  const { lambda, L, asymptoticLimits = false } = checkedDesign(parameters.ewma ?? DEFAULT_EWMA_DESIGN);
  const means = summaryArray(summaries, "means", "ewma");
  const meanSigma = meanSigmaOf(parameters);
  const count = means.length;
  const points = new Float64Array(count);
  const sigma = new Float64Array(count);
  const carry = 1 - lambda;
  const asymptoticVariance = lambda / (2 - lambda);
  let smoothed = carriedState(start, "ewma", "ewma", parameters.center);
  let carrySquaredPower = carrySquaredPowerAt(carry, start.firstIndex); // (1 − λ)^{2i}, i = segment position
  for (let index = 0; index < count; index++) {
    smoothed = lambda * means[index]! + carry * smoothed;
    points[index] = smoothed;
    carrySquaredPower *= carry * carry;
    const factor = asymptoticLimits ? 1 : 1 - carrySquaredPower;
    sigma[index] = meanSigma * Math.sqrt(asymptoticVariance * factor);
  }
  return limitSeries({
    key: "ewma",
    points,
    center: parameters.center,
    sigma,
    floor: -Infinity,
    width: L,
    zoneRulesByDefault: false,
  });
}
