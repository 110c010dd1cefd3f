/**
 * A freshly migrated SQLite file per test file (the migrations the app applies), with one site, area and
 * process to hang characteristics on, and row counts for "nothing was written" checks.
 */
import path from "node:path";
import { afterAll } from "vitest";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

export interface TTestDatabase {
  readonly db: PrismaClient;
  readonly processId: number;
}

export function registerTestDatabase(label: string): () => Promise<TTestDatabase> {
  const temporaryDirectory = registerTemporaryDirectories();
  const clients: PrismaClient[] = [];
  afterAll(async () => {
    for (const client of clients) await client.$disconnect();
  });
  return async () => {
    const databaseFile = path.join(temporaryDirectory(label), "intake.db");
    await applyMigrations({ databaseFile });
    const db = createPrismaClient(`file:${databaseFile}`);
    clients.push(db);
    const site = await db.site.create({
      data: { name: "Test site", areas: { create: { name: "Moulding", processes: { create: { name: "Press A", kind: "injection-moulding press" } } } } },
      select: { areas: { select: { processes: { select: { id: true } } } } },
    });
    return { db, processId: site.areas[0]!.processes[0]!.id };
  };
}

/** Rows in every table intake writes to. */
export async function rowCounts(db: PrismaClient) {
  return {
    characteristics: await db.characteristic.count(),
    subgroups: await db.subgroup.count(),
    measurements: await db.measurement.count(),
    tags: await db.subgroupTag.count(),
    limitSets: await db.limitSet.count(),
    exclusions: await db.limitExclusion.count(),
    signals: await db.signal.count(),
    corrections: await db.correction.count(),
    evaluations: await db.signalEvaluation.count(),
    events: await db.processEvent.count(),
  };
}
