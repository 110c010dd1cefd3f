// Times without a zone read as wall-clock time in the site's zone: the clock-change rules of the import
// (a skipped time is a row problem; a repeated time takes the earlier of its instants not before the
// previous row's), and the per-hour reading cache against the reading of each time on its own.
//
// Outside reference (from memory): Directive 2000/84/EC of the European Parliament and of the Council,
// Articles 1 and 2: summer time begins at 01:00 UTC on the last Sunday of March and ends at 01:00 UTC on
// the last Sunday of October, at the same instant in every member state (Vienna: CET +01:00 / CEST +02:00);
// the United Kingdom keeps the same instants (Summer Time Order 2002: GMT +00:00 / BST +01:00). In 2026
// those Sundays are 29 March and 25 October. Lord Howe Island (Australia/Lord_Howe) moves its clocks by
// 30 minutes, +10:30 / +11:00, at 02:00 local time (from memory), so its changes fall inside clock hours.
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { createTimestampReader, readTimestamp, type TTimestampResult } from "@/src/imports/timestamps";
import { createWallClockReader, readWallClock, wallClockText } from "@/src/time/local-time";

const SPRING_2026 = Date.parse("2026-03-29T01:00:00Z");
const AUTUMN_2026 = Date.parse("2026-10-25T01:00:00Z");
const MINUTE = 60_000;

/** Minutes ahead of UTC at `instant` under the EU rule, for 2026, from the directive (not from Intl). */
function euOffset(instant: number, winterMinutes: number): number {
  return instant >= SPRING_2026 && instant < AUTUMN_2026 ? winterMinutes + 60 : winterMinutes;
}

/** The wall-clock text "2026-10-25 01:30:00" a clock at `offset` minutes shows at `instant`. */
function clockText(instant: number, offset: number): string {
  return new Date(instant + offset * MINUTE).toISOString().slice(0, 19).replace("T", " ");
}

/** Reads `texts` in order as the rows of one file in `zone`. */
function readFile(zone: string, texts: readonly string[]): TTimestampResult[] {
  const read = createTimestampReader({ zone });
  return texts.map((text) => read(text));
}

const instant = (iso: string): TTimestampResult => ({ ok: true, milliseconds: Date.parse(iso) });

describe("a skipped time (spring) is a row problem naming the jump", () => {
  test.each([
    { zone: "Europe/London", before: "2026-03-29 00:59", skipped: "2026-03-29 01:30", after: "2026-03-29 02:00", jump: "from 01:00 to 02:00" },
    { zone: "Europe/Vienna", before: "29.03.2026 01:59:59", skipped: "29.03.2026 02:30", after: "29.03.2026 03:00", jump: "from 02:00 to 03:00" },
  ])("$zone: $skipped", ({ zone, before, skipped, after, jump }) => {
    expect(readFile(zone, [before, skipped, after])).toEqual([
      instant(zone === "Europe/London" ? "2026-03-29T00:59:00Z" : "2026-03-29T00:59:59Z"),
      { ok: false, message: `"${skipped}" does not exist in ${zone}: the clocks jump ${jump} on 29 Mar 2026` },
      instant("2026-03-29T01:00:00Z"),
    ]);
  });
});

describe("a repeated time (autumn) takes the earlier instant not before the previous row's", () => {
  test("Europe/London: 01:30, 01:45 (first), 01:15, 01:30 (second), 02:00", () => {
    const texts = ["2026-10-25 00:59", "2026-10-25 01:30", "2026-10-25 01:45", "2026-10-25 01:15", "2026-10-25 01:30", "2026-10-25 02:00"];
    expect(readFile("Europe/London", texts)).toEqual(
      ["2026-10-24T23:59:00Z", "2026-10-25T00:30:00Z", "2026-10-25T00:45:00Z", "2026-10-25T01:15:00Z", "2026-10-25T01:30:00Z", "2026-10-25T02:00:00Z"].map(instant),
    );
  });

  test("Europe/Vienna: 02:30, 02:59 (first), 02:00, 02:30 (second), 03:00; equal times stay together", () => {
    const texts = ["25.10.2026 02:30", "25.10.2026 02:59", "25.10.2026 02:59", "25.10.2026 02:00", "25.10.2026 02:30", "25.10.2026 03:00"];
    expect(readFile("Europe/Vienna", texts)).toEqual(
      ["2026-10-25T00:30:00Z", "2026-10-25T00:59:00Z", "2026-10-25T00:59:00Z", "2026-10-25T01:00:00Z", "2026-10-25T01:30:00Z", "2026-10-25T02:00:00Z"].map(instant),
    );
  });

  test("a cell with a zone counts as the previous row too", () => {
    expect(readFile("Europe/London", ["2026-10-25T01:20:00Z", "2026-10-25 01:30"])).toEqual(["2026-10-25T01:20:00Z", "2026-10-25T01:30:00Z"].map(instant));
  });

  test("when both instants are before the previous row's, the row is refused with both named", () => {
    const [, , refused] = readFile("Europe/London", ["2026-10-25 01:15", "2026-10-25 02:10", "2026-10-25 01:30"]);
    expect(refused).toEqual({
      ok: false,
      message:
        '"2026-10-25 01:30" happens twice in Europe/London on 25 Oct 2026: the clocks go back from 02:00 to 01:00, and both its times ' +
        "(2026-10-25T00:30:00.000Z and 2026-10-25T01:30:00.000Z) are before the previous row's 2026-10-25T02:10:00.000Z: rows must be in time order",
    });
  });

  test("a cell read on its own takes the earlier instant", () => {
    expect(readTimestamp("2026-10-25 01:30", { zone: "Europe/London" })).toEqual(instant("2026-10-25T00:30:00Z"));
  });
});

describe("everything else converts exactly", () => {
  test.each([
    { zone: "Europe/London", winter: 0 },
    { zone: "Europe/Vienna", winter: 60 },
  ])("every 7th minute of 2026 on a $zone clock, as one file in time order, reads back to its instant", ({ zone, winter }) => {
    const read = createTimestampReader({ zone });
    const start = Date.parse("2026-01-01T00:00:00Z");
    const end = Date.parse("2027-01-01T00:00:00Z");
    let rows = 0;
    for (let time = start; time < end; time += 7 * MINUTE) {
      const text = clockText(time, euOffset(time, winter));
      const result = read(text);
      if (!result.ok || result.milliseconds !== time) throw new Error(`${text} read as ${JSON.stringify(result)}, not ${new Date(time).toISOString()}`);
      rows += 1;
    }
    expect(rows).toBe(Math.ceil((end - start) / (7 * MINUTE)));
  });

  test("UTC: a year of times every 7th minute reads back unchanged", () => {
    const read = createTimestampReader({ zone: "UTC" });
    for (let time = Date.parse("2026-01-01T00:00:00Z"); time < Date.parse("2027-01-01T00:00:00Z"); time += 7 * MINUTE) {
      const result = read(clockText(time, 0));
      if (!result.ok || result.milliseconds !== time) throw new Error(`${clockText(time, 0)} read as ${JSON.stringify(result)}`);
    }
  });

  test.each([
    { change: "2026-04-05T02:00:00+11:00", direction: "back" },
    { change: "2026-10-04T02:00:00+10:30", direction: "forward" },
  ])("half-hour changes inside clock hours (Lord Howe, $direction): every minute of two days around it reads back", ({ change }) => {
    const zone = "Australia/Lord_Howe";
    const read = createTimestampReader({ zone });
    for (let time = Date.parse(change) - 86_400_000; time < Date.parse(change) + 86_400_000; time += MINUTE) {
      // The wall-clock text from Intl here: the zone's rules are not restated in the test.
      const text = `${wallClockText(new Date(time), zone)}:00`;
      const result = read(text);
      if (!result.ok || result.milliseconds !== time) throw new Error(`${text} read as ${JSON.stringify(result)}, not ${new Date(time).toISOString()}`);
    }
  });

  test("the per-hour reading equals the reading of each time on its own, in any order", () => {
    // Wall-clock readings (written as UTC) at which each zone's clocks change in 2026; India has none.
    const changes = [
      ["Europe/London", "2026-03-29T01:00Z"],
      ["Europe/London", "2026-10-25T01:00Z"],
      ["Europe/Vienna", "2026-03-29T02:00Z"],
      ["Europe/Vienna", "2026-10-25T02:00Z"],
      ["America/New_York", "2026-03-08T02:00Z"],
      ["America/New_York", "2026-11-01T01:00Z"],
      ["Australia/Lord_Howe", "2026-04-05T01:30Z"],
      ["Australia/Lord_Howe", "2026-10-04T02:00Z"],
      ["Asia/Kolkata", "2026-10-25T02:00Z"],
    ] as const;
    fc.assert(
      fc.property(fc.constantFrom(...changes), fc.array(fc.integer({ min: -150, max: 150 }), { minLength: 1, maxLength: 30 }), ([zone, change], minutes) => {
        const read = createWallClockReader(zone);
        for (const wall of minutes.map((minute) => Date.parse(change) + minute * MINUTE)) expect(read(wall)).toEqual(readWallClock(wall, zone));
      }),
      { numRuns: 200 },
    );
  });
});
