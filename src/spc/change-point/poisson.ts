/**
 * Step change in a Poisson rate (c and u charts): the maximum-likelihood change point with a known
 * in-control rate, the Poisson counterpart of the normal step estimator. General form after
 * Samuel & Pignatiello (1998), "Identifying the time of a change in a Poisson rate parameter",
 * Quality Engineering 10(4), 673–681 (from memory; the paper was not read), extended here to
 * inspection units that vary (u chart).
 *
 * Model: cᵢ ~ Poisson(λ aᵢ) with aᵢ inspection units (1 on a c chart); λ = λ0 (known, per unit) up to
 * the last in-control subgroup τ and λ1 after. Derivation: for fixed k the log-likelihood of the
 * points after k is Σ[cᵢ log(λ1 aᵢ) − λ1 aᵢ − log cᵢ!]; it is maximal at λ̂1 = C/A with C = Σ_{i>k} cᵢ,
 * A = Σ_{i>k} aᵢ. Subtracting the same sum at λ0 (the points up to k cancel) gives
 *   ℓ(k) = C log(λ̂1/λ0) − A(λ̂1 − λ0),   with C log(·) = 0 when C = 0 (the limit of x log x).
 * ℓ(k) ≥ 0, being a Kullback–Leibler-type divergence. Cost: O(T).
 */
import { SpcInputError } from "../types";
import { type ChangePointSummary, DEFAULT_CONFIDENCE_LEVEL, ratioStepProfile, requireInside, requireSeries } from "./profile";

export interface PoissonChangePointOptions {
  /** Known in-control rate per inspection unit (c̄ on a c chart, ū on a u chart). */
  readonly rate: number;
  /** Inspection units per subgroup (default: 1 each, a c chart). */
  readonly units?: Float64Array;
  readonly level?: number;
}

export interface RateChangePoint extends ChangePointSummary {
  /** Estimated rate (per unit, or fraction for the binomial) after the change. */
  readonly newLevel: number;
  /** newLevel divided by the in-control value. */
  readonly ratio: number;
}

/** Maximum-likelihood time of a step change in a Poisson rate. */
export function poissonChangePoint(counts: Float64Array, options: PoissonChangePointOptions): RateChangePoint {
  requireSeries(counts, "Poisson change point");
  requireInside(options.rate, "in-control rate", 0, Infinity);
  const units = options.units;
  if (units !== undefined && units.length !== counts.length) {
    throw new SpcInputError(`units has ${units.length} entries but there are ${counts.length} counts`);
  }
  const unitCounts = units ?? new Float64Array(counts.length).fill(1);
  for (let index = counts.length - 1; index >= 0; index--) {
    const value = counts[index] as number;
    const size = unitCounts[index] as number;
    if (value < 0) throw new SpcInputError(`count at index ${index} is negative (${value})`, index);
    if (!(Number.isFinite(size) && size > 0)) {
      throw new SpcInputError(`units at index ${index} must be a positive finite number, got ${size}`, index);
    }
  }
  const { rate } = options;
  const { summary, numeratorAfter, denominatorAfter } = ratioStepProfile(
    counts,
    unitCounts,
    (countSum, unitSum) => {
      const rateAfter = countSum / unitSum;
      const logTerm = countSum === 0 ? 0 : countSum * Math.log(rateAfter / rate);
      return logTerm - unitSum * (rateAfter - rate);
    },
    options.level ?? DEFAULT_CONFIDENCE_LEVEL,
  );
  const newLevel = numeratorAfter / denominatorAfter;
  return { ...summary, newLevel, ratio: newLevel / rate };
}
