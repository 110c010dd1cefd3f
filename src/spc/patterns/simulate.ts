/**
 * Seeded generators of chart data showing one known pattern, for calibrating and testing the pattern
 * reader (invented data: the process is N(μ, σ²) by construction, every effect a known multiple of the
 * plotted statistic's standard deviation σ/√n).
 *
 * Each series is `baseline` in-control subgroups (from which Phase I limits are meant to be estimated)
 * followed by `monitoring` subgroups in which the pattern begins at `onset` (an index into the whole
 * series). The effect models are the textbook pictures of each pattern (Western Electric Company,
 * Statistical Quality Control Handbook, 1956, Part B, "Interpretation of charts": shifts, trends,
 * cycles, mixtures, stratification, freaks; from memory):
 * - shift: the mean steps by `size`·σ/√n at the onset and stays there;
 * - trend: the mean drifts by `size`·σ/√n per subgroup from the onset;
 * - cycle: a sine wave of amplitude `size`·σ/√n and period `period` from the onset;
 * - mixture: from the onset each subgroup comes from one of two streams at ±`size`·σ/√n, the stream
 *   chosen at random or taken in turn (`alternating`);
 * - stratification: from the onset the subgroup means vary only `size` times as much as they should
 *   (for n > 1 the within-subgroup deviations are kept, so ranges are unchanged and only the means lose
 *   variation — the picture of a subgroup drawn one part from each of several streams);
 * - outlier: one subgroup at the onset sits `size`·σ/√n from the mean;
 * - spread: from the onset σ is multiplied by `size`.
 */
import { variablesData } from "../data";
import type { Rng } from "../random";
import type { VariablesData } from "../types";
import type { PatternKind } from "../../../shared/patterns";

export type SimulatedKind = PatternKind | "none";

export interface SimulationSpec {
  readonly kind: SimulatedKind;
  /** Subgroup size n (1 = individuals). */
  readonly subgroupSize: number;
  readonly baseline: number;
  readonly monitoring: number;
  /** Index of the first affected subgroup (≥ baseline). */
  readonly onset: number;
  /** Effect size, in the units described in the file comment (ignored for "none"). */
  readonly size: number;
  /** Cycle period in subgroups. */
  readonly period?: number;
  /** Mixture: streams taken in turn instead of at random. */
  readonly alternating?: boolean;
  readonly mean?: number;
  readonly sigma?: number;
}

export interface SimulatedSeries {
  readonly spec: SimulationSpec;
  readonly data: VariablesData;
}

/** One series of the requested pattern, reproducible from the generator's seed. */
export function simulatePattern(spec: SimulationSpec, rng: Rng): SimulatedSeries {
  const mean = spec.mean ?? 10;
  const sigma = spec.sigma ?? 1;
  const n = spec.subgroupSize;
  const plottedSigma = sigma / Math.sqrt(n);
  const total = spec.baseline + spec.monitoring;
  const subgroups: number[][] = [];
  for (let index = 0; index < total; index++) {
    const after = index >= spec.onset;
    const age = index - spec.onset;
    const noise = Array.from({ length: n }, () => rng.normal());
    let level = mean;
    let scale = sigma;
    let meanShrink = 1;
    if (after) {
      switch (spec.kind) {
        case "shift":
          level += spec.size * plottedSigma;
          break;
        case "trend":
          level += spec.size * plottedSigma * (age + 1);
          break;
        case "cycle":
          level += spec.size * plottedSigma * Math.sin((2 * Math.PI * age) / (spec.period ?? 8));
          break;
        case "mixture": {
          const upper = spec.alternating ? age % 2 === 0 : rng.uniform() < 0.5;
          level += (upper ? 1 : -1) * spec.size * plottedSigma;
          break;
        }
        case "stratification":
          meanShrink = spec.size;
          break;
        case "outlier":
          if (age === 0) level += (rng.uniform() < 0.5 ? -1 : 1) * spec.size * plottedSigma;
          break;
        case "spread":
          scale *= spec.size;
          break;
        case "none":
          break;
      }
    }
    subgroups.push(shrinkMean(noise, meanShrink).map((deviation) => level + scale * deviation));
  }
  return { spec, data: variablesData(subgroups) };
}

/**
 * Scale the subgroup's own mean by `factor` and keep the deviations from it; for n = 1 the single value
 * is scaled (no within-subgroup deviation exists).
 */
function shrinkMean(noise: number[], factor: number): number[] {
  if (factor === 1) return noise;
  const average = noise.reduce((sum, value) => sum + value, 0) / noise.length;
  return noise.map((value) => value - average + factor * average);
}
