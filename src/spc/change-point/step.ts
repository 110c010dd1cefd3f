/**
 * Step change in a normal mean: the maximum-likelihood change point of Samuel, Pignatiello & Calvin
 * (1998), "Identifying the time of a step change with X̄ control charts", Quality Engineering 10(3),
 * 521–527 (venue as in /work/shared/reference/published-values.md §4; the project issue cites it as
 * Journal of Quality Technology 30(2), which we could not confirm — the paper itself was not read).
 *
 * Model: plotted values x₁..x_T (subgroup means or individuals) are normal with known in-control mean
 * μ0 and known standard deviation σᵢ (σ/√nᵢ); after the last in-control subgroup τ the mean is μ1.
 * With weights wᵢ = 1/σᵢ², profiling μ1 out of the log-likelihood gives
 *   μ̂1(k) = Σ_{i>k} wᵢxᵢ / Σ_{i>k} wᵢ,
 *   ℓ(k)   = (Σ_{i>k} wᵢ(xᵢ − μ0))² / (2 Σ_{i>k} wᵢ).
 * With a constant σ this is (T−k)(x̄̄_{T,k} − μ0)²/(2σ²), the published statistic (T − t)(x̄̄ − μ0)²
 * up to a constant factor, so the argmax is the published estimator. Derivation: for fixed k the
 * log-likelihood is −½Σ_{i≤k} wᵢ(xᵢ−μ0)² − ½Σ_{i>k} wᵢ(xᵢ−μ1)²; substituting μ̂1 and subtracting the
 * no-change log-likelihood leaves the expression above.
 * Cost: O(T) through suffix sums.
 */
import { type ChangePointSummary, DEFAULT_CONFIDENCE_LEVEL, normalModelWeights, ratioStepProfile } from "./profile";

export interface NormalChangePointOptions {
  /** Known in-control mean μ0 of the plotted statistic. */
  readonly center: number;
  /** Known standard deviation of the plotted statistic (σ/√n), one number or one per point. */
  readonly sigma: number | Float64Array;
  /** Nominal level of the confidence set (default 0.95). */
  readonly level?: number;
}

export interface StepChangePoint extends ChangePointSummary {
  /** Estimated mean after the change, μ̂1. */
  readonly newLevel: number;
  /**
   * (μ̂1 − μ0) in units of the plotted statistic's sigma after the change (with varying sigma, the
   * root of the mean precision after the change: 1/√mean(wᵢ)).
   */
  readonly shiftInSigma: number;
}

/** Maximum-likelihood time of a step change in a normal mean, with its new level. */
export function stepChangePoint(values: Float64Array, options: NormalChangePointOptions): StepChangePoint {
  const weights = normalModelWeights(values, options.center, options.sigma, "step change point");
  const deviations = weights.map((weight, index) => weight * ((values[index] as number) - options.center));
  const { summary, numeratorAfter, denominatorAfter } = ratioStepProfile(
    deviations,
    weights,
    (weightedSum, weightSum) => (weightedSum * weightedSum) / (2 * weightSum),
    options.level ?? DEFAULT_CONFIDENCE_LEVEL,
  );
  const shift = numeratorAfter / denominatorAfter;
  const meanPrecision = denominatorAfter / (values.length - (summary.index + 1));
  return { ...summary, newLevel: options.center + shift, shiftInSigma: shift * Math.sqrt(meanPrecision) };
}
