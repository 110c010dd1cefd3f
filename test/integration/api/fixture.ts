/**
 * The plant the API tests work on: a fresh database (test/integration/intake/database.ts) with an X-bar and
 * R characteristic (subgroups of 5) and a p chart (samples of 200), and the route handlers pointed at it.
 * Measurements are invented, deterministic values around a 2.00 mm wall. The CSV import routes get their
 * own database (`registerImportRoutesDatabase`).
 */
import { afterAll, beforeAll, expect, vi } from "vitest";
import { setApiDatabaseForTests } from "@/src/api/database";
import { createCharacteristic } from "@/src/characteristics/setup";
import { environment } from "@/src/config/env";
import { openImportTestDatabase, type TImportHarness } from "@/test/integration/imports/harness";
import { registerTestDatabase, type TTestDatabase } from "@/test/integration/intake/database";

export interface TApiFixture extends TTestDatabase {
  readonly wallId: number;
  readonly shortShotsId: number;
}

export function registerApiFixture(label: string): () => Promise<TApiFixture> {
  const openDatabase = registerTestDatabase(label);
  afterAll(() => setApiDatabaseForTests(undefined));
  return async () => {
    const database = await openDatabase();
    setApiDatabaseForTests(database.db);
    const wall = await createCharacteristic(database.db, {
      processId: database.processId,
      name: "Wall thickness",
      unit: "mm",
      chartType: "xbar-r",
      subgroupSize: 5,
      lowerSpecLimit: 1.8,
      upperSpecLimit: 2.2,
    });
    const shortShots = await createCharacteristic(database.db, {
      processId: database.processId,
      name: "Short shots",
      unit: "parts",
      chartType: "p",
      subgroupSize: 200,
    });
    return { ...database, wallId: wall.id, shortShotsId: shortShots.id };
  };
}

/**
 * The database of the CSV import routes: a fresh file (test/integration/imports/harness.ts), with the route
 * handlers' Prisma client and DATABASE_URL both pointed at it. The import routes open their own SQLite
 * connection and keep rejected-rows files beside the database, both found through the environment
 * (src/config/env.ts), which is read once per test file; so this must run before any handler of the file.
 */
export function registerImportRoutesDatabase(label: string): TImportHarness {
  const harness = openImportTestDatabase(label);
  beforeAll(() => {
    setApiDatabaseForTests(harness.prisma);
    vi.stubEnv("DATABASE_URL", `file:${harness.databaseFile}`);
    expect(environment().databaseFile).toBe(harness.databaseFile);
  });
  afterAll(() => {
    setApiDatabaseForTests(undefined);
    vi.unstubAllEnvs();
  });
  return harness;
}

const OFFSETS = [-0.02, -0.01, 0, 0.01, 0.02];

/** Subgroup `index` of an in-control wall: five values around 2.00 mm whose level and range vary a little. */
export function wallSubgroup(index: number, timestamp: string) {
  const scale = 1 + (index % 3) * 0.5;
  const level = 2 + ((index % 4) - 1.5) * 0.002;
  return { timestamp, values: OFFSETS.map((_, position) => Number((level + OFFSETS[(index + position) % 5]! * scale).toFixed(4))) };
}

/** An ISO instant `minutes` after 06:00 on 1 March 2026 (UTC). */
export function minutesIn(minutes: number): string {
  return new Date(Date.UTC(2026, 2, 1, 6, minutes)).toISOString();
}
