// The import's fast formatter of stored times against the Date-based one it replaces (property tests over
// random instants, in time order and in any order), and the stored form itself.
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { createStoredTimeFormatter, storedTime, storedTimeOf } from "@/src/db/stored-time";

// The range of times a JavaScript Date can hold: ±8.64e15 ms around the epoch (ECMA-262, "Time Values
// and Time Range").
const DATE_RANGE = 8.64e15;

describe("stored times", () => {
  test("are ISO 8601 UTC with milliseconds and +00:00, as Prisma writes them to SQLite", () => {
    expect(storedTime("2026-03-01T06:00:00.000Z")).toBe("2026-03-01T06:00:00.000+00:00");
    expect(storedTimeOf(Date.UTC(2026, 2, 1, 6, 0, 0, 250))).toBe("2026-03-01T06:00:00.250+00:00");
  });

  test("the formatter equals storedTimeOf at any instant, in any order", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -DATE_RANGE, max: DATE_RANGE }), { minLength: 1, maxLength: 50 }), (times) => {
        const format = createStoredTimeFormatter();
        for (const time of times) expect(format(time)).toBe(storedTimeOf(time));
      }),
    );
  });

  test("the formatter equals storedTimeOf over a run of close times crossing midnights and a leap day", () => {
    fc.assert(
      fc.property(fc.integer({ min: Date.UTC(2028, 1, 27), max: Date.UTC(2028, 2, 2) }), fc.array(fc.integer({ min: 0, max: 7_200_000 }), { maxLength: 200 }), (start, steps) => {
        const format = createStoredTimeFormatter();
        let time = start;
        for (const step of steps) {
          time += step;
          expect(format(time)).toBe(storedTimeOf(time));
        }
      }),
    );
  });

  test("the edges of a day and of the year range", () => {
    const format = createStoredTimeFormatter();
    for (const time of [0, -1, 86_399_999, 86_400_000, Date.UTC(9999, 11, 31, 23, 59, 59, 999), -62_167_219_200_000, -62_167_219_200_001, 0.5]) {
      expect(format(time)).toBe(storedTimeOf(time));
    }
  });
});
