// Times in the plant's zone: display with the zone's name, and typed wall-clock times turned into instants,
// around both summer-time changes.
//
// Outside references (all from memory):
// - EU: Directive 2000/84/EC of the European Parliament and of the Council, Articles 1 and 2: summer time
//   begins at 01:00 UTC on the last Sunday of March and ends at 01:00 UTC on the last Sunday of October,
//   in every member state at the same instant (Vienna: CET +01:00 / CEST +02:00). The United Kingdom keeps
//   the same instants (Summer Time Order 2002): GMT +00:00 / BST +01:00.
// - USA: Energy Policy Act of 2005, section 110: daylight time from 02:00 local on the second Sunday of March
//   to 02:00 local on the first Sunday of November (New York: -05:00 / -04:00).
// - New South Wales: daylight time from 02:00 standard time on the first Sunday of October to 03:00
//   daylight time on the first Sunday of April (Sydney: +10:00 / +11:00).
// - India keeps +05:30 all year.
// The 2026 dates were worked out from these rules (29 Mar and 25 Oct 2026 are the last Sundays of those
// months, 8 Mar and 1 Nov 2026 the US Sundays, 5 Apr and 4 Oct 2026 the NSW ones); the test below checks the
// EU rule itself against Intl for 2024-2030. Intl applies the IANA tz database as the runtime's ICU holds it.
import { describe, expect, test } from "vitest";
import { formatTime, zoneNameAt } from "@/src/components/format";
import { formatOffset, offsetMinutesAt, resolveLocalTime, wallClockText } from "@/src/time/local-time";
import { withTimeProblem, zonedTimeField } from "@/app/characteristics/setup-fields";
import { TIME_ZONES, ZLocalDateTime, ZTimeZone } from "@/shared/intake";
import { DEMO_SITE_ZONE } from "@/src/demo/plant";

const at = (iso: string) => Date.parse(iso);

/** The last Sunday of a month at 01:00 UTC, by plain calendar arithmetic: the EU change instant. */
function lastSundayAtOneUtc(year: number, monthIndex: number): number {
  const lastDay = new Date(Date.UTC(year, monthIndex + 1, 0, 1));
  return lastDay.getTime() - lastDay.getUTCDay() * 86_400_000;
}

describe("formatTime", () => {
  test.each([
    { zone: "UTC", iso: "2026-06-01T14:05:00Z", shown: "1 Jun 2026, 14:05 UTC" },
    { zone: "Europe/Vienna", iso: "2026-06-01T14:05:00Z", shown: "1 Jun 2026, 16:05 CEST" },
    { zone: "Europe/Vienna", iso: "2026-01-15T14:05:00Z", shown: "15 Jan 2026, 15:05 CET" },
    { zone: "Europe/London", iso: "2026-06-01T14:05:00Z", shown: "1 Jun 2026, 15:05 BST" },
    { zone: "Asia/Kolkata", iso: "2026-06-01T14:05:00Z", shown: "1 Jun 2026, 19:35 GMT+5:30" },
    // Spring, EU: the last minute of winter time and the first of summer time, one minute apart.
    { zone: "Europe/Vienna", iso: "2026-03-29T00:59:00Z", shown: "29 Mar 2026, 01:59 CET" },
    { zone: "Europe/Vienna", iso: "2026-03-29T01:00:00Z", shown: "29 Mar 2026, 03:00 CEST" },
    // Autumn, EU: 02:30 is shown twice, an hour apart, told apart by the zone name.
    { zone: "Europe/Vienna", iso: "2026-10-25T00:30:00Z", shown: "25 Oct 2026, 02:30 CEST" },
    { zone: "Europe/Vienna", iso: "2026-10-25T01:30:00Z", shown: "25 Oct 2026, 02:30 CET" },
    { zone: "Europe/London", iso: "2026-03-29T00:59:00Z", shown: "29 Mar 2026, 00:59 GMT" },
    { zone: "Europe/London", iso: "2026-03-29T01:00:00Z", shown: "29 Mar 2026, 02:00 BST" },
    // US rule: 02:00 local in March becomes 03:00 (07:00 UTC).
    { zone: "America/New_York", iso: "2026-03-08T06:59:00Z", shown: "8 Mar 2026, 01:59 GMT-5" },
    { zone: "America/New_York", iso: "2026-03-08T07:00:00Z", shown: "8 Mar 2026, 03:00 GMT-4" },
  ])("$iso in $zone is $shown", ({ zone, iso, shown }) => {
    expect(formatTime(iso, zone)).toBe(shown);
  });

  test("zoneNameAt names the zone as formatTime shows it", () => {
    expect(zoneNameAt(new Date("2026-10-25T00:30:00Z"), "Europe/Vienna")).toBe("CEST");
    expect(zoneNameAt(new Date("2026-10-25T01:30:00Z"), "Europe/Vienna")).toBe("CET");
  });
});

describe("offsets", () => {
  test("Intl changes the EU offsets at 01:00 UTC on the last Sundays of March and October, 2024-2030", () => {
    for (let year = 2024; year <= 2030; year += 1) {
      const spring = lastSundayAtOneUtc(year, 2);
      const autumn = lastSundayAtOneUtc(year, 9);
      for (const [zone, winter] of [["Europe/Vienna", 60], ["Europe/London", 0], ["Europe/Lisbon", 0]] as const) {
        expect([offsetMinutesAt(spring - 1000, zone), offsetMinutesAt(spring, zone)], `${zone} spring ${year}`).toEqual([winter, winter + 60]);
        expect([offsetMinutesAt(autumn - 1000, zone), offsetMinutesAt(autumn, zone)], `${zone} autumn ${year}`).toEqual([winter + 60, winter]);
      }
    }
  });

  test("formatOffset writes ISO 8601 offsets, half and quarter hours included", () => {
    expect([120, 0, -300, 330, 345, -570].map(formatOffset)).toEqual(["+02:00", "+00:00", "-05:00", "+05:30", "+05:45", "-09:30"]);
    expect(offsetMinutesAt(at("2026-06-01T00:00:00Z"), "Asia/Kathmandu")).toBe(345);
  });

  test("wallClockText gives the datetime-local text of an instant in the zone", () => {
    expect(wallClockText(new Date("2026-06-01T14:05:59Z"), "Europe/Vienna")).toBe("2026-06-01T16:05");
    expect(wallClockText(new Date("2026-12-31T23:30:00Z"), "Europe/Vienna")).toBe("2027-01-01T00:30");
    expect(wallClockText(new Date("2026-06-01T14:05:00Z"), "America/New_York")).toBe("2026-06-01T10:05");
  });
});

describe("resolveLocalTime", () => {
  test.each([
    { zone: "Europe/Vienna", local: "2026-06-01T16:05", utc: "2026-06-01T14:05:00.000Z" },
    { zone: "Europe/Vienna", local: "2026-03-29T01:59", utc: "2026-03-29T00:59:00.000Z" },
    { zone: "Europe/Vienna", local: "2026-03-29T03:00", utc: "2026-03-29T01:00:00.000Z" },
    { zone: "Europe/Vienna", local: "2026-10-25T01:59:30", utc: "2026-10-24T23:59:30.000Z" },
    { zone: "Europe/Vienna", local: "2026-10-25T03:00", utc: "2026-10-25T02:00:00.000Z" },
    { zone: "Asia/Kolkata", local: "2026-06-01T19:35", utc: "2026-06-01T14:05:00.000Z" },
    { zone: "UTC", local: "2026-03-29T02:30", utc: "2026-03-29T02:30:00.000Z" },
  ])("$local in $zone is $utc", ({ zone, local, utc }) => {
    const resolved = resolveLocalTime(local, zone);
    expect(resolved.kind === "exact" && resolved.instant.toISOString()).toBe(utc);
  });

  test.each([
    { zone: "Europe/Vienna", local: "2026-03-29T02:30", from: "02:00", to: "03:00", day: "29 Mar 2026" },
    { zone: "Europe/London", local: "2026-03-29T01:30", from: "01:00", to: "02:00", day: "29 Mar 2026" },
    { zone: "America/New_York", local: "2026-03-08T02:30", from: "02:00", to: "03:00", day: "8 Mar 2026" },
    { zone: "Australia/Sydney", local: "2026-10-04T02:30", from: "02:00", to: "03:00", day: "4 Oct 2026" },
  ])("$local in $zone is skipped by the spring change and refused", ({ zone, local, from, to, day }) => {
    expect(resolveLocalTime(local, zone)).toEqual({
      kind: "skipped",
      problem: `does not exist in ${zone}: the clocks jump from ${from} to ${to} on ${day}. Enter the time the clock showed after the jump.`,
    });
    // A chosen offset does not make a skipped time valid.
    expect(resolveLocalTime(local, zone, "+01:00").kind).toBe("skipped");
  });

  test("a time shown twice in autumn is refused until one of its two offsets is chosen (Vienna)", () => {
    expect(resolveLocalTime("2026-10-25T02:30", "Europe/Vienna")).toEqual({
      kind: "repeated",
      problem: "happens twice in Europe/Vienna on 25 Oct 2026: the clocks go back from 03:00 to 02:00. Choose which 02:30 you mean.",
      choices: [
        { offset: "+02:00", label: "02:30 CEST (UTC+02:00), the first time" },
        { offset: "+01:00", label: "02:30 CET (UTC+01:00), the second time" },
      ],
    });
    const first = resolveLocalTime("2026-10-25T02:30", "Europe/Vienna", "+02:00");
    const second = resolveLocalTime("2026-10-25T02:30", "Europe/Vienna", "+01:00");
    expect(first.kind === "exact" && first.instant.toISOString()).toBe("2026-10-25T00:30:00.000Z");
    expect(second.kind === "exact" && second.instant.toISOString()).toBe("2026-10-25T01:30:00.000Z");
    // An offset that is neither reading answers with the choices again.
    expect(resolveLocalTime("2026-10-25T02:30", "Europe/Vienna", "+05:00").kind).toBe("repeated");
  });

  test.each([
    { zone: "America/New_York", local: "2026-11-01T01:30", from: "02:00", to: "01:00", offsets: ["-04:00", "-05:00"] },
    { zone: "Australia/Sydney", local: "2026-04-05T02:30", from: "03:00", to: "02:00", offsets: ["+11:00", "+10:00"] },
    { zone: "Europe/London", local: "2026-10-25T01:30", from: "02:00", to: "01:00", offsets: ["+01:00", "+00:00"] },
  ])("$local in $zone is shown twice: clocks back from $from to $to", ({ zone, local, from, to, offsets }) => {
    const resolved = resolveLocalTime(local, zone);
    expect(resolved.kind).toBe("repeated");
    if (resolved.kind !== "repeated") return;
    expect(resolved.problem).toContain(`the clocks go back from ${from} to ${to}`);
    expect(resolved.choices.map((choice) => choice.offset)).toEqual(offsets);
  });

  test("a chosen offset is ignored where the zone decides alone", () => {
    const resolved = resolveLocalTime("2026-06-01T16:05", "Europe/Vienna", "+01:00");
    expect(resolved.kind === "exact" && resolved.instant.toISOString()).toBe("2026-06-01T14:05:00.000Z");
  });

  test("every hour of 2026 in Vienna reads back from its wall-clock text and offset; exactly one wall-clock hour repeats and one is missing", () => {
    const start = at("2026-01-01T00:00:00Z");
    const texts = new Map<string, number>();
    for (let hour = 0; hour < 365 * 24; hour += 1) {
      const instant = start + hour * 3_600_000;
      const text = wallClockText(new Date(instant), "Europe/Vienna");
      texts.set(text, (texts.get(text) ?? 0) + 1);
      const resolved = resolveLocalTime(text, "Europe/Vienna", formatOffset(offsetMinutesAt(instant, "Europe/Vienna")));
      if (resolved.kind !== "exact" || resolved.instant.getTime() !== instant) throw new Error(`hour ${hour} (${text}) read back as ${JSON.stringify(resolved)}`);
    }
    expect([...texts].filter(([, count]) => count > 1)).toEqual([["2026-10-25T02:00", 2]]);
    expect(texts.has("2026-03-29T02:00")).toBe(false);
  });
});

describe("zone and wall-clock inputs", () => {
  test("known zones and UTC pass; other text is refused with the reason", () => {
    expect(TIME_ZONES[0]).toBe("UTC");
    expect(ZTimeZone.parse(" Europe/Vienna ")).toBe("Europe/Vienna");
    expect(ZTimeZone.parse("UTC")).toBe("UTC");
    expect(ZTimeZone.parse(DEMO_SITE_ZONE)).toBe("Europe/London");
    for (const wrong of ["Europe/Atlantis", "CEST", "+02:00", "", "europe/vienna"]) {
      expect(ZTimeZone.safeParse(wrong).error?.issues[0]?.message).toBe('must be an IANA time zone name such as "Europe/London", or "UTC"');
    }
  });

  test("wall-clock times must have a calendar day and hour", () => {
    expect(ZLocalDateTime.parse("2026-03-01T06:00")).toBe("2026-03-01T06:00");
    expect(ZLocalDateTime.parse("2026-03-01T06:00:30")).toBe("2026-03-01T06:00:30");
    expect(ZLocalDateTime.safeParse("2026-03-01T06:00Z").error?.issues[0]?.message).toBe("must be a date and time such as 2026-03-01T06:00");
    expect(ZLocalDateTime.safeParse("1 March").error?.issues[0]?.message).toBe("must be a date and time such as 2026-03-01T06:00");
    for (const impossible of ["2026-02-29T06:00", "2026-04-31T06:00", "2026-03-01T24:00", "2026-03-01T06:60"]) {
      expect(ZLocalDateTime.safeParse(impossible).error?.issues[0]?.message).toBe("is not a date and time on the calendar");
    }
  });
});

describe("a form's zoned time field", () => {
  const form = (fields: Record<string, string>) => {
    const data = new FormData();
    for (const [name, value] of Object.entries(fields)) data.set(name, value);
    return data;
  };

  test("a wall-clock time becomes the UTC instant the schema reads", () => {
    expect(zonedTimeField(form({ timestamp: "2026-06-01T16:05" }), "timestamp", "Europe/Vienna")).toEqual({ value: "2026-06-01T14:05:00.000Z" });
    expect(zonedTimeField(form({}), "timestamp", "Europe/Vienna")).toEqual({ value: undefined });
  });

  test("a skipped time is the field's problem, replacing the schema's word on the same field", () => {
    const time = zonedTimeField(form({ occurredAt: "2026-03-29T02:30" }), "occurredAt", "Europe/Vienna");
    expect(withTimeProblem(time, [{ path: "occurredAt", message: "is required" }, { path: "kind", message: "is not valid" }])).toEqual({
      issues: [
        {
          path: "occurredAt",
          message: "does not exist in Europe/Vienna: the clocks jump from 02:00 to 03:00 on 29 Mar 2026. Enter the time the clock showed after the jump.",
        },
        { path: "kind", message: "is not valid" },
      ],
    });
  });

  test("a repeated time offers its two readings until one comes back as <name>.offset", () => {
    const refused = withTimeProblem(zonedTimeField(form({ timestamp: "2026-10-25T02:30" }), "timestamp", "Europe/Vienna"), []);
    expect(refused.timeChoices?.timestamp?.map((choice) => choice.offset)).toEqual(["+02:00", "+01:00"]);
    expect(zonedTimeField(form({ timestamp: "2026-10-25T02:30", "timestamp.offset": "+01:00" }), "timestamp", "Europe/Vienna")).toEqual({
      value: "2026-10-25T01:30:00.000Z",
    });
  });

  test("text that is no calendar time is named as such", () => {
    expect(zonedTimeField(form({ timestamp: "2026-02-30T06:00" }), "timestamp", "UTC")).toEqual({
      issue: { path: "timestamp", message: "is not a date and time on the calendar" },
    });
  });
});
