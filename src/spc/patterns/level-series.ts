/**
 * The level of every subgroup on one scale for reading patterns: subgroup means for measured data,
 * fractions (p, np) or rates per unit (c, u) for counts, each with its in-control mean and standard
 * deviation from the frozen chart parameters:
 * - variables: x̄ᵢ, centre μ̂, σᵢ = σ̂/√nᵢ (Shewhart);
 * - p and np: p̂ᵢ = dᵢ/nᵢ, σᵢ = √(p̄(1 − p̄)/nᵢ) (binomial);
 * - c: cᵢ, σ = √c̄; u: uᵢ = cᵢ/nᵢ, σᵢ = √(ū/nᵢ) (Poisson)
 * (Montgomery, Introduction to Statistical Quality Control, §6.2, §7.2–7.3). EWMA and CUSUM charts smooth
 * or accumulate these same levels; their patterns are read from the levels themselves, since a smoothed
 * series has no independent points to read shapes from.
 * Standardised values zᵢ = (levelᵢ − centre)/σᵢ are what the pattern features take.
 */
import { subgroupMeans, subgroupSizes } from "../data";
import { SpcInputError, type ChartData, type ChartParameters } from "../types";

export interface LevelSeries {
  readonly levels: Float64Array;
  readonly center: number;
  readonly sigmas: Float64Array;
  readonly standardised: Float64Array;
}

export function levelSeries(data: ChartData, parameters: ChartParameters): LevelSeries {
  const { center } = parameters;
  let levels: Float64Array;
  let sigmas: Float64Array;
  if (data.kind === "variables") {
    levels = subgroupMeans(data);
    const sizes = subgroupSizes(data);
    sigmas = Float64Array.from(sizes, (size) => parameters.sigma / Math.sqrt(size));
  } else {
    const perUnit = parameters.chart !== "c";
    levels = Float64Array.from(data.counts, (count, index) => (perUnit ? count / data.sizes[index]! : count));
    sigmas = Float64Array.from(data.sizes, (size) => {
      if (parameters.chart === "c") return Math.sqrt(center);
      if (parameters.chart === "u") return Math.sqrt(center / size);
      return Math.sqrt((center * (1 - center)) / size);
    });
  }
  const index = sigmas.findIndex((sigma) => !(sigma > 0) || !Number.isFinite(sigma));
  if (index >= 0) {
    throw new SpcInputError(`patterns: the in-control standard deviation at subgroup ${index} is not positive`, index);
  }
  const standardised = Float64Array.from(levels, (level, position) => (level - center) / sigmas[position]!);
  return { levels, center, sigmas, standardised };
}
