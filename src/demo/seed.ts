/**
 * Writes the demo plant (./scenario.ts) into a database through Prisma, in one transaction so that a
 * failure leaves the database as it was. Rows go in with `createMany` in chunks; subgroup ids come back
 * from `createManyAndReturn` so measurements and tags can point at them.
 *
 * Demo accounts (one per role, with their passwords) do not exist yet: when the accounts feature adds
 * its tables, it creates those users inside this same transaction and returns their logins in
 * `SeedSummary`, which scripts/db-seed.ts and the app's start-up print once.
 */
import type { Prisma, PrismaClient } from "@/src/db/generated/client";
import { summarize } from "@/src/subgroups/summaries";
import { seedDemoLimits } from "./limits";
import { DEFAULT_DEMO_SEED, generateDemoScenario } from "./scenario";
import type { DemoCharacteristic, DemoScenario, PlantedEpisode } from "./types";

/** Rows per INSERT: well under SQLite's bound-parameter limit for tables of up to six columns. */
const ROWS_PER_STATEMENT = 1000;
/** Seeding takes a few seconds; Prisma's default 5 s transaction timeout would cut slow machines short. */
const TRANSACTION_TIMEOUT_MS = 120_000;

export interface SeedOptions {
  readonly seed?: number;
  /** When the history ends (default: now). */
  readonly end?: Date;
  /** Delete every existing site (and with it all plant data) first, in the same transaction. */
  readonly replace?: boolean;
}

export interface SeedSummary {
  readonly seed: number;
  readonly siteName: string;
  readonly start: Date;
  readonly end: Date;
  readonly processes: number;
  readonly characteristics: number;
  readonly subgroups: number;
  readonly measurements: number;
  readonly tags: number;
  readonly events: number;
  /** Limit sets frozen (v1 per characteristic, ./limits.ts) and signals stored for the history. */
  readonly limitSets: number;
  readonly signals: number;
  /** Sites deleted first (only with `replace`). */
  readonly deletedSites: number;
  readonly plantedEpisodes: readonly PlantedEpisode[];
  readonly milliseconds: number;
}

function chunks<T>(rows: readonly T[]): T[][] {
  const result: T[][] = [];
  for (let from = 0; from < rows.length; from += ROWS_PER_STATEMENT) {
    result.push(rows.slice(from, from + ROWS_PER_STATEMENT));
  }
  return result;
}

/** True when the database holds no plant: every other plant row hangs off a site. */
export async function isDatabaseEmpty(prisma: PrismaClient): Promise<boolean> {
  return (await prisma.site.count()) === 0;
}

async function writeCharacteristic(
  transaction: Prisma.TransactionClient,
  processId: number,
  characteristic: DemoCharacteristic,
): Promise<{ characteristicId: number; subgroups: number; measurements: number; tags: number }> {
  const { id: characteristicId } = await transaction.characteristic.create({
    data: {
      processId,
      name: characteristic.name,
      unit: characteristic.unit,
      chartType: characteristic.chartType,
      subgroupSize: characteristic.subgroupSize,
      target: characteristic.target,
      lowerSpecLimit: characteristic.lowerSpecLimit,
      upperSpecLimit: characteristic.upperSpecLimit,
      ruleSet: characteristic.ruleSet,
      safetyRelated: characteristic.safetyRelated,
      description: characteristic.description,
    },
    select: { id: true },
  });
  const idBySequence = new Map<number, number>();
  for (const chunk of chunks(characteristic.subgroups)) {
    const created = await transaction.subgroup.createManyAndReturn({
      data: chunk.map((subgroup) => ({
        characteristicId,
        sequence: subgroup.sequence,
        timestamp: subgroup.timestamp,
        // The cached summaries live detection reads (mean, spread, count, size), as appendSubgroups writes them.
        ...summarize(characteristic.chartType, {
          values: subgroup.values,
          count: subgroup.count ?? undefined,
          size: subgroup.size ?? undefined,
          units: subgroup.size ?? undefined,
        }),
      })),
      select: { id: true, sequence: true },
    });
    for (const row of created) idBySequence.set(row.sequence, row.id);
  }
  const subgroupId = (sequence: number): number => {
    const id = idBySequence.get(sequence);
    if (id === undefined) throw new Error(`Subgroup ${sequence} of ${characteristic.name} was not created`);
    return id;
  };
  const measurements = characteristic.subgroups.flatMap((subgroup) =>
    subgroup.values.map((value, position) => ({ subgroupId: subgroupId(subgroup.sequence), position, value })),
  );
  const tags = characteristic.subgroups.flatMap((subgroup) =>
    Object.entries(subgroup.tags).map(([key, value]) => ({ subgroupId: subgroupId(subgroup.sequence), key, value })),
  );
  for (const chunk of chunks(measurements)) await transaction.measurement.createMany({ data: chunk });
  for (const chunk of chunks(tags)) await transaction.subgroupTag.createMany({ data: chunk });
  return { characteristicId, subgroups: characteristic.subgroups.length, measurements: measurements.length, tags: tags.length };
}

async function writeScenario(transaction: Prisma.TransactionClient, scenario: DemoScenario) {
  const site = await transaction.site.create({
    data: { name: scenario.siteName, zone: scenario.siteZone, areas: { create: { name: scenario.areaName } } },
    select: { areas: { select: { id: true } } },
  });
  const areaId = site.areas[0]?.id;
  if (areaId === undefined) throw new Error("The demo area was not created");
  const processIds = new Map<string, number>();
  for (const demoProcess of scenario.processes) {
    const created = await transaction.process.create({
      data: { areaId, name: demoProcess.name, kind: demoProcess.kind },
      select: { id: true },
    });
    processIds.set(demoProcess.key, created.id);
  }
  const processId = (key: string): number => {
    const id = processIds.get(key);
    if (id === undefined) throw new Error(`The demo process ${key} was not created`);
    return id;
  };
  const totals = { subgroups: 0, measurements: 0, tags: 0 };
  const characteristicIds: number[] = [];
  for (const characteristic of scenario.characteristics) {
    const written = await writeCharacteristic(transaction, processId(characteristic.processKey), characteristic);
    characteristicIds.push(written.characteristicId);
    totals.subgroups += written.subgroups;
    totals.measurements += written.measurements;
    totals.tags += written.tags;
  }
  const events = scenario.events.map((event) => ({
    processId: processId(event.processKey),
    occurredAt: event.occurredAt,
    kind: event.kind,
    causeCategory: event.causeCategory,
    description: event.description,
    value: event.value,
    unit: event.unit,
  }));
  for (const chunk of chunks(events)) await transaction.processEvent.createMany({ data: chunk });
  return { ...totals, characteristicIds, events: events.length };
}

/**
 * Writes the demo plant for `options.seed` (default DEFAULT_DEMO_SEED) ending at `options.end` (default
 * now). Without `replace` it does not check for existing data: callers decide with `isDatabaseEmpty`,
 * and a second plant with the same site name is refused by the unique constraint (the transaction rolls
 * back).
 */
export async function seedDemoPlant(prisma: PrismaClient, options: SeedOptions = {}): Promise<SeedSummary> {
  const started = performance.now();
  const scenario = generateDemoScenario({ seed: options.seed ?? DEFAULT_DEMO_SEED, end: options.end ?? new Date() });
  const { characteristicIds, ...written } = await prisma.$transaction(
    async (transaction) => {
      const deletedSites = options.replace === true ? (await transaction.site.deleteMany()).count : 0;
      return { deletedSites, ...(await writeScenario(transaction, scenario)) };
    },
    { timeout: TRANSACTION_TIMEOUT_MS, maxWait: TRANSACTION_TIMEOUT_MS },
  );
  // Limits and signals go through the intake services, each revision in its own transaction: nested
  // interactive transactions do not exist. A failure here leaves the plant without limits, never half a plant.
  const judged = await seedDemoLimits(prisma, characteristicIds, scenario.end);
  return {
    seed: scenario.seed,
    siteName: scenario.siteName,
    start: scenario.start,
    end: scenario.end,
    processes: scenario.processes.length,
    characteristics: scenario.characteristics.length,
    ...written,
    ...judged,
    plantedEpisodes: scenario.plantedEpisodes,
    milliseconds: Math.round(performance.now() - started),
  };
}
