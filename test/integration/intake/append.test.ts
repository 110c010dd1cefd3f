// Appending subgroups on a real SQLite file: the happy path (sequences, summaries, tags, the answer),
// source keys (a repeated import adds nothing), the no-limits-yet answer, and a continued firing
// extending the open signal instead of creating a new one.
import { beforeAll, describe, expect, test } from "vitest";
import { createCharacteristic } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import { reviseLimits } from "@/src/limits";
import { signalsFor } from "@/src/signals";
import { appendSubgroups } from "@/src/subgroups";
import { registerTestDatabase } from "./database";
import { seededSubgroups } from "./series";

const openDatabase = registerTestDatabase("append");
const NOW = new Date("2026-03-01T12:00:00Z");
let db: PrismaClient;
let processId: number;

beforeAll(async () => {
  ({ db, processId } = await openDatabase());
});

describe("appending subgroups", () => {
  test("stores sequences in order with their summaries and tags; no limits yet raises nothing and says so", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Wall thickness", unit: "mm", chartType: "xbar-r", subgroupSize: 3 });
    const result = await appendSubgroups(
      db,
      characteristic.id,
      [
        { timestamp: "2026-03-01T06:00:00Z", values: [1.2, 1.5, 1.1], tags: { cavity: "2", shift: "early" } },
        { timestamp: "2026-03-01T06:00:00+00:00", values: [1.4, 1.3, 1.3] },
      ],
      { source: "entry", now: NOW },
    );
    expect(result.stored.map((subgroup) => subgroup.sequence)).toEqual([0, 1]);
    // Mean and range as the engine computes them: (1.2 + 1.5 + 1.1) / 3 and 1.5 − 1.1 in doubles.
    expect(result.stored[0]).toMatchObject({ values: [1.2, 1.5, 1.1], mean: (1.2 + 1.5 + 1.1) / 3, spread: 1.5 - 1.1, tags: { cavity: "2", shift: "early" }, firedRules: [] });
    expect(result.limits).toBeNull();
    expect(result.signals).toEqual([]);
    expect(result.notes).toEqual(["no limits yet: the subgroups are stored and no rule was evaluated"]);
    const rows = await db.subgroup.findMany({ where: { characteristicId: characteristic.id }, orderBy: { sequence: "asc" }, include: { measurements: true, tags: true } });
    expect(rows.map((row) => row.measurements.map((measurement) => measurement.value))).toEqual([[1.2, 1.5, 1.1], [1.4, 1.3, 1.3]]);
    expect(rows[0]!.tags.map((tag) => [tag.key, tag.value]).sort()).toEqual([["cavity", "2"], ["shift", "early"]]);
    const next = await appendSubgroups(db, characteristic.id, [{ timestamp: "2026-03-01T07:00:00Z", values: [1, 1, 1] }], { source: "api", now: NOW });
    expect(next.stored[0]!.sequence).toBe(2);
  });

  test("attributes charts store count and size (units for u, 1 for c)", async () => {
    const uChart = await createCharacteristic(db, { processId, name: "Scratches per panel", unit: "defects", chartType: "u", subgroupSize: 1 });
    const cChart = await createCharacteristic(db, { processId, name: "Voids", unit: "defects", chartType: "c", subgroupSize: 1 });
    const u = await appendSubgroups(db, uChart.id, [{ timestamp: "2026-03-01T06:00:00Z", count: 7, units: 2.5 }], { source: "api", now: NOW });
    const c = await appendSubgroups(db, cChart.id, [{ timestamp: "2026-03-01T06:00:00Z", count: 4 }], { source: "api", now: NOW });
    expect(u.stored[0]).toMatchObject({ count: 7, size: 2.5, mean: null, values: null });
    expect(c.stored[0]).toMatchObject({ count: 4, size: 1 });
  });

  test("keyed rows: a repeated import adds nothing and says how many were already there", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Keyed weight", unit: "g", chartType: "imr", subgroupSize: 1 });
    // As many as one API request may carry, more keys than SQLite binds in one statement.
    const inputs = seededSubgroups("imr", 1000, 3);
    const keys = inputs.map((_, index) => `file.csv:${index + 2}`);
    const first = await appendSubgroups(db, characteristic.id, inputs.slice(0, 600), { source: "import", now: NOW, sourceKeys: keys.slice(0, 600) });
    expect(first.stored).toHaveLength(600);
    const again = await appendSubgroups(db, characteristic.id, inputs, { source: "import", now: NOW, sourceKeys: keys });
    expect(again).toMatchObject({ alreadyPresent: 600 });
    expect(again.stored.map((subgroup) => subgroup.sequence)).toEqual(Array.from({ length: 400 }, (_, index) => 600 + index));
    const third = await appendSubgroups(db, characteristic.id, inputs, { source: "import", now: NOW, sourceKeys: keys });
    expect(third).toMatchObject({ stored: [], alreadyPresent: 1000, notes: ["every subgroup was already stored; nothing was added"] });
    expect(await db.subgroup.count({ where: { characteristicId: characteristic.id } })).toBe(1000);
  });

  test("a continued firing extends the open signal instead of creating a new one", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Bore diameter", unit: "mm", chartType: "imr", subgroupSize: 1, ruleSet: "nelson-1" });
    const baseline = seededSubgroups("imr", 30, 11, 30);
    await appendSubgroups(db, characteristic.id, baseline, { source: "import", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 30, reason: "initial baseline", approvedBy: "Test engineer" }, NOW);
    const far = (hour: number) => ({ timestamp: `2026-01-07T${String(hour).padStart(2, "0")}:00:00Z`, values: [20] });
    // The jump also fires on the moving range; the individuals signal is the one followed here.
    const onX = <T extends { statistic: string }>(result: { signals: T[] }) => result.signals.filter((signal) => signal.statistic === "x");
    const first = await appendSubgroups(db, characteristic.id, [far(1)], { source: "api", now: NOW });
    expect(first.stored[0]!.firedRules).toEqual(["nelson-1"]);
    expect(onX(first)).toHaveLength(1);
    const later = new Date("2026-03-02T00:00:00Z");
    const second = await appendSubgroups(db, characteristic.id, [far(2)], { source: "api", now: later });
    expect(second.signals).toHaveLength(1);
    expect(second.signals[0]).toMatchObject({ id: onX(first)[0]!.id, statistic: "x", startSequence: 30, endSequence: 31, firing: [30, 31], side: "above", detectedAt: NOW, updatedAt: later });
    // An in-control point closes the run; the next firing starts a new signal.
    await appendSubgroups(db, characteristic.id, [{ timestamp: "2026-01-07T03:00:00Z", values: [10] }], { source: "api", now: NOW });
    const third = await appendSubgroups(db, characteristic.id, [far(4)], { source: "api", now: NOW });
    expect(onX(third)[0]!.id).not.toBe(onX(first)[0]!.id);
    expect(onX({ signals: await signalsFor(db, characteristic.id) }).map((signal) => signal.firing)).toEqual([[30, 31], [33]]);
  });

  test("signals raised live carry the pattern the engine reads from the recent window", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Lid depth", unit: "mm", chartType: "imr", subgroupSize: 1, ruleSet: "we" });
    // In control for 60 points, then a shift of 2.5 sigma (seeded test data).
    const inputs = seededSubgroups("imr", 100, 41, 60, 2.5);
    await appendSubgroups(db, characteristic.id, inputs.slice(0, 60), { source: "import", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 60, reason: "initial baseline", approvedBy: "Test engineer" }, NOW);
    for (const input of inputs.slice(60)) await appendSubgroups(db, characteristic.id, [input], { source: "entry", now: NOW });
    const afterShift = (await signalsFor(db, characteristic.id)).filter((signal) => signal.statistic === "x" && signal.startSequence >= 60);
    expect(afterShift.length).toBeGreaterThan(0);
    expect(afterShift.map((signal) => signal.pattern)).toContain("shift");
  });
});
