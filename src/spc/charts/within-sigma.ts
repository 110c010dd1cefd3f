/**
 * Within-subgroup estimates of the standard deviation σ of one individual value, from the baseline
 * subgroups only (Montgomery, Introduction to Statistical Quality Control, §6.2–6.4):
 * - individuals: σ̂ = MR̄ / d2(2), where MRᵢ = |xᵢ − xᵢ₋₁| counts only when both points are in the baseline
 *   (a moving range touching an excluded point would carry the assignable cause into σ̂);
 * - subgroups of n: σ̂ = R̄ / d2(n) or σ̂ = S̄ / c4(n);
 * and, from frozen parameters, the standard deviation of a subgroup mean, σ_x̄ = σ̂/√n.
 */
import { controlConstants } from "../constants";
import { subgroupMeans, subgroupRanges, subgroupStandardDeviations } from "../data";
import { SpcInputError, type ChartParameters, type VariablesData } from "../types";

/** Mean over the used entries of `values`. */
export function usedMean(values: Float64Array, used: Uint8Array): number {
  let sum = 0;
  let count = 0;
  for (let index = 0; index < values.length; index++) {
    if (used[index] === 1) {
      sum += values[index]!;
      count++;
    }
  }
  return sum / count;
}

export function movingRangeSigma(values: Float64Array, used: Uint8Array): number {
  let sum = 0;
  let count = 0;
  for (let index = 1; index < values.length; index++) {
    if (used[index] === 1 && used[index - 1] === 1) {
      sum += Math.abs(values[index]! - values[index - 1]!);
      count++;
    }
  }
  if (count === 0) {
    throw new SpcInputError("the baseline holds no two consecutive points, so no moving range can be formed");
  }
  return sum / count / controlConstants(2).d2;
}

export function rangeSigma(data: VariablesData, subgroupSize: number, used: Uint8Array): number {
  return usedMean(subgroupRanges(data), used) / controlConstants(subgroupSize).d2;
}

export function standardDeviationSigma(data: VariablesData, subgroupSize: number, used: Uint8Array): number {
  return usedMean(subgroupStandardDeviations(data), used) / controlConstants(subgroupSize).c4;
}

/**
 * σ̂ for charts that accept either individuals or subgroups (EWMA, CUSUM): moving ranges for n = 1,
 * R̄/d2 otherwise. Returns the subgroup means too, since those charts plot them.
 */
export function individualsOrSubgroupSigma(
  data: VariablesData,
  subgroupSize: number,
  used: Uint8Array,
): { means: Float64Array; sigma: number } {
  const means = subgroupMeans(data);
  const sigma = subgroupSize === 1 ? movingRangeSigma(means, used) : rangeSigma(data, subgroupSize, used);
  return { means, sigma };
}

/** σ_x̄ = σ̂/√n: the standard deviation of a mean of n individual values (X-bar, EWMA and CUSUM charts). */
export function meanSigmaOf(parameters: ChartParameters): number {
  return parameters.sigma / Math.sqrt(parameters.subgroupSize);
}
