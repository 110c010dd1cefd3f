// Applying migrations records them in Prisma's standard history table, with the checksums Prisma computes,
// and a second run applies nothing and changes nothing.
import { createHash } from "node:crypto";
import { mkdirSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, test } from "vitest";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { MIGRATIONS_DIRECTORY } from "@/src/db/migrations/paths";
import { describeDatabase } from "@/test/integration/db/sqlite-structure";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();

type THistoryRow = {
  migration_name: string;
  checksum: string;
  finished_at: string | null;
  rolled_back_at: string | null;
  applied_steps_count: number;
};

function readHistory(databaseFile: string): { columns: string[]; rows: THistoryRow[] } {
  const database = new Database(databaseFile, { readonly: true });
  try {
    const columns = (database.pragma('table_info("_prisma_migrations")') as { name: string }[]).map((column) => column.name);
    const rows = database.prepare("SELECT * FROM _prisma_migrations ORDER BY migration_name").all() as THistoryRow[];
    return { columns, rows };
  } finally {
    database.close();
  }
}

describe("applying migrations", () => {
  test("records each folder once with its SHA-256 checksum, and a second run is a no-op", async () => {
    const databaseFile = path.join(temporaryDirectory("apply"), "nested", "assignable.db");
    const folders = readdirSync(MIGRATIONS_DIRECTORY, { withFileTypes: true })
      .filter((entry) => entry.isDirectory())
      .map((entry) => entry.name)
      .sort();
    expect(folders.length).toBeGreaterThan(0);

    mkdirSync(path.dirname(databaseFile), { recursive: true });
    expect(await applyMigrations({ databaseFile })).toEqual(folders);
    const structureAfterFirst = describeDatabase(databaseFile);
    const historyAfterFirst = readHistory(databaseFile);

    // The columns of Prisma's migration history table (Prisma documentation, "About the migration history",
    // from memory), so that `prisma migrate deploy` reads this history as its own.
    expect([...historyAfterFirst.columns].sort()).toEqual(
      ["applied_steps_count", "checksum", "finished_at", "id", "logs", "migration_name", "rolled_back_at", "started_at"].sort(),
    );
    expect(historyAfterFirst.rows.map((row) => row.migration_name)).toEqual(folders);
    for (const row of historyAfterFirst.rows) {
      const script = readFileSync(path.join(MIGRATIONS_DIRECTORY, row.migration_name, "migration.sql"));
      expect(row.checksum).toBe(createHash("sha256").update(script).digest("hex"));
      expect(row.finished_at).not.toBeNull();
      expect(row.rolled_back_at).toBeNull();
      expect(row.applied_steps_count).toBe(1);
    }

    expect(await applyMigrations({ databaseFile })).toEqual([]);
    expect(readHistory(databaseFile)).toEqual(historyAfterFirst);
    expect(describeDatabase(databaseFile)).toEqual(structureAfterFirst);
  });
});
