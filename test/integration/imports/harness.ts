/**
 * A freshly migrated SQLite file per test file, a characteristic to import into, and the import run on
 * CSV text delivered in small chunks (so chunk boundaries fall inside cells, lines and UTF-8 characters,
 * as they do when a large upload streams in).
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import type Database from "better-sqlite3";
import { afterAll, beforeAll } from "vitest";
import type { ChartType } from "@/shared/constants";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { importCsv, type TImportResult } from "@/src/imports/import-csv";
import type { TImportOptionsInput } from "@/src/imports/options";
import { openImportDatabase } from "@/src/imports/write";

export interface TImportHarness {
  readonly prisma: PrismaClient;
  readonly sqlite: Database.Database;
  readonly databaseFile: string;
}

/** Registers beforeAll/afterAll hooks; the returned object is filled before the first test runs. */
export function openImportTestDatabase(label: string): TImportHarness {
  const harness = {} as { prisma: PrismaClient; sqlite: Database.Database; databaseFile: string };
  const directory = mkdtempSync(path.join(os.tmpdir(), `assignable-import-${label}-`));
  beforeAll(async () => {
    harness.databaseFile = path.join(directory, "assignable.db");
    await applyMigrations({ databaseFile: harness.databaseFile });
    harness.prisma = createPrismaClient(`file:${harness.databaseFile}`);
    harness.sqlite = openImportDatabase(harness.databaseFile);
  });
  afterAll(async () => {
    harness.sqlite.close();
    await harness.prisma.$disconnect();
    rmSync(directory, { recursive: true, force: true });
  });
  return harness;
}

let processCounter = 0;

/** A new characteristic (in a new process) with no limits yet, at a site in `zone`. */
export async function createTestCharacteristic(prisma: PrismaClient, chartType: ChartType, subgroupSize: number, zone = "UTC"): Promise<number> {
  processCounter += 1;
  const name = zone === "UTC" ? "Test site" : `Test site in ${zone}`;
  const site = await prisma.site.upsert({ where: { name }, update: {}, create: { name, zone } });
  const area = await prisma.area.upsert({ where: { siteId_name: { siteId: site.id, name: "Hall" } }, update: {}, create: { siteId: site.id, name: "Hall" } });
  const process = await prisma.process.create({ data: { areaId: area.id, name: `Press ${processCounter}`, kind: "injection-moulding press" } });
  const characteristic = await prisma.characteristic.create({
    data: { processId: process.id, name: `Characteristic ${processCounter}`, unit: "mm", chartType, subgroupSize, ruleSet: "nelson" },
  });
  return characteristic.id;
}

/** Bytes in chunks of `chunkSize`, as a stream would deliver them. */
export async function* chunked(bytes: Uint8Array, chunkSize = 7): AsyncGenerator<Uint8Array> {
  for (let start = 0; start < bytes.length; start += chunkSize) yield bytes.subarray(start, start + chunkSize);
}

export const NOW = new Date("2026-12-01T12:00:00Z");

export function runImport(
  harness: TImportHarness,
  characteristicId: number,
  csv: string | Uint8Array,
  options: Partial<TImportOptionsInput> & Pick<TImportOptionsInput, "mapping">,
): Promise<TImportResult> {
  const bytes = typeof csv === "string" ? new TextEncoder().encode(csv) : csv;
  return importCsv(harness.prisma, harness.sqlite, {
    characteristicId,
    source: chunked(bytes),
    options: { fileName: "readings.csv", ...options },
    now: NOW,
  });
}

/** Row counts of every table an import writes. */
export async function tableCounts(prisma: PrismaClient) {
  return {
    subgroups: await prisma.subgroup.count(),
    measurements: await prisma.measurement.count(),
    tags: await prisma.subgroupTag.count(),
    batches: await prisma.importBatch.count(),
    signals: await prisma.signal.count(),
    evaluations: await prisma.signalEvaluation.count(),
  };
}
