// Reading timestamp cells: the per-file reader's fast path against the general reader, and both against
// the JavaScript Date parser for the ISO 8601 form ECMA-262 defines ("Date Time String Format",
// YYYY-MM-DDTHH:mm:ss.sssZ), which is an independent implementation of the same calendar arithmetic.
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { createTimestampReader, readTimestamp } from "@/src/imports/timestamps";

const pad = (value: number, width: number) => String(value).padStart(width, "0");

/** Texts in the fast path's shape, with fields that may be out of range (month 13, hour 24, 31 April). */
const isoLike = fc
  .record({
    year: fc.integer({ min: 0, max: 9999 }),
    month: fc.integer({ min: 0, max: 13 }),
    day: fc.integer({ min: 0, max: 32 }),
    hour: fc.integer({ min: 0, max: 25 }),
    minute: fc.integer({ min: 0, max: 61 }),
    second: fc.integer({ min: 0, max: 61 }),
    millisecond: fc.option(fc.integer({ min: 0, max: 999 })),
    separator: fc.constantFrom("T", "T", "T", " ", "t"),
    zone: fc.constantFrom("Z", "Z", "Z", "z", "+01:00", ""),
  })
  .map(
    ({ year, month, day, hour, minute, second, millisecond, separator, zone }) =>
      `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}${separator}${pad(hour, 2)}:${pad(minute, 2)}:${pad(second, 2)}${millisecond === null ? "" : `.${pad(millisecond, 3)}`}${zone}`,
  );

describe("timestamp cells", () => {
  test("the per-file reader gives what readTimestamp gives, for any text of the ISO shape, in any order", () => {
    fc.assert(
      fc.property(fc.array(isoLike, { minLength: 1, maxLength: 40 }), (texts) => {
        const read = createTimestampReader({});
        for (const text of texts) expect(read(text)).toEqual(readTimestamp(text, {}));
      }),
      { numRuns: 500 },
    );
  });

  test("a run of times on one day and across midnight and a leap day reads as the Date parser reads it", () => {
    const read = createTimestampReader({});
    let time = Date.UTC(2028, 1, 28, 23, 0, 0);
    for (let step = 0; step < 200; step += 1) {
      time += 37_123;
      const text = new Date(time).toISOString();
      expect(read(text)).toEqual({ ok: true, milliseconds: Date.parse(text) });
      expect(read(text.replace(/\.\d{3}Z$/, "Z"))).toEqual({ ok: true, milliseconds: Math.floor(time / 1000) * 1000 });
    }
  });

  test("years before 100 are not read as 19xx", () => {
    // Date.UTC maps years 0-99 to 1900-1999 (ECMA-262, MakeFullYear); the Date parser does not.
    for (const text of ["0050-03-01T06:00:00Z", "0000-01-01T00:00:00.000Z", "0099-12-31T23:59:59.999Z"]) {
      expect(createTimestampReader({})(text)).toEqual({ ok: true, milliseconds: Date.parse(text) });
      expect(readTimestamp(text, {})).toEqual({ ok: true, milliseconds: Date.parse(text) });
    }
  });

  test("impossible dates and times are refused with the general reader's message", () => {
    const read = createTimestampReader({});
    expect(read("2026-03-01T06:00:00Z")).toEqual({ ok: true, milliseconds: Date.parse("2026-03-01T06:00:00Z") });
    expect(read("2026-04-31T06:00:00Z")).toEqual({ ok: false, message: '"2026-04-31T06:00:00Z" names day 31 of April 2026, which has 30 days' });
    expect(read("2026-02-29T06:00:00Z")).toMatchObject({ ok: false });
    expect(read("2026-03-01T24:00:00Z")).toEqual({ ok: false, message: '"2026-03-01T24:00:00Z" is not a time of day (hours 00-23, minutes and seconds 00-59)' });
    expect(read("2026-03-01T06:00:60Z")).toMatchObject({ ok: false });
  });
});
