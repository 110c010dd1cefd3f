/**
 * Shared machinery of the change-point estimators: the argmax of a profile log-likelihood, its
 * likelihood-based confidence set, and input checks.
 *
 * Every estimator in this folder computes, for each candidate last in-control subgroup k
 * (k = -1 .. T-2, 0-based; k = -1 means the change came before the first point analysed), the profile
 * log-likelihood ratio ℓ(k) of "the parameter changed after subgroup k" against "no change", with
 * the new parameter replaced by its maximum-likelihood value. `profile[k + 1]` holds ℓ(k). The last
 * subgroup is always taken to be out of control (the series ends at the signal), so k < T - 1.
 *
 * Estimate: k̂ = argmax ℓ(k). Ties (equal ℓ, which arise only in degenerate data such as runs of zero
 * counts) go to the EARLIEST candidate: an investigation that starts earlier also covers the later
 * candidate.
 *
 * Confidence set: { k : ℓ(k̂) − ℓ(k) ≤ c } with c = χ²₁(level)/2 (1.92 for 95 %), the likelihood-ratio
 * cut that Wilks's theorem justifies for a regular one-dimensional parameter (Casella & Berger,
 * Statistical Inference, 2nd ed., §9.2, likelihood-ratio intervals). The change point is discrete
 * and not regular, so the nominal level is only a guide. Coverage of the 95 % window measured by
 * simulation (test/unit/spc/change-point/accuracy.test.ts design, 2000 runs, signal at the first
 * 3-sigma point): step 0.5σ 0.77, 1σ 0.82, 2σ 0.91, 3σ 0.96; drift 0.1σ/subgroup 0.81, 0.5σ 0.89;
 * Poisson 4→8 0.90; binomial 0.10→0.20 (n = 50) 0.94. Small changes give wide, under-covering windows. Pignatiello & Samuel (2001) build
 * their sets from the same log-likelihood differences but calibrate the cut by simulation (from
 * memory; the paper was not read). The set need not be contiguous; it is reported as the smallest
 * index window that contains it.
 */
import chisquareQuantile from "@stdlib/stats-base-dists-chisquare-quantile";
import { SpcInputError } from "../types";

/** A window of candidate last in-control subgroups, both ends inclusive, as 0-based indices. */
export interface ChangePointWindow {
  readonly start: number;
  readonly end: number;
}

export interface ChangePointConfidenceSet extends ChangePointWindow {
  /** Nominal level of the χ²₁ cut (see the file comment for the measured coverage). */
  readonly level: number;
  /** The log-likelihood drop c that bounds the set. */
  readonly threshold: number;
}

export interface ChangePointSummary {
  /** Last in-control subgroup (0-based); -1 = the change came before the first point analysed. */
  readonly index: number;
  readonly confidenceSet: ChangePointConfidenceSet;
  /** ℓ(k̂): log-likelihood ratio of the best change point against no change at all. */
  readonly logLikelihoodRatio: number;
}

export const DEFAULT_CONFIDENCE_LEVEL = 0.95;

/** The likelihood drop c = χ²₁(level)/2 that bounds the confidence set. */
export function likelihoodThreshold(level: number): number {
  if (!(level > 0 && level < 1)) {
    throw new SpcInputError(`confidence level must lie strictly between 0 and 1, got ${level}`);
  }
  return chisquareQuantile(level, 1) / 2;
}

/** Turns a profile (`profile[k + 1]` = ℓ(k)) into the estimate and its confidence set. */
export function summarizeProfile(profile: Float64Array, level: number = DEFAULT_CONFIDENCE_LEVEL): ChangePointSummary {
  const threshold = likelihoodThreshold(level);
  let best = 0;
  for (let position = 1; position < profile.length; position++) {
    // Strictly greater: on a tie the earlier candidate stays (documented above).
    if ((profile[position] as number) > (profile[best] as number)) best = position;
  }
  const maximum = profile[best] as number;
  let start = best;
  let end = best;
  for (let position = 0; position < profile.length; position++) {
    if (maximum - (profile[position] as number) <= threshold) {
      start = Math.min(start, position);
      end = Math.max(end, position);
    }
  }
  return {
    index: best - 1,
    confidenceSet: { start: start - 1, end: end - 1, level, threshold },
    logLikelihoodRatio: maximum,
  };
}

/** A step-change profile summarised, with the two sums of its new level over the points after the change. */
export interface RatioStepProfile {
  readonly summary: ChangePointSummary;
  readonly numeratorAfter: number;
  readonly denominatorAfter: number;
}

/**
 * The profile of a step change whose new level is the ratio of two sums over the points after k
 * (weighted deviations over weights for a normal mean, counts over inspection units for a rate,
 * defectives over sample sizes for a fraction), summarised. Walks backwards keeping the suffix sums of
 * `numerators` and `denominators`: after index i they cover i .. T−1, the points after candidate
 * k = i − 1, and `likelihood` of the two sums is ℓ(k). Cost: O(T).
 */
export function ratioStepProfile(
  numerators: Float64Array,
  denominators: Float64Array,
  likelihood: (numeratorSum: number, denominatorSum: number) => number,
  level: number,
): RatioStepProfile {
  const count = numerators.length;
  const profile = new Float64Array(count);
  const numeratorSums = new Float64Array(count);
  const denominatorSums = new Float64Array(count);
  let numeratorSum = 0;
  let denominatorSum = 0;
  for (let index = count - 1; index >= 0; index--) {
    numeratorSum += numerators[index] as number;
    denominatorSum += denominators[index] as number;
    numeratorSums[index] = numeratorSum;
    denominatorSums[index] = denominatorSum;
    profile[index] = likelihood(numeratorSum, denominatorSum);
  }
  const summary = summarizeProfile(profile, level);
  const first = summary.index + 1;
  return { summary, numeratorAfter: numeratorSums[first] as number, denominatorAfter: denominatorSums[first] as number };
}

/** Checks a series analysed for a change point: at least two points, all finite. */
export function requireSeries(values: Float64Array, name: string): void {
  if (values.length < 2) {
    throw new SpcInputError(`${name}: a change point needs at least 2 points, got ${values.length}`);
  }
  for (let index = 0; index < values.length; index++) {
    if (!Number.isFinite(values[index])) {
      throw new SpcInputError(`${name}: value at index ${index} is not a finite number`, index);
    }
  }
}

/** Checks that a known parameter is a finite number inside (lower, upper). */
export function requireInside(value: number, name: string, lower: number, upper: number): void {
  if (!(Number.isFinite(value) && value > lower && value < upper)) {
    throw new SpcInputError(`${name} must be a finite number in (${lower}, ${upper}), got ${value}`);
  }
}

/** Checks a normal-model series and its known centre; returns the precision weights 1/σᵢ². */
export function normalModelWeights(values: Float64Array, center: number, sigma: number | Float64Array, name: string): Float64Array {
  requireSeries(values, name);
  requireInside(center, "center", -Infinity, Infinity);
  return precisionWeights(sigma, values.length);
}

/**
 * Per-point precision weights 1/σᵢ² of the plotted statistic. A single sigma applies to every point;
 * an array gives one sigma per point (subgroup sizes that vary).
 */
export function precisionWeights(sigma: number | Float64Array, length: number): Float64Array {
  const weights = new Float64Array(length);
  for (let index = 0; index < length; index++) {
    const value = typeof sigma === "number" ? sigma : sigma[index];
    if (value === undefined || !(Number.isFinite(value) && value > 0)) {
      throw new SpcInputError(`sigma at index ${index} must be a positive finite number, got ${value}`, index);
    }
    weights[index] = 1 / (value * value);
  }
  return weights;
}
