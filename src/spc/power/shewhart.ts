/**
 * Detection power of a Shewhart chart with k-sigma limits (rule 1 only), in closed form.
 *
 * A subgroup of n from a process whose mean has shifted by δ (in units of the individual-value sigma)
 * plots inside the limits with probability
 *   β(δ, n) = Φ(k − δ√n) − Φ(−k − δ√n)
 * (NIST/SEMATECH Dataplot macro OC_XBAR.DP, "NORCDF(3 - k*SQRT(N)) - NORCDF(-3-k*SQRT(N))"; also
 * Montgomery, Introduction to Statistical Quality Control, the operating-characteristic curve of the
 * X̄ chart). Subgroups are independent, so the chance of at least one signal within m subgroups is
 * 1 − β^m, and ARL₁ = 1/(1 − β). With δ = 0 this is the false-alarm probability of rule 1 over m
 * subgroups, 1 − (1 − 0.0027)^m for 3-sigma limits.
 * 1 − β^m is computed as −expm1(m·log β) so that small probabilities keep their digits.
 */
import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import { SpcInputError } from "../types";

/** Limit width in sigma units: 3 (Shewhart) unless stated. */
export const SHEWHART_LIMIT_WIDTH = 3;

function requireCount(value: number, name: string, minimum: number): void {
  if (!(Number.isInteger(value) && value >= minimum)) {
    throw new SpcInputError(`${name} must be an integer of at least ${minimum}, got ${value}`);
  }
}

/** β: probability that one subgroup plots inside the limits after a shift of delta sigma. */
export function shewhartMissProbability(delta: number, n: number, limitWidth: number = SHEWHART_LIMIT_WIDTH): number {
  if (!Number.isFinite(delta)) throw new SpcInputError(`delta must be a finite number, got ${delta}`);
  requireCount(n, "subgroup size n", 1);
  if (!(Number.isFinite(limitWidth) && limitWidth > 0)) {
    throw new SpcInputError(`limit width must be a positive number, got ${limitWidth}`);
  }
  const offset = delta * Math.sqrt(n);
  return normalCdf(limitWidth - offset, 0, 1) - normalCdf(-limitWidth - offset, 0, 1);
}

/** P(at least one point beyond the limits within m subgroups) = 1 − β^m. */
export function shewhartSignalProbability(delta: number, n: number, m: number, limitWidth: number = SHEWHART_LIMIT_WIDTH): number {
  requireCount(m, "number of subgroups m", 0);
  const miss = shewhartMissProbability(delta, n, limitWidth);
  return -Math.expm1(m * Math.log(miss));
}

/** Average run length 1/(1 − β) after the shift. */
export function shewhartAverageRunLength(delta: number, n: number, limitWidth: number = SHEWHART_LIMIT_WIDTH): number {
  return 1 / (1 - shewhartMissProbability(delta, n, limitWidth));
}

export interface SubgroupsNeededOptions {
  /** Shift to detect, in individual-value sigma units (default 1). */
  readonly delta?: number;
  /** Subgroup size (default 1). */
  readonly n?: number;
  /** Wanted probability of a signal within the window (default 0.9). */
  readonly probability?: number;
  readonly limitWidth?: number;
}

/** Smallest m with 1 − β^m ≥ probability: m = ⌈log(1 − probability)/log β⌉. */
export function subgroupsNeeded(options: SubgroupsNeededOptions = {}): number {
  const { delta = 1, n = 1, probability = 0.9, limitWidth = SHEWHART_LIMIT_WIDTH } = options;
  if (!(probability > 0 && probability < 1)) {
    throw new SpcInputError(`probability must lie strictly between 0 and 1, got ${probability}`);
  }
  const miss = shewhartMissProbability(delta, n, limitWidth);
  if (miss === 0) return 1;
  let m = Math.max(1, Math.ceil(Math.log1p(-probability) / Math.log(miss)));
  // The logarithms can land a hair on either side of an integer: settle on the exact smallest m.
  while (m > 1 && shewhartSignalProbability(delta, n, m - 1, limitWidth) >= probability) m--;
  while (shewhartSignalProbability(delta, n, m, limitWidth) < probability) m++;
  return m;
}
