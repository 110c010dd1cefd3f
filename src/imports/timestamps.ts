/**
 * Reading a timestamp cell of an imported file into milliseconds since the epoch, or a reason why not.
 *
 * Accepted forms (seconds and, for ISO, fractions of a second optional; "T" or a space between date and time):
 * - ISO 8601 with a zone: 2026-03-01T06:00:00Z, 2026-03-01 06:00+01:00, 2026-03-01T06:00:00.250-0500;
 * - ISO 8601 without a zone: 2026-03-01 06:00:00, read at the UTC offset the person states, or as
 *   wall-clock time in the site's time zone;
 * - day.month.year: 01.03.2026 06:00, the dotted order being day first by convention, read as above;
 * - slash dates: 03/04/2026 06:00, only when the person states day-first or month-first (and how to read
 *   times without a zone).
 * Anything else is refused with the forms listed, never guessed at: a date alone, two-digit years,
 * impossible dates (31.04.2026), hours past 23, leap seconds.
 *
 * Wall-clock time in a zone (`readWallClock`, src/time/local-time.ts, the forms' conversion): a time the
 * clocks skip is refused with the jump named; a time they show twice takes the earlier of its two
 * instants that is not before the previous row's time (rows are in time order, so the clocks going back
 * show in the file as times going back), and is refused when neither is.
 */
import { createWallClockReader } from "@/src/time/local-time";
import type { TDayMonthOrder } from "./options";

export interface TTimestampReading {
  /** Offset for times without a zone ("Z", "+01:00"). */
  readonly utcOffset?: string;
  /** IANA time zone whose wall-clock time the times without a zone are. With neither, such times are refused. */
  readonly zone?: string;
  readonly dayMonthOrder?: TDayMonthOrder;
}

export type TTimestampResult = { readonly ok: true; readonly milliseconds: number } | { readonly ok: false; readonly message: string };

/** The instant of a wall-clock reading written without a zone (held as UTC milliseconds of the same reading). */
type TLocalTimeReader = (wall: number, text: string) => TTimestampResult;

/** How times without a zone are read: at a fixed offset ("+01:00"), by a zone's rules, or refused. */
type TZoneless = string | TLocalTimeReader | undefined;

const MINUTE = 60_000;

const TIME = String.raw`(\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?`;
const ISO = new RegExp(String.raw`^(\d{4})-(\d{2})-(\d{2})[T ]${TIME}\s*(Z|[+-]\d{2}:?\d{2})?$`, "i");
const DOTTED = new RegExp(String.raw`^(\d{1,2})\.(\d{1,2})\.(\d{4})[ T]${TIME}$`);
const SLASHED = new RegExp(String.raw`^(\d{1,2})/(\d{1,2})/(\d{4})[ T]${TIME}$`);
const DATE_ONLY = /^(?:\d{4}-\d{2}-\d{2}|\d{1,2}[./]\d{1,2}[./]\d{4})$/;

const FORMS = "2026-03-01T06:00:00Z (ISO 8601 with a zone), 2026-03-01 06:00, 01.03.2026 06:00 or 03/01/2026 06:00";

const MONTH_NAMES = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Gregorian leap years: every fourth year, except centuries not divisible by 400. */
function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** Minutes east of UTC for "Z", "+01:00" or "-0500". */
function offsetMinutes(zone: string): number {
  if (zone.toUpperCase() === "Z") return 0;
  const sign = zone.startsWith("-") ? -1 : 1;
  const digits = zone.slice(1).replace(":", "");
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4)));
}

interface Parts {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly time: readonly (string | undefined)[];
}

/** Milliseconds for a wall-clock reading at a UTC offset or in a zone, or the reason it is not a real time. */
function toMilliseconds(text: string, parts: Parts, zone: string | TLocalTimeReader): TTimestampResult {
  const [hourText, minuteText, secondText, fractionText] = parts.time;
  const hour = Number(hourText);
  const minute = Number(minuteText);
  const second = Number(secondText ?? "0");
  const { year, month, day } = parts;
  if (month < 1 || month > 12) return { ok: false, message: `"${text}" has month ${month}: months run from 1 to 12` };
  const daysInMonth = month === 2 && isLeapYear(year) ? 29 : (DAYS_IN_MONTH[month - 1] ?? 31);
  if (day < 1 || day > daysInMonth) {
    return { ok: false, message: `"${text}" names day ${day} of ${MONTH_NAMES[month - 1]} ${year}, which has ${daysInMonth} days` };
  }
  if (hour > 23 || minute > 59 || second > 59) return { ok: false, message: `"${text}" is not a time of day (hours 00-23, minutes and seconds 00-59)` };
  const fraction = fractionText === undefined ? 0 : Number(`0.${fractionText}`) * 1000;
  const wall = utcMilliseconds(year, month, day) + ((hour * 60 + minute) * 60 + second) * 1000 + Math.round(fraction);
  if (typeof zone !== "string") return zone(wall, text);
  const offset = offsetMinutes(zone);
  if (Math.abs(offset) > 14 * 60) return { ok: false, message: `"${text}" has the offset ${zone}, outside -12:00 to +14:00` };
  return { ok: true, milliseconds: wall - offset * MINUTE };
}

/** Milliseconds at 00:00 UTC of a calendar day. `Date.UTC` would read years 0-99 as 1900-1999. */
function utcMilliseconds(year: number, month: number, day: number): number {
  const date = new Date(0);
  date.setUTCFullYear(year, month - 1, day);
  return date.getTime();
}

function noZone(text: string): TTimestampResult {
  return {
    ok: false,
    message: `"${text}" has no time zone: state the UTC offset the file's times are written in (e.g. +01:00) or read them in the site's time zone, or write ISO 8601 with a zone`,
  };
}

function slashOrderProblem(text: string, first: number, second: number): string {
  if (first > 12 && second <= 12) return `"${text}" is a slash date; it can only be day-first here, but the order is not stated: choose day-first for this file`;
  if (second > 12 && first <= 12) return `"${text}" is a slash date; it can only be month-first here, but the order is not stated: choose month-first for this file`;
  return `"${text}" is ambiguous: it reads as ${first} ${MONTH_NAMES[second - 1] ?? "?"} (day first) or ${MONTH_NAMES[first - 1] ?? "?"} ${second} (month first); choose the day/month order for this file`;
}

/**
 * Times without a zone as wall-clock time in `zone`. A repeated time takes the earlier of its two instants
 * that is not before `previous()`, the time of the previous row read.
 */
function zoneReader(zone: string, previous: () => number): TLocalTimeReader {
  const readWallClock = createWallClockReader(zone);
  return (wall, text) => {
    const reading = readWallClock(wall);
    if (reading.kind === "exact") return { ok: true, milliseconds: wall - reading.offset * MINUTE };
    if (reading.kind === "skipped") return { ok: false, message: `"${text}" ${reading.problem}` };
    const [earlier, later] = reading.offsets.map((offset) => wall - offset * MINUTE) as [number, number];
    const after = previous();
    if (earlier >= after) return { ok: true, milliseconds: earlier };
    if (later >= after) return { ok: true, milliseconds: later };
    const iso = (milliseconds: number) => new Date(milliseconds).toISOString();
    return {
      ok: false,
      message: `"${text}" ${reading.problem}, and both its times (${iso(earlier)} and ${iso(later)}) are before the previous row's ${iso(after)}: rows must be in time order`,
    };
  };
}

const NO_PREVIOUS_ROW = () => -Infinity;

/** How `reading` reads times without a zone; a repeated time in a zone takes its earlier instant. */
function zonelessOf(reading: TTimestampReading): TZoneless {
  return reading.utcOffset ?? (reading.zone === undefined ? undefined : zoneReader(reading.zone, NO_PREVIOUS_ROW));
}

/** One cell on its own: a repeated wall-clock time takes its earlier instant (there is no previous row). */
export function readTimestamp(text: string, reading: TTimestampReading): TTimestampResult {
  return readCell(text, reading, zonelessOf(reading));
}

function readCell(text: string, reading: TTimestampReading, zoneless: TZoneless): TTimestampResult {
  const iso = ISO.exec(text);
  if (iso !== null) {
    const zone = iso[8] ?? zoneless;
    if (zone === undefined) return noZone(text);
    return toMilliseconds(text, { year: Number(iso[1]), month: Number(iso[2]), day: Number(iso[3]), time: iso.slice(4, 8) }, zone);
  }
  const dotted = DOTTED.exec(text);
  if (dotted !== null) {
    if (zoneless === undefined) return noZone(text);
    return toMilliseconds(text, { day: Number(dotted[1]), month: Number(dotted[2]), year: Number(dotted[3]), time: dotted.slice(4, 8) }, zoneless);
  }
  const slashed = SLASHED.exec(text);
  if (slashed !== null) {
    const first = Number(slashed[1]);
    const second = Number(slashed[2]);
    if (reading.dayMonthOrder === undefined) return { ok: false, message: slashOrderProblem(text, first, second) };
    if (zoneless === undefined) return noZone(text);
    const [day, month] = reading.dayMonthOrder === "day-first" ? [first, second] : [second, first];
    return toMilliseconds(text, { day, month, year: Number(slashed[3]), time: slashed.slice(4, 8) }, zoneless);
  }
  if (text === "") return { ok: false, message: "is empty: a timestamp is required" };
  if (DATE_ONLY.test(text)) return { ok: false, message: `"${text}" is a date without a time of day: write the time too, e.g. ${FORMS}` };
  return { ok: false, message: `"${text}" is not a timestamp in a known form: write e.g. ${FORMS}` };
}

/** The number written by `count` ASCII digits from `start`, or -1 if any of them is not a digit. */
function digitsAt(text: string, start: number, count: number): number {
  let value = 0;
  for (let index = start; index < start + count; index += 1) {
    const digit = text.charCodeAt(index) - 48;
    if (digit < 0 || digit > 9) return -1;
    value = value * 10 + digit;
  }
  return value;
}

const HYPHEN = 45;
const COLON = 58;
const DOT = 46;
const LETTER_T = 84;
const LETTER_Z = 90;

/**
 * `readTimestamp` for one file, with a fast path for the form most files carry: UTC as `toISOString`
 * writes it, "2026-03-01T06:00:00Z" or "2026-03-01T06:00:00.250Z". The date part is checked once per day
 * (rows in time order mostly share the previous row's day) and the time of day is read from character
 * codes, instead of a regular expression with eight groups per cell. Any text the fast path does not accept
 * whole, valid or not, goes to `readTimestamp`, which gives the same result for what the fast path accepts
 * (property test in test/unit/imports/timestamps.test.ts) and every message. Times in a zone are read
 * with one zone reading per wall-clock hour (createWallClockReader) against the previous row's time.
 */
export function createTimestampReader(reading: TTimestampReading): (text: string) => TTimestampResult {
  let datePart = "";
  let dayStart = 0;

  function fast(text: string): number | undefined {
    const length = text.length;
    if ((length !== 20 && length !== 24) || text.charCodeAt(length - 1) !== LETTER_Z) return undefined;
    if (datePart === "" || !text.startsWith(datePart)) {
      if (text.charCodeAt(4) !== HYPHEN || text.charCodeAt(7) !== HYPHEN || text.charCodeAt(10) !== LETTER_T) return undefined;
      const year = digitsAt(text, 0, 4);
      const month = digitsAt(text, 5, 2);
      const day = digitsAt(text, 8, 2);
      if (year < 0 || month < 1 || month > 12 || day < 1) return undefined;
      if (day > (month === 2 && isLeapYear(year) ? 29 : (DAYS_IN_MONTH[month - 1] as number))) return undefined;
      datePart = text.slice(0, 11);
      dayStart = utcMilliseconds(year, month, day);
    }
    if (text.charCodeAt(13) !== COLON || text.charCodeAt(16) !== COLON) return undefined;
    const hour = digitsAt(text, 11, 2);
    const minute = digitsAt(text, 14, 2);
    const second = digitsAt(text, 17, 2);
    const millisecond = length === 24 && text.charCodeAt(19) === DOT ? digitsAt(text, 20, 3) : length === 20 ? 0 : -1;
    if (hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59 || millisecond < 0) return undefined;
    return dayStart + ((hour * 60 + minute) * 60 + second) * 1000 + millisecond;
  }

  if (reading.zone === undefined || reading.utcOffset !== undefined) {
    const zoneless = reading.utcOffset;
    return (text) => {
      const milliseconds = fast(text);
      return milliseconds === undefined ? readCell(text, reading, zoneless) : { ok: true, milliseconds };
    };
  }
  let previous = -Infinity;
  const inZone = zoneReader(reading.zone, () => previous);
  return (text) => {
    const milliseconds = fast(text);
    const result = milliseconds === undefined ? readCell(text, reading, inZone) : ({ ok: true, milliseconds } as const);
    if (result.ok) previous = result.milliseconds;
    return result;
  };
}
