/**
 * Linear drift in a normal mean: the maximum-likelihood change point of Perry & Pignatiello (2006),
 * "Estimation of the change point of a normal process mean with a linear trend disturbance in SPC",
 * Quality Technology & Quantitative Management 3(3), 325–334 (formula as in
 * /work/shared/reference/published-values.md §4; the paper itself was not read).
 *
 * Model: xᵢ normal with known μ0 and σᵢ; after the last in-control subgroup τ the mean drifts,
 * μᵢ = μ0 + β(i − τ) for i > τ. With weights wᵢ = 1/σᵢ² and dᵢ = xᵢ − μ0, profiling β out gives
 *   β̂(k) = Σ_{i>k} wᵢdᵢ(i − k) / Σ_{i>k} wᵢ(i − k)²,
 *   ℓ(k)  = (Σ_{i>k} wᵢdᵢ(i − k))² / (2 Σ_{i>k} wᵢ(i − k)²),
 * the squared projection of the deviations on the ramp (i − k); with constant σ its argmax is the
 * published τ̂ = argmax [Σ(x̄ᵢ − μ0)(i − t)]² / Σ(i − t)².
 * Cost: O(T) with suffix sums. Positions are measured from the last point (i − (T−1) ≤ 0) so that
 * the sums stay of the size of the terms they combine and do not cancel catastrophically.
 */
import { type ChangePointSummary, DEFAULT_CONFIDENCE_LEVEL, normalModelWeights, summarizeProfile } from "./profile";
import type { NormalChangePointOptions } from "./step";

export interface DriftChangePoint extends ChangePointSummary {
  /** Estimated drift β̂ per subgroup, in the units of the plotted statistic. */
  readonly slope: number;
  /** β̂ in units of the plotted statistic's sigma (root of the mean precision after the change). */
  readonly slopeInSigma: number;
  /** Fitted mean at the last point, μ0 + β̂(T − 1 − τ̂). */
  readonly newLevel: number;
}

/** Maximum-likelihood start of a linear drift in a normal mean, with the drift per subgroup. */
export function driftChangePoint(values: Float64Array, options: NormalChangePointOptions): DriftChangePoint {
  const weights = normalModelWeights(values, options.center, options.sigma, "drift change point");
  const count = values.length;
  const last = count - 1;
  const profile = new Float64Array(count);
  const projections = new Float64Array(count);
  const norms = new Float64Array(count);
  // Suffix sums over i > k of w, w·j, w·j², w·d, w·d·j with j = i − last.
  let sumW = 0;
  let sumWJ = 0;
  let sumWJJ = 0;
  let sumWD = 0;
  let sumWDJ = 0;
  for (let index = last; index >= 0; index--) {
    const weight = weights[index] as number;
    const position = index - last;
    const deviation = (values[index] as number) - options.center;
    sumW += weight;
    sumWJ += weight * position;
    sumWJJ += weight * position * position;
    sumWD += weight * deviation;
    sumWDJ += weight * deviation * position;
    // Candidate k = index − 1, at position q = k − last; i − k = j − q.
    const q = index - 1 - last;
    const projection = sumWDJ - q * sumWD;
    const norm = sumWJJ - 2 * q * sumWJ + q * q * sumW;
    projections[index] = projection;
    norms[index] = norm;
    profile[index] = (projection * projection) / (2 * norm);
  }
  const summary = summarizeProfile(profile, options.level ?? DEFAULT_CONFIDENCE_LEVEL);
  const first = summary.index + 1;
  const slope = (projections[first] as number) / (norms[first] as number);
  let precisionAfter = 0;
  for (let index = first; index < count; index++) precisionAfter += weights[index] as number;
  const meanPrecision = precisionAfter / (count - first);
  return {
    ...summary,
    slope,
    slopeInSigma: slope * Math.sqrt(meanPrecision),
    newLevel: options.center + slope * (last - summary.index),
  };
}
