/**
 * The measured series of the demo plant: in-control noise from the model in ./plant.ts plus the planted
 * disturbances. Normal values come from the seeded Ziggurat generator, counts from stdlib-js's binomial
 * and Poisson generators driven by the same seeded uniform stream, so one seed fixes everything.
 */
import binomialFactory from "@stdlib/random-base-binomial";
import poissonFactory from "@stdlib/random-base-poisson";
import type { Rng } from "@/src/spc/random";
import {
  CAP_HEIGHT,
  CAVITY_MIXTURE,
  CHILLER_CYCLE,
  CLOSURE_WEIGHT,
  DIGIT_SLIP,
  FLASH,
  HEATER_DRIFT,
  SHORT_SHOT,
  SUBGROUP_COUNT,
  WEIGHT_SHIFT,
} from "./plant";

/** Closure weights per subgroup: one closure from each of the five cavity pairs. */
const WEIGHT_SUBGROUP_SIZE = 5;

export interface DigitSlip {
  readonly sequence: number;
  readonly position: number;
  readonly intended: number;
  readonly typed: number;
}

export interface CountSeries {
  readonly counts: readonly number[];
  readonly sizes: readonly number[];
}

function decimalsOf(resolution: number): number {
  return Math.max(0, Math.round(-Math.log10(resolution)));
}

/** A reading as the gauge shows it: rounded to the gauge's resolution. */
export function roundToResolution(value: number, resolution: number): number {
  const scale = 10 ** decimalsOf(resolution);
  return Math.round(value * scale) / scale;
}

/**
 * The value someone typing `value` would enter after swapping its first two decimals (2.614 → 2.164),
 * or null when those digits are equal and the slip would not show.
 */
export function transposeFirstDecimals(value: number, decimals: number): number | null {
  const text = value.toFixed(decimals);
  const point = text.indexOf(".");
  const first = text[point + 1];
  const second = text[point + 2];
  if (point < 0 || first === undefined || second === undefined || first === second) return null;
  return Number(text.slice(0, point + 1) + second + first + text.slice(point + 3));
}

function inWindow(index: number, window: { readonly first: number; readonly last: number }): boolean {
  return index >= window.first && index <= window.last;
}

/** Fraction of a window completed at `index`: 1/length at its first subgroup, 1 at its last. */
function progress(index: number, window: { readonly first: number; readonly last: number }): number {
  return (index - window.first + 1) / (window.last - window.first + 1);
}

/** Closure weights (g): in control around the target, shifted for one resin lot, with one digit slip. */
export function closureWeights(rng: Rng): { subgroups: number[][]; slip: DigitSlip } {
  const subgroups: number[][] = [];
  for (let index = 0; index < SUBGROUP_COUNT; index += 1) {
    const mean = CLOSURE_WEIGHT.mean + (inWindow(index, WEIGHT_SHIFT) ? WEIGHT_SHIFT.shift : 0);
    const values: number[] = [];
    for (let position = 0; position < WEIGHT_SUBGROUP_SIZE; position += 1) {
      values.push(roundToResolution(mean + CLOSURE_WEIGHT.sigma * rng.normal(), CLOSURE_WEIGHT.resolution));
    }
    subgroups.push(values);
  }
  return { subgroups, slip: plantDigitSlip(subgroups) };
}

/** Types one reading of subgroup DIGIT_SLIP.sequence wrongly: the preferred position if its digits differ. */
function plantDigitSlip(subgroups: number[][]): DigitSlip {
  const values = subgroups[DIGIT_SLIP.sequence];
  if (values === undefined) throw new RangeError(`No subgroup ${DIGIT_SLIP.sequence} for the digit slip`);
  const decimals = decimalsOf(CLOSURE_WEIGHT.resolution);
  const order = [DIGIT_SLIP.preferredPosition, ...values.keys()];
  for (const position of order) {
    const intended = values[position];
    const typed = intended === undefined ? null : transposeFirstDecimals(intended, decimals);
    if (intended !== undefined && typed !== null) {
      values[position] = typed;
      return { sequence: DIGIT_SLIP.sequence, position, intended, typed };
    }
  }
  throw new Error(`Subgroup ${DIGIT_SLIP.sequence} has no reading whose first decimals differ`);
}

/** Cap heights (mm), one closure per check: heater-band drift, then two cavities mixed on the chart. */
export function capHeights(rng: Rng): { values: number[]; cavities: string[] } {
  const values: number[] = [];
  const cavities: string[] = [];
  for (let index = 0; index < SUBGROUP_COUNT; index += 1) {
    let mean = CAP_HEIGHT.mean;
    let cavity: string = CAVITY_MIXTURE.usualCavity;
    if (inWindow(index, HEATER_DRIFT)) mean += HEATER_DRIFT.totalChange * progress(index, HEATER_DRIFT);
    if (inWindow(index, CAVITY_MIXTURE)) {
      const high = (index - CAVITY_MIXTURE.first) % 2 === 0;
      mean += high ? CAVITY_MIXTURE.offset : -CAVITY_MIXTURE.offset;
      cavity = high ? CAVITY_MIXTURE.highCavity : CAVITY_MIXTURE.lowCavity;
    }
    values.push(roundToResolution(mean + CAP_HEIGHT.sigma * rng.normal(), CAP_HEIGHT.resolution));
    cavities.push(cavity);
  }
  return { values, cavities };
}

function uniformInteger(rng: Rng, low: number, high: number): number {
  return low + Math.floor(rng.uniform() * (high - low + 1));
}

/** Short shots among a varying sample of closures: rising while the heater band fails. */
export function shortShots(rng: Rng): CountSeries {
  const binomial = binomialFactory.factory({ prng: rng.uniform });
  const counts: number[] = [];
  const sizes: number[] = [];
  for (let index = 0; index < SUBGROUP_COUNT; index += 1) {
    const size = uniformInteger(rng, SHORT_SHOT.minSample, SHORT_SHOT.maxSample);
    const factor = inWindow(index, HEATER_DRIFT)
      ? 1 + (HEATER_DRIFT.finalProportionFactor - 1) * progress(index, HEATER_DRIFT)
      : 1;
    counts.push(binomial(size, SHORT_SHOT.proportion * factor));
    sizes.push(size);
  }
  return { counts, sizes };
}

/** Flash defects in a varying number of inspection units (100 closures each): cycling with the chiller. */
export function flashDefects(rng: Rng): CountSeries {
  const poisson = poissonFactory.factory({ prng: rng.uniform });
  const counts: number[] = [];
  const sizes: number[] = [];
  for (let index = 0; index < SUBGROUP_COUNT; index += 1) {
    const units = uniformInteger(rng, FLASH.minClosures, FLASH.maxClosures) / 100;
    const phase = (2 * Math.PI * (index - CHILLER_CYCLE.first)) / CHILLER_CYCLE.period;
    const factor = inWindow(index, CHILLER_CYCLE) ? 1 + CHILLER_CYCLE.relativeAmplitude * Math.sin(phase) : 1;
    counts.push(poisson(FLASH.ratePerUnit * factor * units));
    sizes.push(units);
  }
  return { counts, sizes };
}
