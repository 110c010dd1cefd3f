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
 * Pure: no clock, no I/O.
 */
import { formatPerZone, zoneNameAt } from "./format";

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
 * The instant that the wall-clock time `local` ("2026-03-29T02:30", already checked by ZLocalDateTime)
 * stands for in `zone`. `chosenOffset` ("+01:00") picks one reading of a repeated time.
 */
export function resolveLocalTime(local: string, zone: string, chosenOffset?: string): TLocalTimeResolution {
  const wall = Date.parse(`${local.length === 16 ? `${local}:00` : local}Z`);
  // Every offset the zone can have around this wall-clock time; a zone changes offset at most once a day.
  const offsets = new Set([wall - DAY, wall, wall + DAY].map((instant) => offsetMinutesAt(instant, zone)));
  const readings = [...offsets]
    .map((offset) => ({ offset, instant: wall - offset * MINUTE }))
    .filter(({ offset, instant }) => offsetMinutesAt(instant, zone) === offset)
    .sort((first, second) => first.instant - second.instant);
  const [first, second] = readings;
  const day = dayFormat.format(new Date(wall));
  if (first === undefined) {
    // Skipped: just before the change the clocks showed the offset of a day earlier.
    const before = offsetMinutesAt(wall - DAY, zone);
    const after = offsetMinutesAt(wall + DAY, zone);
    const change = changeInstant(wall - Math.max(before, after) * MINUTE, wall - Math.min(before, after) * MINUTE, before, zone);
    return {
      kind: "skipped",
      problem:
        `does not exist in ${zone}: the clocks jump from ${clockOf(change + before * MINUTE)} to ${clockOf(change + after * MINUTE)} ` +
        `on ${day}. Enter the time the clock showed after the jump.`,
    };
  }
  if (second === undefined) return { kind: "exact", instant: new Date(first.instant) };
  const choices = [first, second].map(({ offset, instant }) => ({ offset: formatOffset(offset), instant }));
  const picked = choices.find((choice) => choice.offset === chosenOffset);
  if (picked !== undefined) return { kind: "exact", instant: new Date(picked.instant) };
  const clock = clockOf(wall);
  const change = changeInstant(first.instant, second.instant, first.offset, zone);
  return {
    kind: "repeated",
    problem:
      `happens twice in ${zone} on ${day}: the clocks go back from ${clockOf(change + first.offset * MINUTE)} to ` +
      `${clockOf(change + second.offset * MINUTE)}. Choose which ${clock} you mean.`,
    choices: choices.map((choice, index) => ({
      offset: choice.offset,
      label: `${clock} ${zoneNameAt(new Date(choice.instant), zone)} (UTC${choice.offset}), the ${index === 0 ? "first" : "second"} time`,
    })),
  };
}
