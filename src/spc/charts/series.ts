/**
 * Shewhart limits and zones for one plotted statistic.
 *
 * Every chart here plots a statistic with centre CL and standard deviation σ (per point where the
 * sample size varies); action limits are CL ± 3σ (Shewhart 1931; Montgomery, Introduction to Statistical
 * Quality Control, §5.3), warning limits CL ± 2σ, and zones C, B, A lie within 1σ, 2σ, 3σ
 * (Western Electric, Statistical Quality Control Handbook, 1956). A lower limit below the smallest value
 * the statistic can take is truncated at that floor (e.g. D3 = 0 for small subgroups); an upper limit
 * above the largest value (p = 1) is truncated at that ceiling.
 */
import type { StatisticKey, StatisticSeries } from "../types";

export const ACTION_LIMIT_WIDTH = 3;
export const WARNING_LIMIT_WIDTH = 2;

export interface SeriesShape {
  readonly key: StatisticKey;
  readonly points: Float64Array;
  readonly center: number;
  readonly sigma: Float64Array;
  readonly floor: number;
  readonly zoneRulesByDefault: boolean;
  /** Limit half-width in units of sigma (3 for Shewhart charts, L for EWMA). */
  readonly width?: number;
  /** Largest value the statistic can take (1 for a fraction). */
  readonly ceiling?: number;
}

export function limitSeries(shape: SeriesShape): StatisticSeries {
  const { points, center, sigma, floor } = shape;
  const width = shape.width ?? ACTION_LIMIT_WIDTH;
  const ceiling = shape.ceiling ?? Infinity;
  const ucl = new Float64Array(points.length);
  const lcl = new Float64Array(points.length);
  // Limits are a function of sigma alone, so one sigma at every point gives uniform limits.
  let sigmaVaries = false;
  for (let index = 0; index < points.length; index++) {
    const spread = width * sigma[index]!;
    ucl[index] = Math.min(ceiling, center + spread);
    lcl[index] = Math.max(floor, center - spread);
    sigmaVaries ||= sigma[index] !== sigma[0];
  }
  return {
    key: shape.key,
    points,
    center,
    ucl,
    lcl,
    sigma,
    floor,
    zoneRulesByDefault: shape.zoneRulesByDefault,
    uniformLimits: !sigmaVaries,
  };
}

/** A constant per-point sigma array. */
export function constantSigma(length: number, sigma: number): Float64Array {
  return new Float64Array(length).fill(sigma);
}

/**
 * Signed zone of a value: 0 exactly on the centre line; ±1 within 1σ (zone C), ±2 within 2σ (zone B),
 * ±3 within 3σ (zone A), ±4 beyond 3σ; the sign is the side. Boundaries use strict inequalities for
 * "beyond": a point exactly at kσ from the centre is inside the inner zone (at exactly 1σ it is zone C,
 * at exactly 3σ zone A, not beyond the action limit). With sigma = 0 every off-centre point is ±4.
 * NaN when the value or sigma is NaN (no zone by definition, e.g. the first moving range or CUSUM).
 */
export function zoneOf(value: number, center: number, sigma: number): number {
  if (Number.isNaN(value) || Number.isNaN(sigma)) return NaN;
  const deviation = value - center;
  if (deviation === 0) return 0;
  const distance = Math.abs(deviation);
  let zone = 4;
  for (let k = 1; k <= 3; k++) {
    if (distance <= k * sigma) {
      zone = k;
      break;
    }
  }
  return deviation > 0 ? zone : -zone;
}

/**
 * Warning limits CL ± 2σ at point `index`. A warning limit that would lie beyond the statistic's range
 * (above a p chart's ceiling of 1, below its floor) does not exist and is NaN, rather than drawn on top of
 * the truncated action limit; both are NaN where the series has no σ (CUSUM).
 */
export function warningLimitsAt(series: StatisticSeries, index: number): { readonly upper: number; readonly lower: number } {
  const { center, sigma, ucl, floor } = series;
  const upper = center + WARNING_LIMIT_WIDTH * sigma[index]!;
  const lower = center - WARNING_LIMIT_WIDTH * sigma[index]!;
  return { upper: upper <= ucl[index]! ? upper : NaN, lower: lower >= floor ? lower : NaN };
}
