// The CSV import on a real, migrated SQLite file: what lands, what a re-import does, the two modes, the dry
// run, file encodings and separators, timestamp forms, time order against stored points, and live
// detection through the batch re-evaluation after an import into a characteristic with frozen limits.
import { readFile } from "node:fs/promises";
import { describe, expect, test } from "vitest";
import { reviseLimits } from "@/src/limits/revise";
import { rejectedRowsPath } from "@/src/imports/rejected-rows";
import { ROWS_PER_STATEMENT } from "@/src/imports/write";
import { appendSubgroups } from "@/src/subgroups/append";
import { DEFAULT_DEMO_SEED } from "@/src/demo/scenario";
import { CAP_HEIGHT_MAPPING, capHeightCsv } from "./demo-continuation";
import { createTestCharacteristic, NOW, runImport, tableCounts, openImportTestDatabase } from "./harness";

const harness = openImportTestDatabase("main");

const XBAR_CSV = [
  "time,sample,diameter,cavity",
  "2026-03-01T06:00:00Z,S1,10.01,1",
  "2026-03-01T06:00:00Z,S1,10.03,1",
  "2026-03-01T06:00:00Z,S1,9.98,1",
  "2026-03-01T07:00:00Z,S2,10.02,2",
  "2026-03-01T07:00:00Z,S2,10.00,2",
  "2026-03-01T07:00:00Z,S2,9.97,2",
  "",
].join("\n");
const XBAR_MAPPING = { timestamp: "time", subgroup: "sample", value: "diameter", tags: [{ column: "cavity", tag: "cavity" }] };

describe("importing a well-formed file", () => {
  test("stores subgroups in file order with their values, cached summaries, tags, key and batch", async () => {
    const id = await createTestCharacteristic(harness.prisma, "xbar-r", 3);
    const result = await runImport(harness, id, XBAR_CSV, { mapping: XBAR_MAPPING });
    expect(result).toMatchObject({ status: "imported", rowsRead: 6, subgroupsAdded: 2, subgroupsAlreadyPresent: 0, rowsRejected: 0, problemCount: 0, addedSequences: [0, 1] });
    const stored = await harness.prisma.subgroup.findMany({
      where: { characteristicId: id },
      orderBy: { sequence: "asc" },
      include: { measurements: { orderBy: { position: "asc" } }, tags: true },
    });
    expect(stored.map((subgroup) => subgroup.measurements.map((measurement) => measurement.value))).toEqual([
      [10.01, 10.03, 9.98],
      [10.02, 10.0, 9.97],
    ]);
    expect(stored.map((subgroup) => subgroup.timestamp.toISOString())).toEqual(["2026-03-01T06:00:00.000Z", "2026-03-01T07:00:00.000Z"]);
    // Mean and range as the engine computes them (src/subgroups/summaries.ts); 1e-12 covers float rounding.
    expect(stored[0]?.mean).toBeCloseTo((10.01 + 10.03 + 9.98) / 3, 12);
    expect(stored[0]?.spread).toBeCloseTo(10.03 - 9.98, 12);
    expect(stored.map((subgroup) => subgroup.tags.map((tag) => [tag.key, tag.value]))).toEqual([[["cavity", "1"]], [["cavity", "2"]]]);
    expect(stored.every((subgroup) => subgroup.sourceKey?.startsWith("csv:") && subgroup.importBatchId === result.batchId)).toBe(true);
    const batch = await harness.prisma.importBatch.findUniqueOrThrow({ where: { id: result.batchId ?? -1 } });
    expect(batch).toMatchObject({ characteristicId: id, fileName: "readings.csv", rowsRead: 6, subgroupsAdded: 2, subgroupsAlreadyPresent: 0, rowsRejected: 0, mode: "all-or-nothing" });
    expect(batch.fileHash).toMatch(/^[0-9a-f]{64}$/);
  });

  test("subgroups written many to a statement keep their values, tags and order, and an overlapping file adds only its new part", async () => {
    // 3 full statements and 5 more (ROWS_PER_STATEMENT subgroups per statement), 4 values and a tag each.
    const count = 3 * ROWS_PER_STATEMENT + 5;
    const subgroupRows = (first: number, last: number) =>
      Array.from({ length: last - first }, (_, offset) => {
        const index = first + offset;
        const time = new Date(Date.UTC(2026, 2, 1, 6) + index * 3_600_000).toISOString();
        return [0, 1, 2, 3].map((position) => `${time},S${index},${(10 + index / 1000 + position / 100).toFixed(3)},${index % 4}`);
      }).flat();
    const mapping = { ...XBAR_MAPPING };
    const id = await createTestCharacteristic(harness.prisma, "xbar-r", 4);
    const first = await runImport(harness, id, ["time,sample,diameter,cavity", ...subgroupRows(0, count)].join("\n"), { mapping });
    expect(first).toMatchObject({ status: "imported", subgroupsAdded: count, addedSequences: [0, count - 1] });
    const stored = await harness.sqlite
      .prepare<[number], { sequence: number; values: string; tag: string; mean: number }>(
        `SELECT s."sequence", group_concat(m."value", ' ' ORDER BY m."position") AS "values", t."value" AS "tag", s."mean"
         FROM "Subgroup" s JOIN "Measurement" m ON m."subgroupId" = s."id" JOIN "SubgroupTag" t ON t."subgroupId" = s."id"
         WHERE s."characteristicId" = ? GROUP BY s."id" ORDER BY s."sequence"`,
      )
      .all(id);
    expect(stored.map((row) => row.sequence)).toEqual(Array.from({ length: count }, (_, index) => index));
    stored.forEach((row, index) => {
      const values = [0, 1, 2, 3].map((position) => Number((10 + index / 1000 + position / 100).toFixed(3)));
      expect(row.values.split(" ").map(Number)).toEqual(values);
      expect(row.tag).toBe(String(index % 4));
      expect(row.mean).toBeCloseTo(values.reduce((sum, value) => sum + value, 0) / 4, 12);
    });

    // The last 70 subgroups again, then 100 new ones: the stored part is recognised row by row.
    const overlap = await runImport(harness, id, ["time,sample,diameter,cavity", ...subgroupRows(count - 70, count + 100)].join("\n"), { mapping });
    expect(overlap).toMatchObject({ status: "imported", subgroupsAlreadyPresent: 70, subgroupsAdded: 100, addedSequences: [count, count + 99] });
    expect(await harness.prisma.measurement.count({ where: { subgroup: { characteristicId: id } } })).toBe(4 * (count + 100));
  });

  test("imported subgroups take ids after every id the table has used, and later writers through Prisma follow them", async () => {
    const mapping = { timestamp: "timestamp", value: "value", tags: [] };
    const file = (first: number, count: number) =>
      ["timestamp,value", ...Array.from({ length: count }, (_, offset) => `${new Date(Date.UTC(2026, 4, 1) + (first + offset) * 60_000).toISOString()},${18 + offset / 100}`)].join("\n");
    const maxId = async () => (await harness.prisma.subgroup.aggregate({ _max: { id: true } }))._max.id ?? 0;
    // The largest ids so far belong to a characteristic that is then deleted: they must not be used again.
    const doomed = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, doomed, file(0, 10), { mapping });
    const largestUsed = await maxId();
    await harness.prisma.characteristic.delete({ where: { id: doomed } });

    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, id, file(0, 70), { mapping });
    const imported = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" }, select: { id: true } });
    expect(imported.map((row) => row.id)).toEqual(Array.from({ length: 70 }, (_, index) => largestUsed + 1 + index));
    const appended = await appendSubgroups(harness.prisma, id, [{ timestamp: "2026-06-01T00:00:00Z", values: [18.1] }], { source: "api", now: NOW });
    expect(appended.stored[0]?.id).toBe(largestUsed + 71);
  });

  test("importing the same file again adds nothing and counts every subgroup as already present", async () => {
    const id = await createTestCharacteristic(harness.prisma, "xbar-r", 3);
    await runImport(harness, id, XBAR_CSV, { mapping: XBAR_MAPPING });
    const before = await tableCounts(harness.prisma);
    const again = await runImport(harness, id, XBAR_CSV, { mapping: XBAR_MAPPING });
    expect(again).toMatchObject({ status: "imported", subgroupsAdded: 0, subgroupsAlreadyPresent: 2, addedSequences: null, signalsRaised: null });
    const after = await tableCounts(harness.prisma);
    expect({ ...after, batches: after.batches - 1 }).toEqual(before);
  });

  test("the same readings re-exported with semicolons, decimal commas, a BOM and CRLF are recognised as present", async () => {
    const id = await createTestCharacteristic(harness.prisma, "xbar-r", 3);
    await runImport(harness, id, XBAR_CSV, { mapping: XBAR_MAPPING });
    const european = `\uFEFF${XBAR_CSV.replaceAll(",", ";").replace(/(\d)\.(\d)/g, "$1,$2").replaceAll("\n", "\r\n")}`;
    const result = await runImport(harness, id, european, { mapping: XBAR_MAPPING });
    expect(result).toMatchObject({ status: "imported", separator: ";", decimalMark: ",", subgroupsAdded: 0, subgroupsAlreadyPresent: 2 });
  });

  test("a semicolon file with decimal commas, a BOM, CRLF and local times at a stated offset lands exactly", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const csv = "\uFEFFZeitpunkt;Höhe;Schicht\r\n01.03.2026 06:00;18,21;Früh\r\n01.03.2026 06:30:15;18,19;Früh\r\n";
    const result = await runImport(harness, id, csv, { mapping: { timestamp: "Zeitpunkt", value: "Höhe", tags: [{ column: "Schicht", tag: "shift" }] }, utcOffset: "+01:00" });
    expect(result).toMatchObject({ status: "imported", subgroupsAdded: 2, separator: ";", decimalMark: "," });
    const stored = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" }, include: { measurements: true, tags: true } });
    expect(stored.map((subgroup) => [subgroup.timestamp.toISOString(), subgroup.measurements[0]?.value, subgroup.tags[0]?.value])).toEqual([
      ["2026-03-01T05:00:00.000Z", 18.21, "Früh"],
      ["2026-03-01T05:30:15.000Z", 18.19, "Früh"],
    ]);
  });

  test("a p chart file: one row per subgroup with count and sample size", async () => {
    const id = await createTestCharacteristic(harness.prisma, "p", 500);
    const csv = "timestamp,short shots,inspected\n2026-03-01T06:00:00Z,4,480\n2026-03-01T14:00:00Z,7,520\n";
    const result = await runImport(harness, id, csv, { mapping: { timestamp: "timestamp", count: "short shots", size: "inspected", tags: [] } });
    expect(result).toMatchObject({ status: "imported", subgroupsAdded: 2 });
    const stored = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" } });
    expect(stored.map((subgroup) => [subgroup.count, subgroup.size])).toEqual([
      [4, 480],
      [7, 520],
    ]);
  });
});

describe("dry run and modes", () => {
  const MIXED = [
    "timestamp,value",
    "2026-03-01T06:00:00Z,18.20",
    "2026-03-01T07:00:00Z,eighteen",
    "2026-03-01T08:00:00Z,18.22",
    "2026-03-01T09:00:00Z,",
    "2026-03-01T10:00:00Z,18.18",
    "",
  ].join("\n");
  const MAPPING = { timestamp: "timestamp", value: "value", tags: [] };

  test("a dry run reports what an import would do and writes nothing", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const before = await tableCounts(harness.prisma);
    const result = await runImport(harness, id, XBAR_CSV.replace("sample,diameter,cavity", "sample,value,cavity"), { mapping: { timestamp: "time", value: "value", tags: [] }, dryRun: true });
    expect(result).toMatchObject({ status: "checked", rowsRead: 6, subgroupsAdded: 6, batchId: null });
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });

  test("all-or-nothing: one bad row anywhere writes nothing, and every bad row is reported", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const before = await tableCounts(harness.prisma);
    const result = await runImport(harness, id, MIXED, { mapping: MAPPING });
    expect(result).toMatchObject({ status: "rejected", problemCount: 2, rowsRejected: 2, subgroupsAdded: 0, batchId: null });
    expect(result.problems).toEqual([
      { line: 3, column: "value", message: '"eighteen" is not a number' },
      { line: 5, column: "value", message: "is empty: a number is required" },
    ]);
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });

  test("valid rows only: exactly the valid rows are written and the rejected rows are kept as a file", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const result = await runImport(harness, id, MIXED, { mapping: MAPPING, mode: "valid-only" });
    expect(result).toMatchObject({ status: "imported", rowsRead: 5, subgroupsAdded: 3, rowsRejected: 2, hasRejectedRowsFile: true });
    const stored = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" }, include: { measurements: true } });
    expect(stored.map((subgroup) => [subgroup.sequence, subgroup.measurements[0]?.value])).toEqual([
      [0, 18.2],
      [1, 18.22],
      [2, 18.18],
    ]);
    const rejected = await readFile(rejectedRowsPath(harness.databaseFile, result.batchId ?? -1), "utf8");
    expect(rejected.split("\r\n")).toEqual([
      "timestamp,value,line,reason",
      '2026-03-01T07:00:00Z,eighteen,3,"column ""value"": ""eighteen"" is not a number"',
      '2026-03-01T09:00:00Z,,5,"column ""value"": is empty: a number is required"',
    ]);
    expect(await harness.prisma.importBatch.findUniqueOrThrow({ where: { id: result.batchId ?? -1 } })).toMatchObject({ mode: "valid-only", rowsRejected: 2, subgroupsAdded: 3 });
  });

  test("valid rows only: a subgroup with one bad row is rejected whole, its other rows saying why", async () => {
    const id = await createTestCharacteristic(harness.prisma, "xbar-r", 3);
    const result = await runImport(harness, id, XBAR_CSV.replace("10.00", "ten"), { mapping: XBAR_MAPPING, mode: "valid-only" });
    expect(result).toMatchObject({ subgroupsAdded: 1, rowsRejected: 3 });
    const rejected = await readFile(rejectedRowsPath(harness.databaseFile, result.batchId ?? -1), "utf8");
    expect(rejected).toContain('rejected with subgroup ""S2"", which has a problem on line 6');
  });
});

describe("timestamps", () => {
  const slashFile = "timestamp,value\n03/04/2026 06:00,18.2\n03/04/2026 07:00,18.3\n";
  const mapping = { timestamp: "timestamp", value: "value", tags: [] };

  test("an ambiguous slash date is refused, naming the row, until the order is chosen", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const refused = await runImport(harness, id, slashFile, { mapping, utcOffset: "Z" });
    expect(refused.status).toBe("rejected");
    expect(refused.problems[0]).toEqual({
      line: 2,
      column: "timestamp",
      message: '"03/04/2026 06:00" is ambiguous: it reads as 3 April (day first) or March 4 (month first); choose the day/month order for this file',
    });
    const dayFirst = await runImport(harness, id, slashFile, { mapping, utcOffset: "Z", dayMonthOrder: "day-first" });
    expect(dayFirst.status).toBe("imported");
    const stored = await harness.prisma.subgroup.findFirstOrThrow({ where: { characteristicId: id, sequence: 0 } });
    expect(stored.timestamp.toISOString()).toBe("2026-04-03T06:00:00.000Z");
  });

  test("month-first reads the other way", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, id, slashFile, { mapping, utcOffset: "-05:00", dayMonthOrder: "month-first" });
    const stored = await harness.prisma.subgroup.findFirstOrThrow({ where: { characteristicId: id, sequence: 0 } });
    expect(stored.timestamp.toISOString()).toBe("2026-03-04T11:00:00.000Z");
  });

  test("new points earlier than the last stored point are refused; already present ones are not", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, id, "timestamp,value\n2026-03-02T06:00:00Z,18.2\n", { mapping });
    const before = await tableCounts(harness.prisma);
    const result = await runImport(harness, id, "timestamp,value\n2026-03-02T06:00:00Z,18.2\n2026-03-01T06:00:00Z,18.3\n", { mapping });
    expect(result.status).toBe("rejected");
    expect(result.problems).toEqual([
      {
        line: 3,
        column: "timestamp",
        message: "2026-03-01T06:00:00.000Z is before the previous subgroup's 2026-03-02T06:00:00.000Z: rows must be in time order",
      },
    ]);
    const older = await runImport(harness, id, "timestamp,value\n2026-02-28T06:00:00Z,18.3\n", { mapping });
    expect(older.problems[0]?.message).toBe(
      "2026-02-28T06:00:00.000Z is before the last stored subgroup of this characteristic (2026-03-02T06:00:00.000Z): new points are appended in time order",
    );
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });
});

describe("live detection after an import", () => {
  test("a shifted continuation of the demo cap-height series raises signals on the new points, recorded as one re-evaluation", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const baseline = capHeightCsv({ seed: DEFAULT_DEMO_SEED, after: new Date("2026-01-01T00:00:00Z"), count: 100 });
    const first = await runImport(harness, id, baseline.csv, { mapping: CAP_HEIGHT_MAPPING });
    expect(first).toMatchObject({ status: "imported", subgroupsAdded: 100, signalsRaised: 0 });
    await reviseLimits(harness.prisma, id, { baselineStart: 0, baselineEnd: 100, reason: "baseline of the demo series", approvedBy: "Test engineer" }, NOW);
    const evaluationsBefore = await harness.prisma.signalEvaluation.count({ where: { characteristicId: id } });

    // 40 further points of an independent demo stretch, the last 20 shifted up by 2.5 sigma.
    const continuation = capHeightCsv({ seed: DEFAULT_DEMO_SEED + 1, after: baseline.timestamps.at(-1) ?? NOW, count: 40, shiftFrom: 20, shiftSigmas: 2.5 });
    const second = await runImport(harness, id, continuation.csv, { mapping: CAP_HEIGHT_MAPPING });
    expect(second).toMatchObject({ status: "imported", subgroupsAdded: 40, addedSequences: [100, 139] });
    expect(second.signalsRaised).toBeGreaterThan(0);
    const signals = await harness.prisma.signal.findMany({ where: { characteristicId: id, endSequence: { gte: 100 } } });
    expect(signals.length).toBe(second.signalsRaised);
    // Nine or more points in a row above the centre line (Nelson test 2) must come from the 20 shifted
    // points: each lies below the centre with probability Phi(-2.5) = 0.006 only. Signals inside the shifted
    // stretch all lie above (or have no side); one chance firing among the 20 in-control points is allowed.
    expect(signals).toContainEqual(expect.objectContaining({ rule: "nelson-2", statistic: "x", side: "above", endSequence: 139 }));
    expect(signals.filter((signal) => signal.startSequence >= 120).every((signal) => signal.side !== "below")).toBe(true);
    expect(await harness.prisma.signalEvaluation.count({ where: { characteristicId: id } })).toBe(evaluationsBefore + 1);
    const evaluation = await harness.prisma.signalEvaluation.findFirstOrThrow({ where: { characteristicId: id }, orderBy: { id: "desc" } });
    expect(evaluation).toMatchObject({ trigger: "import", reason: `import #${second.batchId} of readings.csv: 40 subgroups added` });
  });
});
