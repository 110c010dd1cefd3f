// Importing a file of local wall-clock times read in the site's time zone, on a real migrated SQLite file:
// a file across the autumn change stores the instants the clocks meant, a time the clocks skip refuses the
// file with nothing written, a dry run counts what an import would do, and the options are checked.
// The EU change instants (01:00 UTC on the last Sundays of March and October, 29 March and 25 October in
// 2026) are from Directive 2000/84/EC, Articles 1 and 2 (from memory); the United Kingdom keeps them.
import { describe, expect, test } from "vitest";
import { createTestCharacteristic, runImport, tableCounts, openImportTestDatabase } from "./harness";

const harness = openImportTestDatabase("site-zone");

const MAPPING = { timestamp: "timestamp", value: "value", tags: [] };

/** A two-column file of wall-clock times and values 18.0, 18.1, … */
function file(times: readonly string[]): string {
  return ["timestamp,value", ...times.map((time, index) => `${time},${(18 + index / 10).toFixed(1)}`), ""].join("\n");
}

/** Europe/London on 25 Oct 2026: 01:00-02:00 is shown twice, first in BST (+01:00), then in GMT. */
const AUTUMN_TIMES = ["2026-10-25 00:50", "2026-10-25 01:30", "2026-10-25 01:45", "2026-10-25 01:15", "2026-10-25 01:30", "2026-10-25 02:10"];
const AUTUMN_INSTANTS = [
  "2026-10-24T23:50:00.000Z",
  "2026-10-25T00:30:00.000Z",
  "2026-10-25T00:45:00.000Z",
  "2026-10-25T01:15:00.000Z",
  "2026-10-25T01:30:00.000Z",
  "2026-10-25T02:10:00.000Z",
];

async function storedTimes(characteristicId: number): Promise<string[]> {
  const stored = await harness.prisma.subgroup.findMany({ where: { characteristicId }, orderBy: { sequence: "asc" }, select: { timestamp: true } });
  return stored.map((subgroup) => subgroup.timestamp.toISOString());
}

describe("times without a zone in the site's time zone", () => {
  test("a file across the autumn change in Europe/London stores each repeated time at the instant that keeps time order", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1, "Europe/London");
    const result = await runImport(harness, id, file(AUTUMN_TIMES), { mapping: MAPPING, siteZone: true });
    expect(result).toMatchObject({ status: "imported", rowsRead: 6, subgroupsAdded: 6, rowsRejected: 0, problemCount: 0 });
    expect(await storedTimes(id)).toEqual(AUTUMN_INSTANTS);
    // The same file again: the same instants, so the same keys, and nothing is added.
    const again = await runImport(harness, id, file(AUTUMN_TIMES), { mapping: MAPPING, siteZone: true });
    expect(again).toMatchObject({ status: "imported", subgroupsAdded: 0, subgroupsAlreadyPresent: 6 });
  });

  test("dotted dates across the spring change in Europe/Vienna, with a cell that carries its own offset, convert exactly", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1, "Europe/Vienna");
    const times = ["29.03.2026 01:30", "29.03.2026 01:59", "2026-03-29T03:00:00+02:00", "29.03.2026 03:30", "30.03.2026 06:00"];
    const result = await runImport(harness, id, file(times), { mapping: MAPPING, siteZone: true });
    expect(result).toMatchObject({ status: "imported", subgroupsAdded: 5 });
    expect(await storedTimes(id)).toEqual(["2026-03-29T00:30:00.000Z", "2026-03-29T00:59:00.000Z", "2026-03-29T01:00:00.000Z", "2026-03-29T01:30:00.000Z", "2026-03-30T04:00:00.000Z"]);
  });

  test("a site in UTC reads such times as UTC", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, id, file(["2026-03-29 01:30"]), { mapping: MAPPING, siteZone: true });
    expect(await storedTimes(id)).toEqual(["2026-03-29T01:30:00.000Z"]);
  });

  test("a time the clocks skip refuses the file, naming the line, the column and the jump, and writes nothing", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1, "Europe/London");
    const before = await tableCounts(harness.prisma);
    const result = await runImport(harness, id, file(["2026-03-29 00:45", "2026-03-29 01:30", "2026-03-29 02:15"]), { mapping: MAPPING, siteZone: true });
    expect(result).toMatchObject({ status: "rejected", batchId: null, problemCount: 1, subgroupsAdded: 0 });
    expect(result.problems).toEqual([
      { line: 3, column: "timestamp", message: '"2026-03-29 01:30" does not exist in Europe/London: the clocks jump from 01:00 to 02:00 on 29 Mar 2026' },
    ]);
    expect(await tableCounts(harness.prisma)).toEqual(before);
    expect(await storedTimes(id)).toEqual([]);
  });

  test("a dry run counts what the import would do, a repeated time that fits nowhere included, and writes nothing", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1, "Europe/London");
    const before = await tableCounts(harness.prisma);
    const checked = await runImport(harness, id, file(AUTUMN_TIMES), { mapping: MAPPING, siteZone: true, dryRun: true });
    expect(checked).toMatchObject({ status: "checked", rowsRead: 6, subgroupsAdded: 6, rowsRejected: 0, batchId: null });
    // 01:30 after 02:10 (GMT): both of its instants are earlier, so the row is refused.
    const late = file([...AUTUMN_TIMES, "2026-10-25 01:30", "2026-10-25 02:20"]);
    const validOnly = await runImport(harness, id, late, { mapping: MAPPING, siteZone: true, dryRun: true, mode: "valid-only" });
    expect(validOnly).toMatchObject({ status: "checked", rowsRead: 8, subgroupsAdded: 7, rowsRejected: 1, problemCount: 1, batchId: null });
    expect(validOnly.problems[0]).toEqual({
      line: 8,
      column: "timestamp",
      message:
        '"2026-10-25 01:30" happens twice in Europe/London on 25 Oct 2026: the clocks go back from 02:00 to 01:00, and both its times ' +
        "(2026-10-25T00:30:00.000Z and 2026-10-25T01:30:00.000Z) are before the previous row's 2026-10-25T02:10:00.000Z: rows must be in time order",
    });
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });

  test("the site's zone and a fixed offset together are refused before anything is read", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1, "Europe/London");
    const before = await tableCounts(harness.prisma);
    await expect(runImport(harness, id, file(AUTUMN_TIMES), { mapping: MAPPING, siteZone: true, utcOffset: "+01:00" })).rejects.toMatchObject({
      code: "invalid-input",
      issues: [{ path: "siteZone", message: "choose either the site's time zone or a fixed UTC offset for times without a zone, not both" }],
    });
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });
});
