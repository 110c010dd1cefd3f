/**
 * Process capability indices with confidence intervals.
 *
 * Point estimates (Montgomery, Introduction to Statistical Quality Control, §8.3; Kane, V.E. (1986),
 * "Process capability indices", Journal of Quality Technology 18(1), 41–52):
 * - Cp = (USL − LSL)/(6σ_within), Cpu = (USL − μ)/(3σ_within), Cpl = (μ − LSL)/(3σ_within), Cpk = min(Cpu, Cpl);
 * - Pp, Ppu, Ppl, Ppk: the same with σ_overall, the sample standard deviation of all values (divisor N − 1).
 * With one specification limit only the one-sided index exists: Cpk = Cpu (or Cpl), and Cp, Pp are null.
 *
 * Intervals at confidence 1 − α:
 * - Cp and Pp, exact chi-square: Ĉ·√(χ²_{α/2,ν}/ν) ≤ C ≤ Ĉ·√(χ²_{1−α/2,ν}/ν) with χ²_{p,ν} the lower-tail
 *   p-quantile, from the pivot ν·s²/σ² ~ χ²_ν (Montgomery §8.7, from memory; it follows from the pivot).
 *   Pp: ν = N − 1. Cp: ν = `withinDegreesOfFreedom` when the caller knows how σ_within was estimated;
 *   otherwise N − k for k subgroups of more than one value (exact for the pooled standard deviation, and an
 *   upper bound for R̄/d2, whose effective degrees of freedom are about 0.9·k·(n − 1), from memory) and
 *   N − 1 for individuals (moving-range estimates have fewer effective degrees of freedom, so the interval
 *   is then somewhat too narrow; stated in `notes`).
 * - Cpk, Ppk and the one-sided indices, Bissell's normal approximation: Ĉ·[1 ∓ z_{1−α/2}·√(1/(9NĈ²) + 1/(2(N − 1)))]
 *   (Bissell, A.F. (1990), "How reliable is your capability index?", Applied Statistics 39(3), 331–340;
 *   quoted by Rodriguez, R.N. (1992), Journal of Quality Technology 24(4), 176–187).
 *
 * Expected refusals are values, not throws: fewer than MINIMUM_CAPABILITY_VALUES values, a process the
 * caller does not judge in control (an index describes a stable process only), no specification limit,
 * or no variation at all. Invalid input (non-finite numbers, LSL ≥ USL, confidence outside (0, 1)) throws
 * SpcInputError.
 */
import chisquareQuantile from "@stdlib/stats-base-dists-chisquare-quantile";
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { SpcInputError } from "./types";

/**
 * Fewest values for which indices are reported. At N = 20 the 95% chi-square interval for Cp already
 * spans 0.68·Ĉp to 1.31·Ĉp (ν = 19: √(8.907/19) and √(32.85/19)); with fewer values it is wider than a
 * third of the estimate on either side and the index says little.
 */
export const MINIMUM_CAPABILITY_VALUES = 20;

export interface CapabilityInput {
  readonly values: Float64Array;
  /** Process mean used for the location indices (e.g. the grand mean of the baseline). */
  readonly mean: number;
  /** Within-subgroup σ̂ (R̄/d2, S̄/c4, MR̄/d2). */
  readonly withinSigma: number;
  readonly lsl?: number;
  readonly usl?: number;
  /** Two-sided confidence level, default 0.95. */
  readonly confidence?: number;
  readonly subgroupCount: number;
  /** Whether the chart shows the process in statistical control; capability is refused otherwise. */
  readonly inControl: boolean;
  /** Degrees of freedom of σ_within, when the caller knows them (see the file comment for the default). */
  readonly withinDegreesOfFreedom?: number;
}

export interface IndexEstimate {
  readonly value: number;
  readonly lower: number;
  readonly upper: number;
}

export type CapabilityRefusalCode = "not-in-control" | "too-few-values" | "no-specification" | "no-variation";

export interface CapabilityRefusal {
  readonly status: "refused";
  readonly code: CapabilityRefusalCode;
  readonly reason: string;
}

export interface CapabilityComputed {
  readonly status: "computed";
  readonly sides: "two-sided" | "upper-only" | "lower-only";
  readonly valueCount: number;
  readonly confidence: number;
  readonly mean: number;
  readonly withinSigma: number;
  readonly overallSigma: number;
  readonly withinDegreesOfFreedom: number;
  /** Cp with its chi-square interval; null with one specification limit. */
  readonly cp: IndexEstimate | null;
  /** Cpk (or the one-sided Cpu / Cpl) with Bissell's interval. */
  readonly cpk: IndexEstimate;
  readonly cpu: number | null;
  readonly cpl: number | null;
  readonly pp: IndexEstimate | null;
  readonly ppk: IndexEstimate;
  readonly ppu: number | null;
  readonly ppl: number | null;
  readonly notes: readonly string[];
}

export type TCapabilityResult = CapabilityRefusal | CapabilityComputed;

/** Exact chi-square interval for a spread index (Cp, Pp) estimated with ν degrees of freedom. */
export function chiSquareInterval(estimate: number, degreesOfFreedom: number, confidence: number): IndexEstimate {
  const alpha = 1 - confidence;
  return {
    value: estimate,
    lower: estimate * Math.sqrt(chisquareQuantile(alpha / 2, degreesOfFreedom) / degreesOfFreedom),
    upper: estimate * Math.sqrt(chisquareQuantile(1 - alpha / 2, degreesOfFreedom) / degreesOfFreedom),
  };
}

/** Bissell's (1990) normal-approximation interval for Cpk-type indices from N values. */
export function bissellInterval(estimate: number, valueCount: number, confidence: number): IndexEstimate {
  const z = normalQuantile(1 - (1 - confidence) / 2, 0, 1);
  const relative =
    z * Math.sqrt(1 / (9 * valueCount * estimate * estimate) + 1 / (2 * (valueCount - 1)));
  return { value: estimate, lower: estimate * (1 - relative), upper: estimate * (1 + relative) };
}

export function capabilityRefusal(code: CapabilityRefusalCode, reason: string): CapabilityRefusal {
  return { status: "refused", code, reason };
}

function assertFiniteInput(value: number | undefined, name: string): void {
  if (value !== undefined && !Number.isFinite(value)) {
    throw new SpcInputError(`${name} is not a finite number (${value})`);
  }
}

function sampleStandardDeviation(values: Float64Array, mean: number): number {
  let sumOfSquares = 0;
  for (let index = 0; index < values.length; index++) {
    const deviation = values[index]! - mean;
    sumOfSquares += deviation * deviation;
  }
  return Math.sqrt(sumOfSquares / (values.length - 1));
}

function sampleMean(values: Float64Array): number {
  let sum = 0;
  for (let index = 0; index < values.length; index++) {
    const value = values[index]!;
    if (!Number.isFinite(value)) throw new SpcInputError(`value ${index} is not a finite number (${value})`, index);
    sum += value;
  }
  return sum / values.length;
}

/** One-sided and combined indices for one σ. */
function indices(input: CapabilityInput, sigma: number): { spread: number | null; upper: number | null; lower: number | null } {
  const { lsl, usl, mean } = input;
  return {
    spread: lsl !== undefined && usl !== undefined ? (usl - lsl) / (6 * sigma) : null,
    upper: usl !== undefined ? (usl - mean) / (3 * sigma) : null,
    lower: lsl !== undefined ? (mean - lsl) / (3 * sigma) : null,
  };
}

function locationIndex(upper: number | null, lower: number | null): number {
  if (upper !== null && lower !== null) return Math.min(upper, lower);
  return (upper ?? lower)!;
}

export function computeCapability(input: CapabilityInput): TCapabilityResult {
  const { values, lsl, usl, withinSigma, subgroupCount } = input;
  const confidence = input.confidence ?? 0.95;
  assertFiniteInput(input.mean, "mean");
  assertFiniteInput(withinSigma, "within sigma");
  assertFiniteInput(lsl, "LSL");
  assertFiniteInput(usl, "USL");
  if (!(confidence > 0 && confidence < 1)) throw new SpcInputError(`confidence must be in (0, 1), got ${confidence}`);
  if (lsl !== undefined && usl !== undefined && lsl >= usl) {
    throw new SpcInputError(`LSL ${lsl} must be below USL ${usl}`);
  }
  if (!(withinSigma >= 0)) throw new SpcInputError(`within sigma must not be negative (${withinSigma})`);

  if (!input.inControl) {
    return capabilityRefusal(
      "not-in-control",
      "the process is not in statistical control: capability describes a stable process only",
    );
  }
  if (lsl === undefined && usl === undefined) {
    return capabilityRefusal("no-specification", "no specification limit was given");
  }
  if (values.length < MINIMUM_CAPABILITY_VALUES) {
    return capabilityRefusal(
      "too-few-values",
      `${values.length} values; at least ${MINIMUM_CAPABILITY_VALUES} are needed for a useful interval`,
    );
  }
  const overallSigma = sampleStandardDeviation(values, sampleMean(values));
  if (withinSigma === 0 || overallSigma === 0) {
    return capabilityRefusal("no-variation", "the values show no variation, so the indices are unbounded");
  }

  const notes: string[] = [];
  const valueCount = values.length;
  const individuals = subgroupCount >= valueCount;
  const withinDegreesOfFreedom =
    input.withinDegreesOfFreedom ?? (individuals ? valueCount - 1 : valueCount - subgroupCount);
  if (input.withinDegreesOfFreedom === undefined && individuals) {
    notes.push("Cp interval uses N − 1 degrees of freedom; a moving-range sigma has fewer, so it is somewhat narrow");
  }
  const within = indices(input, withinSigma);
  const overall = indices(input, overallSigma);
  const cpk = locationIndex(within.upper, within.lower);
  const ppk = locationIndex(overall.upper, overall.lower);
  return {
    status: "computed",
    sides: lsl !== undefined && usl !== undefined ? "two-sided" : usl !== undefined ? "upper-only" : "lower-only",
    valueCount,
    confidence,
    mean: input.mean,
    withinSigma,
    overallSigma,
    withinDegreesOfFreedom,
    cp: within.spread === null ? null : chiSquareInterval(within.spread, withinDegreesOfFreedom, confidence),
    cpk: bissellInterval(cpk, valueCount, confidence),
    cpu: within.upper,
    cpl: within.lower,
    pp: overall.spread === null ? null : chiSquareInterval(overall.spread, valueCount - 1, confidence),
    ppk: bissellInterval(ppk, valueCount, confidence),
    ppu: overall.upper,
    ppl: overall.lower,
    notes,
  };
}
