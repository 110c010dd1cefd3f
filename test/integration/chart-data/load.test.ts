// loadChartView on a real, freshly migrated SQLite file, with data written through the domain services:
// an individuals chart with two limit versions, a planted shift (so signals are stored), one corrected
// value and one process event. The drawn values and limits are checked against the engine's own
// evaluation of the measurements (evaluateChart per version segment), exactly (the cached summaries are
// computed with the same functions, so no tolerance is needed).
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { loadChartView } from "@/src/chart-data/load";
import type { TChartPoint, TPointLimits, TStatisticView } from "@/src/chart-data/view";
import { createCharacteristic } from "@/src/characteristics/setup";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { recordEvent } from "@/src/events";
import { chartParametersOf, limitSetsFor, reviseLimits } from "@/src/limits";
import { signalsFor } from "@/src/signals";
import { evaluateChart } from "@/src/spc/charts";
import { attributesData, individualsData } from "@/src/spc/data";
import { createRng } from "@/src/spc/random";
import { appendSubgroups, correctValue } from "@/src/subgroups";
import { registerTemporaryDirectories } from "../db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();
const START = Date.parse("2026-03-01T06:00:00Z");
const NOW = new Date("2026-03-10T00:00:00Z");
const POINTS = 120;
const SECOND_VERSION_FROM = 60;
const CORRECTED = 25;

let prisma: PrismaClient;
let database: Database.Database;
let characteristicId: number;
const values: number[] = [];

beforeAll(async () => {
  const databaseFile = path.join(temporaryDirectory("chart-data"), "assignable.db");
  await applyMigrations({ databaseFile });
  prisma = createPrismaClient(`file:${databaseFile}`);
  const site = await prisma.site.create({ data: { name: "Test site" } });
  const area = await prisma.area.create({ data: { siteId: site.id, name: "Moulding" } });
  const process = await prisma.process.create({ data: { areaId: area.id, name: "Press 1", kind: "injection-moulding press" } });
  characteristicId = (await createCharacteristic(prisma, { processId: process.id, name: "Weight", unit: "g", chartType: "imr", subgroupSize: 1 })).id;
  // Invented data: in control around 10, then a shift of +2σ from point 90 on.
  const rng = createRng(7);
  for (let index = 0; index < POINTS; index++) values.push(10 + (index >= 90 ? 1 : 0) + 0.5 * rng.normal());
  const subgroups = values.map((value, index) => ({ timestamp: new Date(START + index * 3_600_000).toISOString(), values: [value] }));
  await appendSubgroups(prisma, characteristicId, subgroups.slice(0, 40), { source: "api", now: NOW });
  await reviseLimits(prisma, characteristicId, { baselineStart: 0, baselineEnd: 30, reason: "first limits", approvedBy: "Test lead" }, NOW);
  await appendSubgroups(prisma, characteristicId, subgroups.slice(40), { source: "api", now: NOW });
  await reviseLimits(
    prisma,
    characteristicId,
    { baselineStart: SECOND_VERSION_FROM, baselineEnd: 85, reason: "new mould insert", approvedBy: "Test lead" },
    NOW,
  );
  const corrected = await prisma.subgroup.findFirstOrThrow({ where: { characteristicId, sequence: CORRECTED } });
  await correctValue(prisma, { subgroupId: corrected.id, position: 0, field: "value" }, { newValue: 10.05, reason: "digits swapped", correctedBy: "Test operator" }, NOW);
  values[CORRECTED] = 10.05;
  await recordEvent(prisma, process.id, { occurredAt: new Date(START + 89.5 * 3_600_000).toISOString(), kind: "lot-change", description: "new resin lot" }, NOW);
  database = new Database(databaseFile, { readonly: true });
});

afterAll(async () => {
  database?.close();
  await prisma?.$disconnect();
});

/** A point's limits: its own where they vary within the segment, else the segment's (see ZChartPoint). */
function limitsOf(statistic: TStatisticView, point: TChartPoint): TPointLimits | null {
  const segment = statistic.segments.find((candidate) => candidate.fromSequence <= point.sequence && point.sequence <= candidate.toSequence);
  return point.limits ?? segment?.constantLimits ?? null;
}

describe("loadChartView", () => {
  test("whole history within the budget: every point, values and limits equal the engine's per version", async () => {
    const view = loadChartView(database, characteristicId);
    expect(view.history).toEqual({ first: 0, last: POINTS - 1 });
    const [x, mr] = view.statistics;
    expect(x!.key).toBe("x");
    expect(mr!.key).toBe("mr");
    expect(x!.points.map((point) => point.sequence)).toEqual(values.map((_, index) => index));
    const limitSets = await limitSetsFor(prisma, characteristicId);
    for (const limitSet of limitSets) {
      const from = limitSet.appliesFrom;
      const to = limitSet.appliesTo!.to ?? POINTS;
      const expected = evaluateChart(individualsData(values.slice(from, to)), chartParametersOf("imr", limitSet));
      for (const [statisticIndex, series] of expected.statistics.entries()) {
        for (let index = 0; index < to - from; index++) {
          const point = view.statistics[statisticIndex]!.points[from + index]!;
          const value = series.points[index]!;
          expect(point.value).toBe(Number.isNaN(value) ? null : value);
          expect(point.version).toBe(limitSet.version);
          expect(limitsOf(view.statistics[statisticIndex]!, point)).toMatchObject({ center: series.center, ucl: series.ucl[index], lcl: series.lcl[index] });
        }
      }
    }
  });

  test("points carry only what they have: no null or empty field, and no limits where the segment states them", () => {
    const view = loadChartView(database, characteristicId);
    for (const statistic of view.statistics) {
      for (const segment of statistic.segments) expect(segment.constantLimits).not.toBeNull();
      for (const point of statistic.points) {
        expect(point).not.toHaveProperty("limits");
        for (const field of ["firedRules", "bucket", "originalValue", "corrections"] as const) {
          if (field in point) expect(point[field] === null || (Array.isArray(point[field]) && point[field].length === 0)).toBe(false);
        }
      }
    }
    const corrected = view.statistics[0]!.points[CORRECTED]!;
    expect(Object.keys(corrected).sort()).toEqual(["corrections", "originalValue", "sequence", "timestamp", "value", "version"]);
  });

  test("a p chart with varying sample sizes: each point carries its own limits, equal to the engine's", async () => {
    const process = await prisma.process.findFirstOrThrow();
    const pChart = await createCharacteristic(prisma, { processId: process.id, name: "Short shots", unit: "items", chartType: "p", subgroupSize: 1 });
    // Invented counts: sizes alternate among three values, so the limits differ from point to point.
    const sizes = Array.from({ length: 30 }, (_, index) => [80, 100, 125][index % 3]!);
    const counts = sizes.map((size, index) => Math.round(size * (0.05 + 0.01 * ((index * 7) % 5))));
    const subgroups = sizes.map((size, index) => ({ timestamp: new Date(START + index * 3_600_000).toISOString(), count: counts[index]!, size }));
    await appendSubgroups(prisma, pChart.id, subgroups, { source: "api", now: NOW });
    await reviseLimits(prisma, pChart.id, { baselineStart: 0, baselineEnd: 30, reason: "first limits", approvedBy: "Test lead" }, NOW);
    const [limitSet] = await limitSetsFor(prisma, pChart.id);
    const expected = evaluateChart(attributesData(counts, sizes), chartParametersOf("p", limitSet!)).statistics[0]!;
    const [p] = loadChartView(database, pChart.id).statistics;
    expect(p!.segments).toHaveLength(1);
    expect(p!.segments[0]!.constantLimits).toBeNull();
    p!.points.forEach((point, index) => {
      expect(point.limits).toMatchObject({ center: expected.center, ucl: expected.ucl[index], lcl: expected.lcl[index] });
    });
  });

  test("limits step where the version changes, and the segments say which version applies to which points", () => {
    const [x] = loadChartView(database, characteristicId).statistics;
    expect(x!.segments.map(({ version, fromSequence, toSequence }) => ({ version, fromSequence, toSequence }))).toEqual([
      { version: 1, fromSequence: 0, toSequence: SECOND_VERSION_FROM - 1 },
      { version: 2, fromSequence: SECOND_VERSION_FROM, toSequence: POINTS - 1 },
    ]);
    const before = limitsOf(x!, x!.points[SECOND_VERSION_FROM - 1]!)!;
    const after = limitsOf(x!, x!.points[SECOND_VERSION_FROM]!)!;
    expect(after.center).not.toBe(before.center);
    expect(x!.segments[0]!.constantLimits).toEqual(before);
    // Warning limits at 2σ: two thirds of the way from the centre to the 3σ action limit.
    expect(after.upperWarning! - after.center).toBeCloseTo((2 / 3) * (after.ucl - after.center), 12);
  });

  test("decimation to a small budget keeps every signal point, both sides of the step, and the corrected point", async () => {
    const stored = await signalsFor(prisma, characteristicId);
    expect(stored.length).toBeGreaterThan(0);
    const view = loadChartView(database, characteristicId, { maxPoints: 10 });
    for (const statistic of view.statistics) {
      expect(statistic.decimated).toBe(true);
      const kept = new Map(statistic.points.map((point) => [point.sequence, point]));
      for (const signal of stored.filter((candidate) => candidate.statistic === statistic.key)) {
        for (const sequence of signal.firing) expect(kept.get(sequence)?.firedRules).toContain(signal.rule);
      }
      for (const sequence of [SECOND_VERSION_FROM - 1, SECOND_VERSION_FROM, CORRECTED]) expect(kept.has(sequence)).toBe(true);
    }
    expect(view.signalCounts.total).toBe(stored.length);
    expect(view.signals.map((signal) => signal.id).sort()).toEqual(stored.map((signal) => signal.id).sort());
    expect(view.signals.map((signal) => signal.endSequence)).toEqual(stored.map((signal) => signal.endSequence).sort((a, b) => b - a));
  });

  test("a range shows only its points, signals touching it and events inside it", () => {
    const view = loadChartView(database, characteristicId, { fromSequence: 80, toSequence: 100 });
    expect(view.range).toEqual({ from: 80, to: 100 });
    for (const statistic of view.statistics) expect(statistic.points.map((point) => point.sequence)).toEqual(Array.from({ length: 21 }, (_, index) => 80 + index));
    for (const signal of view.signals) {
      expect(signal.endSequence).toBeGreaterThanOrEqual(80);
      expect(signal.startSequence).toBeLessThanOrEqual(100);
    }
    expect(view.events).toHaveLength(1);
    expect(view.events[0]).toMatchObject({ kind: "lot-change", description: "new resin lot", position: 89.5 });
    // The first moving range of the range uses the point before it.
    expect(view.statistics[1]!.points[0]!.value).toBe(Math.abs(values[80]! - values[79]!));
    expect(loadChartView(database, characteristicId, { fromSequence: 0, toSequence: 50 }).events).toEqual([]);
  });

  test("a corrected point carries the value as recorded, who corrected it and why", () => {
    const view = loadChartView(database, characteristicId, { fromSequence: 20, toSequence: 30 });
    const point = view.statistics[0]!.points.find((candidate) => candidate.sequence === CORRECTED)!;
    const recorded = point.corrections![0]!.recorded;
    expect(point.value).toBe(10.05);
    expect(point.originalValue).toBe(recorded);
    expect(point.corrections).toEqual([
      { field: "value", position: 0, recorded, corrected: 10.05, reason: "digits swapped", correctedBy: "Test operator", correctedAt: NOW.toISOString() },
    ]);
  });

  test("new subgroups appear in the next view (the column cache grows), and an unknown characteristic is not found", async () => {
    await appendSubgroups(prisma, characteristicId, [{ timestamp: new Date(START + POINTS * 3_600_000).toISOString(), values: [10] }], {
      source: "entry",
      now: NOW,
    });
    const view = loadChartView(database, characteristicId);
    expect(view.history).toEqual({ first: 0, last: POINTS });
    expect(view.statistics[0]!.points.at(-1)).toMatchObject({ sequence: POINTS, value: 10, version: 2 });
    expect(() => loadChartView(database, 9999)).toThrow(/Characteristic 9999 does not exist/);
  });
});
