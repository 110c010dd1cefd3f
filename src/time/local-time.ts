/**
 * Wall-clock time in a plant's time zone, both ways: the offset of a zone at an instant, the wall-clock
 * text of an instant (a form's default), and the instant a typed wall-clock time stands for.
 *
 * Offsets come from Intl, which applies the IANA time zone rules in the runtime's ICU data; nothing here
 * knows a rule of its own. A summer-time change makes some wall-clock times impossible and others
 * ambiguous, and `resolveLocalTime` never guesses:
 * - a time the clocks skip (02:30 on the night they go forward in the EU) is refused, with the jump named;
 * - a time the clocks show twice (02:30 on the night they go back) is refused unless the person chose
 *   which of the two offsets they meant; the two choices are returned so a form can offer them.
 * A chosen offset is only read for such a repeated time: anywhere else the zone decides the offset alone.
 * `readWallClock` is the core both the forms (through `resolveLocalTime`) and the CSV import (through
 * `createWallClockReader`, src/imports/timestamps.ts) convert with; each caller decides what to do with a
 * skipped or repeated time. Pure: no clock, no I/O.
 */
import { formatPerZone, zoneNameAt } from "@/src/components/format";

const MINUTE = 60_000;
const DAY = 24 * 60 * MINUTE;

/** Numeric fields only, read back with formatToParts; the locale does not matter for them. */
const wallClockFormatFor = formatPerZone("en-US", {
  year: "numeric",
  month: "2-digit",
  day: "2-digit",
  hour: "2-digit",
  minute: "2-digit",
  second: "2-digit",
  hourCycle: "h23",
});

/** The wall-clock reading of `instant` in `zone`, as milliseconds of the same reading taken in UTC. */
function wallClockMs(instant: number, zone: string): number {
  const fields: Partial<Record<Intl.DateTimeFormatPartTypes, number>> = {};
  for (const part of wallClockFormatFor(zone).formatToParts(new Date(instant))) fields[part.type] = Number(part.value);
  const { year = 0, month = 1, day = 1, hour = 0, minute = 0, second = 0 } = fields;
  return Date.UTC(year, month - 1, day, hour, minute, second);
}

/** Minutes the zone's clocks are ahead of UTC at `instant` (negative west of Greenwich). */
export function offsetMinutesAt(instant: number, zone: string): number {
  const wholeSecond = Math.floor(instant / 1000) * 1000;
  return Math.round((wallClockMs(wholeSecond, zone) - wholeSecond) / MINUTE);
}

/** An offset in minutes as ISO 8601 text: 120 → "+02:00", -330 → "-05:30". */
export function formatOffset(minutes: number): string {
  const sign = minutes < 0 ? "-" : "+";
  const absolute = Math.abs(minutes);
  return `${sign}${String(Math.floor(absolute / 60)).padStart(2, "0")}:${String(absolute % 60).padStart(2, "0")}`;
}

/** The wall-clock time of `instant` in `zone` as a datetime-local field reads it, "2026-03-01T06:00". */
export function wallClockText(instant: Date, zone: string): string {
  return new Date(wallClockMs(instant.getTime(), zone)).toISOString().slice(0, 16);
}

/** One reading of a repeated wall-clock time: the offset that picks it, and how to name it to a person. */
export interface TOffsetChoice {
  /** ISO 8601 offset, "+02:00": the value a form sends back. */
  readonly offset: string;
  /** "02:30 CEST (UTC+02:00), the first time". */
  readonly label: string;
}

/**
 * What a wall-clock reading (held as milliseconds of the same reading taken in UTC) stands for in a zone:
 * - exact: one instant, `wall - offset` minutes;
 * - skipped: none; `problem` names the jump ("does not exist in Europe/London: the clocks jump from 01:00
 *   to 02:00 on 29 Mar 2026");
 * - repeated: two instants, `offsets` ordered so the first gives the earlier instant; `problem` names the
 *   change ("happens twice in Europe/London on 25 Oct 2026: the clocks go back from 02:00 to 01:00").
 */
export type TWallClockReading =
  | { readonly kind: "exact"; readonly offset: number }
  | { readonly kind: "skipped"; readonly problem: string }
  | { readonly kind: "repeated"; readonly offsets: readonly [number, number]; readonly problem: string };

export type TLocalTimeResolution =
  | { readonly kind: "exact"; readonly instant: Date }
  | { readonly kind: "skipped"; readonly problem: string }
  | { readonly kind: "repeated"; readonly problem: string; readonly choices: readonly TOffsetChoice[] };

const dayFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

/** "HH:MM" of a wall-clock reading held as UTC milliseconds. */
function clockOf(wallMs: number): string {
  return new Date(wallMs).toISOString().slice(11, 16);
}

/**
 * The first instant at or after `from` (whole seconds) at which the zone's offset is no longer
 * `offsetBefore`, searched up to `to`, where it is known to have changed. Bisection: at most ~17 steps
 * over a change of a few hours.
 */
function changeInstant(from: number, to: number, offsetBefore: number, zone: string): number {
  let low = from;
  let high = to;
  while (high - low > 1000) {
    const middle = Math.floor((low + high) / 2000) * 1000;
    if (offsetMinutesAt(middle, zone) === offsetBefore) low = middle;
    else high = middle;
  }
  return high;
}

/**
 * Every offset the zone has around a wall-clock reading (a zone changes offset at most once a day), and
 * those that give the reading back, ordered by the instant they give.
 */
function offsetsAround(wall: number, zone: string): { around: ReadonlySet<number>; valid: number[] } {
  const around = new Set([wall - DAY, wall, wall + DAY].map((instant) => offsetMinutesAt(instant, zone)));
  const valid = [...around].filter((offset) => offsetMinutesAt(wall - offset * MINUTE, zone) === offset).sort((first, second) => second - first);
  return { around, valid };
}

/** The reading of `wall` from the offsets that give it back (see offsetsAround). */
function readingFrom(wall: number, zone: string, valid: readonly number[]): TWallClockReading {
  const [first, second] = valid;
  const day = dayFormat.format(new Date(wall));
  if (first === undefined) {
    // Skipped: just before the change the clocks showed the offset of a day earlier.
    const before = offsetMinutesAt(wall - DAY, zone);
    const after = offsetMinutesAt(wall + DAY, zone);
    const change = changeInstant(wall - Math.max(before, after) * MINUTE, wall - Math.min(before, after) * MINUTE, before, zone);
    return {
      kind: "skipped",
      problem: `does not exist in ${zone}: the clocks jump from ${clockOf(change + before * MINUTE)} to ${clockOf(change + after * MINUTE)} on ${day}`,
    };
  }
  if (second === undefined) return { kind: "exact", offset: first };
  const change = changeInstant(wall - first * MINUTE, wall - second * MINUTE, first, zone);
  return {
    kind: "repeated",
    offsets: [first, second],
    problem: `happens twice in ${zone} on ${day}: the clocks go back from ${clockOf(change + first * MINUTE)} to ${clockOf(change + second * MINUTE)}`,
  };
}

/** What the wall-clock reading `wall` (milliseconds of the same reading taken in UTC) stands for in `zone`. */
export function readWallClock(wall: number, zone: string): TWallClockReading {
  return readingFrom(wall, zone, offsetsAround(wall, zone).valid);
}

const HOUR = 60 * MINUTE;

/** Whether two readings say the same (the problem text follows from the change, so it is compared too). */
function sameReading(first: TWallClockReading, second: TWallClockReading): boolean {
  if (first.kind === "exact" || second.kind === "exact") return first.kind === "exact" && second.kind === "exact" && first.offset === second.offset;
  if (first.kind === "repeated" || second.kind === "repeated") {
    return first.kind === "repeated" && second.kind === "repeated" && first.offsets.join() === second.offsets.join() && first.problem === second.problem;
  }
  return first.problem === second.problem;
}

/**
 * The reading shared by every wall-clock time of the hour starting at `start`, or undefined when a change
 * falls inside the hour (half-hour changes, as on Lord Howe Island) and each time must be read alone.
 * When the zone has one offset a day either side of the hour (almost every hour of a year), that offset
 * holds for the whole hour: a day on each side covers every instant the hour's times can stand for. Near a
 * change the hour's first and last second are read, and agree unless the change falls inside the hour (a
 * zone changes offset at most once a day, so it cannot change and change back within an hour).
 */
function readingOfHour(start: number, zone: string): TWallClockReading | undefined {
  const { around, valid } = offsetsAround(start, zone);
  const first = readingFrom(start, zone, valid);
  if (around.size === 1) return first;
  return sameReading(first, readWallClock(start + HOUR - 1000, zone)) ? first : undefined;
}

/**
 * `readWallClock` for many times of one zone, mostly in time order (the rows of a file): the reading is
 * worked out once per wall-clock hour and kept until a time of another hour comes, so a row costs no
 * Intl call (about ten per hour instead of four or more per row).
 */
export function createWallClockReader(zone: string): (wall: number) => TWallClockReading {
  let hourStart = Number.NaN;
  let hourReading: TWallClockReading | undefined;
  return (wall) => {
    const start = Math.floor(wall / HOUR) * HOUR;
    if (start !== hourStart) {
      hourStart = start;
      hourReading = readingOfHour(start, zone);
    }
    return hourReading ?? readWallClock(wall, zone);
  };
}

/**
 * The instant that the wall-clock time `local` ("2026-03-29T02:30", already checked by ZLocalDateTime)
 * stands for in `zone`. `chosenOffset` ("+01:00") picks one reading of a repeated time.
 */
export function resolveLocalTime(local: string, zone: string, chosenOffset?: string): TLocalTimeResolution {
  const wall = Date.parse(`${local.length === 16 ? `${local}:00` : local}Z`);
  const reading = readWallClock(wall, zone);
  if (reading.kind === "exact") return { kind: "exact", instant: new Date(wall - reading.offset * MINUTE) };
  if (reading.kind === "skipped") return { kind: "skipped", problem: `${reading.problem}. Enter the time the clock showed after the jump.` };
  const choices = reading.offsets.map((offset) => ({ offset: formatOffset(offset), instant: wall - offset * MINUTE }));
  const picked = choices.find((choice) => choice.offset === chosenOffset);
  if (picked !== undefined) return { kind: "exact", instant: new Date(picked.instant) };
  const clock = clockOf(wall);
  return {
    kind: "repeated",
    problem: `${reading.problem}. Choose which ${clock} you mean.`,
    choices: choices.map((choice, index) => ({
      offset: choice.offset,
      label: `${clock} ${zoneNameAt(new Date(choice.instant), zone)} (UTC${choice.offset}), the ${index === 0 ? "first" : "second"} time`,
    })),
  };
}
