/**
 * Step change in a binomial fraction (p and np charts): the maximum-likelihood change point with a
 * known in-control fraction, after Pignatiello & Samuel (2001), "Identifying the time of a step
 * change in the process fraction nonconforming", Quality Engineering 13(3), 357–365 (from memory;
 * the paper was not read). Sample sizes may vary.
 *
 * Model: dᵢ ~ Binomial(nᵢ, p), p = p0 (known) up to the last in-control subgroup τ and p1 after.
 * Derivation: for fixed k the log-likelihood of the points after k is Σ[dᵢ log p1 + (nᵢ−dᵢ) log(1−p1)]
 * + const, maximal at p̂1 = D/N with D = Σ_{i>k} dᵢ, N = Σ_{i>k} nᵢ. Subtracting the same sum at p0
 * gives
 *   ℓ(k) = D log(p̂1/p0) + (N − D) log((1 − p̂1)/(1 − p0)),
 * each term taken as 0 when its count is 0 (the limit of x log x). Cost: O(T).
 */
import { SpcInputError } from "../types";
import { DEFAULT_CONFIDENCE_LEVEL, ratioStepProfile, requireInside, requireSeries } from "./profile";
import type { RateChangePoint } from "./poisson";

export interface BinomialChangePointOptions {
  /** Known in-control fraction p0 (p̄), strictly between 0 and 1. */
  readonly fraction: number;
  /** Sample size of each subgroup. */
  readonly sizes: Float64Array;
  readonly level?: number;
}

/** x·log(x/y) with the convention 0·log 0 = 0. */
function weightedLogRatio(weight: number, ratio: number): number {
  return weight === 0 ? 0 : weight * Math.log(ratio);
}

/** Maximum-likelihood time of a step change in a binomial fraction. */
export function binomialChangePoint(defectives: Float64Array, options: BinomialChangePointOptions): RateChangePoint {
  requireSeries(defectives, "binomial change point");
  requireInside(options.fraction, "in-control fraction", 0, 1);
  const { sizes, fraction } = options;
  if (sizes.length !== defectives.length) {
    throw new SpcInputError(`sizes has ${sizes.length} entries but there are ${defectives.length} counts`);
  }
  for (let index = defectives.length - 1; index >= 0; index--) {
    const value = defectives[index] as number;
    const size = sizes[index] as number;
    if (!(Number.isFinite(size) && size > 0)) {
      throw new SpcInputError(`sample size at index ${index} must be a positive finite number, got ${size}`, index);
    }
    if (value < 0 || value > size) {
      throw new SpcInputError(`count at index ${index} (${value}) must lie between 0 and its sample size ${size}`, index);
    }
  }
  const { summary, numeratorAfter, denominatorAfter } = ratioStepProfile(
    defectives,
    sizes,
    (defectiveSum, sizeSum) => {
      const fractionAfter = defectiveSum / sizeSum;
      return (
        weightedLogRatio(defectiveSum, fractionAfter / fraction) +
        weightedLogRatio(sizeSum - defectiveSum, (1 - fractionAfter) / (1 - fraction))
      );
    },
    options.level ?? DEFAULT_CONFIDENCE_LEVEL,
  );
  const newLevel = numeratorAfter / denominatorAfter;
  return { ...summary, newLevel, ratio: newLevel / fraction };
}
