// Seeding the demo plant into a real, freshly migrated SQLite file: every row arrives, the stored values
// read back equal the generated ones, a second start through isDatabaseEmpty adds nothing, and replacing
// the plant leaves exactly one. The seeding time is printed (it is a figure for the report, not a limit
// beyond the generous bound below, since the test machine is shared).
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { DEFAULT_DEMO_SEED, generateDemoScenario } from "@/src/demo/scenario";
import { isDatabaseEmpty, seedDemoPlant, type SeedSummary } from "@/src/demo/seed";

const END = new Date("2026-11-30T18:30:00Z");
const directory = mkdtempSync(path.join(os.tmpdir(), "assignable-demo-seed-"));

/** Rows grouped by their subgroup id, in the order read (Map.groupBy needs Node 21). */
function bySubgroup<T extends { subgroupId: number }>(rows: readonly T[]): Map<number, T[]> {
  const groups = new Map<number, T[]>();
  for (const row of rows) groups.set(row.subgroupId, [...(groups.get(row.subgroupId) ?? []), row]);
  return groups;
}

let prisma: PrismaClient;
let summary: SeedSummary;

beforeAll(async () => {
  const databaseFile = path.join(directory, "assignable.db");
  await applyMigrations({ databaseFile });
  prisma = createPrismaClient(`file:${databaseFile}`);
  expect(await isDatabaseEmpty(prisma)).toBe(true);
  // CPU time as well as wall time: the wall time depends on what else the shared machine is running.
  const cpuBefore = process.cpuUsage();
  summary = await seedDemoPlant(prisma, { end: END });
  const cpu = process.cpuUsage(cpuBefore);
  console.log(
    `Seeded ${summary.subgroups} subgroups, ${summary.measurements} measurements, ${summary.tags} tags and ` +
      `${summary.events} events in ${summary.milliseconds} ms (${Math.round((cpu.user + cpu.system) / 1000)} ms CPU)`,
  );
});

afterAll(async () => {
  await prisma.$disconnect();
  rmSync(directory, { recursive: true, force: true });
});

describe("seeding the demo plant", () => {
  const scenario = generateDemoScenario({ seed: DEFAULT_DEMO_SEED, end: END });

  test("writes every row of the scenario, within a generous time bound", async () => {
    const measurements = scenario.characteristics.reduce(
      (sum, c) => sum + c.subgroups.reduce((count, subgroup) => count + subgroup.values.length, 0),
      0,
    );
    const tags = scenario.characteristics.reduce(
      (sum, c) => sum + c.subgroups.reduce((count, subgroup) => count + Object.keys(subgroup.tags).length, 0),
      0,
    );
    expect(summary).toMatchObject({ processes: 2, characteristics: 4, subgroups: 4 * 1080, measurements, tags });
    expect(await prisma.site.count()).toBe(1);
    expect(await prisma.area.count()).toBe(1);
    expect(await prisma.process.count()).toBe(2);
    expect(await prisma.characteristic.count()).toBe(4);
    expect(await prisma.subgroup.count()).toBe(summary.subgroups);
    expect(await prisma.measurement.count()).toBe(measurements);
    expect(await prisma.subgroupTag.count()).toBe(tags);
    expect(await prisma.processEvent.count()).toBe(scenario.events.length);
    // Two minutes is the transaction timeout; a few seconds is typical on an idle 2-core machine.
    expect(summary.milliseconds).toBeLessThan(120_000);
  });

  test("stored subgroups, values and tags read back as generated", async () => {
    const processName = new Map(scenario.processes.map((process) => [process.key, process.name]));
    for (const characteristic of scenario.characteristics) {
      const stored = await prisma.characteristic.findFirstOrThrow({
        where: { name: characteristic.name, process: { name: processName.get(characteristic.processKey) } },
      });
      expect(stored).toMatchObject({
        chartType: characteristic.chartType,
        subgroupSize: characteristic.subgroupSize,
        target: characteristic.target,
        lowerSpecLimit: characteristic.lowerSpecLimit,
        upperSpecLimit: characteristic.upperSpecLimit,
        safetyRelated: characteristic.safetyRelated,
      });
      // Read children through relation filters: a nested `include` of 1080 subgroups' children would bind
      // more than the 999 parameters Prisma assumes for SQLite and is refused (P2029).
      const ofCharacteristic = { subgroup: { characteristicId: stored.id } };
      const [subgroups, measurements, tags] = await Promise.all([
        prisma.subgroup.findMany({ where: { characteristicId: stored.id }, orderBy: { sequence: "asc" } }),
        prisma.measurement.findMany({ where: ofCharacteristic, orderBy: [{ subgroupId: "asc" }, { position: "asc" }] }),
        prisma.subgroupTag.findMany({ where: ofCharacteristic }),
      ]);
      const valuesBySubgroup = bySubgroup(measurements);
      const tagsBySubgroup = bySubgroup(tags);
      expect(
        subgroups.map((subgroup) => ({
          sequence: subgroup.sequence,
          timestamp: subgroup.timestamp,
          values: (valuesBySubgroup.get(subgroup.id) ?? []).map((measurement) => measurement.value),
          count: subgroup.count,
          size: subgroup.size,
          tags: Object.fromEntries((tagsBySubgroup.get(subgroup.id) ?? []).map((tag) => [tag.key, tag.value])),
        })),
      ).toEqual(characteristic.subgroups);
    }
  });

  test("events keep their process, kind, category, reading and time", async () => {
    type TEventFields = {
      occurredAt: Date;
      kind: string;
      causeCategory: string | null;
      description: string;
      value: number | null;
      unit: string | null;
    };
    const fields = (process: string, { occurredAt, kind, causeCategory, description, value, unit }: TEventFields) => ({
      process,
      occurredAt,
      kind,
      causeCategory,
      description,
      value,
      unit,
    });
    const stored = await prisma.processEvent.findMany({
      orderBy: [{ occurredAt: "asc" }, { id: "asc" }],
      include: { process: { select: { name: true } } },
    });
    const processName = new Map(scenario.processes.map((process) => [process.key, process.name]));
    expect(stored.map((event) => fields(event.process.name, event))).toEqual(
      scenario.events.map((event) => fields(processName.get(event.processKey) ?? "?", event)),
    );
  });

  test("a second start that checks isDatabaseEmpty first adds nothing", async () => {
    const before = await prisma.subgroup.count();
    expect(await isDatabaseEmpty(prisma)).toBe(false);
    // Seeding a second plant without `replace` is refused by the unique site name and rolls back entirely.
    await expect(seedDemoPlant(prisma, { end: END })).rejects.toThrow();
    expect(await prisma.subgroup.count()).toBe(before);
    expect(await prisma.site.count()).toBe(1);
  });

  test("replacing the plant deletes the old one in the same transaction", async () => {
    const replaced = await seedDemoPlant(prisma, { seed: 7, end: END, replace: true });
    expect(replaced.deletedSites).toBe(1);
    expect(await prisma.site.count()).toBe(1);
    expect(await prisma.subgroup.count()).toBe(replaced.subgroups);
    expect(await prisma.measurement.count()).toBe(replaced.measurements);
    expect(await prisma.processEvent.count()).toBe(replaced.events);
  });
});
