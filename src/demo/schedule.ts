/**
 * When each press is checked, by whom, and on which resin lot. Times are UTC; the schedule ends at the
 * last shift boundary not after the scenario's end, so every timestamp is in the past of `end`.
 */
import type { Rng } from "@/src/spc/random";
import {
  CREWS,
  PRESS_CHECK_OFFSET_MINUTES,
  SHIFTS,
  SHIFTS_PER_DAY,
  SUBGROUPS_PER_SHIFT,
  SUBGROUP_COUNT,
  TYPICAL_LOT_LENGTH,
} from "./plant";
import type { DemoProcessKey } from "./types";

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const SHIFT_HOURS = 24 / SHIFTS_PER_DAY;
const SHIFTS_PER_WEEK = 7 * SHIFTS_PER_DAY;
/** Checks fall 40, 200 and 360 minutes into the shift, give or take up to 10 minutes. */
const FIRST_CHECK_MINUTES = 40;
const CHECK_SPACING_MINUTES = (SHIFT_HOURS * 60) / SUBGROUPS_PER_SHIFT;
const CHECK_JITTER_MINUTES = 10;

export interface CrewRotation {
  readonly at: Date;
  readonly firstSubgroup: number;
  /** Operator on each shift (in SHIFTS order) for the coming week. */
  readonly operatorByShift: readonly string[];
}

export interface PressSchedule {
  readonly times: readonly Date[];
  readonly shiftNames: readonly string[];
  readonly operators: readonly string[];
  readonly rotations: readonly CrewRotation[];
}

/** The latest shift start (06:00, 14:00 or 22:00 UTC) at or before `end`. */
function lastShiftBoundary(end: Date): Date {
  const dayStart = Date.UTC(end.getUTCFullYear(), end.getUTCMonth(), end.getUTCDate());
  // The previous day's night shift (22:00, i.e. hour -2 of this day) covers ends before 06:00.
  const startHours = [-2, ...SHIFTS.map((shift) => shift.startHour)];
  const candidates = startHours.map((hour) => dayStart + hour * HOUR);
  const notAfterEnd = candidates.filter((time) => time <= end.getTime());
  return new Date(Math.max(...notAfterEnd));
}

function shiftIndexOfHour(hour: number): number {
  const index = SHIFTS.findIndex((shift) => shift.startHour === hour);
  if (index < 0) throw new Error(`No shift starts at ${hour}:00 UTC`);
  return index;
}

/** Operators rotate weekly: in week w the crew on shift s is crew (s + w) mod 3. */
function operatorFor(processKey: DemoProcessKey, shiftOfDay: number, week: number): string {
  const crews = CREWS[processKey];
  const operator = crews[(shiftOfDay + week) % crews.length];
  if (operator === undefined) throw new Error(`No crew for shift ${shiftOfDay} on ${processKey}`);
  return operator;
}

export function buildPressSchedule(processKey: DemoProcessKey, end: Date, rng: Rng): PressSchedule {
  const shiftCount = SUBGROUP_COUNT / SUBGROUPS_PER_SHIFT;
  const firstShiftStart = lastShiftBoundary(end).getTime() - shiftCount * SHIFT_HOURS * HOUR;
  const offset = PRESS_CHECK_OFFSET_MINUTES[processKey];
  const times: Date[] = [];
  const shiftNames: string[] = [];
  const operators: string[] = [];
  const rotations: CrewRotation[] = [];
  for (let shift = 0; shift < shiftCount; shift += 1) {
    const shiftStart = firstShiftStart + shift * SHIFT_HOURS * HOUR;
    const shiftOfDay = shiftIndexOfHour(new Date(shiftStart).getUTCHours());
    const week = Math.floor(shift / SHIFTS_PER_WEEK);
    if (shift > 0 && shift % SHIFTS_PER_WEEK === 0) {
      rotations.push({
        at: new Date(shiftStart),
        firstSubgroup: times.length,
        operatorByShift: SHIFTS.map((_, index) => operatorFor(processKey, index, week)),
      });
    }
    for (let check = 0; check < SUBGROUPS_PER_SHIFT; check += 1) {
      const jitter = Math.round((2 * rng.uniform() - 1) * CHECK_JITTER_MINUTES);
      const minutes = FIRST_CHECK_MINUTES + check * CHECK_SPACING_MINUTES + offset + jitter;
      times.push(new Date(shiftStart + minutes * MINUTE));
      shiftNames.push(SHIFTS[shiftOfDay]?.name ?? "");
      operators.push(operatorFor(processKey, shiftOfDay, week));
    }
  }
  return { times, shiftNames, operators, rotations };
}

/** Halfway between subgroup `index - 1` and subgroup `index`: when something "right before" it happened. */
export function timeBefore(times: readonly Date[], index: number): Date {
  const after = times[index];
  const before = times[index - 1];
  if (after === undefined || before === undefined) throw new RangeError(`No gap before subgroup ${index}`);
  return new Date(Math.round((before.getTime() + after.getTime()) / 2));
}

/**
 * First subgroup of each resin lot. The stretches between the `anchors` (forced lot starts) are cut
 * into lots of about TYPICAL_LOT_LENGTH subgroups, each cut moved by up to ±6 subgroups.
 */
export function lotStarts(count: number, anchors: readonly number[], rng: Rng): number[] {
  const edges = [0, ...anchors, count];
  const starts: number[] = [];
  for (let segment = 0; segment + 1 < edges.length; segment += 1) {
    const from = edges[segment] ?? 0;
    const to = edges[segment + 1] ?? count;
    const lots = Math.max(1, Math.round((to - from) / TYPICAL_LOT_LENGTH));
    starts.push(from);
    for (let cut = 1; cut < lots; cut += 1) {
      const jitter = Math.round((2 * rng.uniform() - 1) * 6);
      starts.push(from + Math.round(((to - from) * cut) / lots) + jitter);
    }
  }
  return starts;
}

/** Resin lot names, one per lot start, with increasing invented lot numbers. */
export function lotNames(lotCount: number, rng: Rng): string[] {
  let number = 30_000 + Math.floor(rng.uniform() * 9_000);
  const names: string[] = [];
  for (let lot = 0; lot < lotCount; lot += 1) {
    names.push(`PP-${number}`);
    number += 1 + Math.floor(rng.uniform() * 4);
  }
  return names;
}

/** The lot name for every subgroup, given the lot starts. */
export function lotPerSubgroup(count: number, starts: readonly number[], names: readonly string[]): string[] {
  const lots: string[] = [];
  let lot = 0;
  for (let index = 0; index < count; index += 1) {
    while (lot + 1 < starts.length && (starts[lot + 1] ?? count) <= index) lot += 1;
    lots.push(names[lot] ?? "");
  }
  return lots;
}
