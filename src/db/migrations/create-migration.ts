/**
 * Writes a new migration folder holding the SQL that takes a database from the state the existing
 * migrations produce to the state the Prisma schema describes.
 *
 * The engine's own `createMigration` cannot replay the history for SQLite when driven through an adapter,
 * so this asks it for `diff` from the migrations to the schema instead; the engine replays the history
 * into an in-memory shadow database supplied by the adapter, exactly as `prisma migrate dev` does.
 */
import { mkdir, readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { openSchemaEngine } from "@/src/db/migrations/engine";
import { readMigrationList } from "@/src/db/migrations/migration-list";
import {
  LOCKFILE_NAME,
  MIGRATIONS_DIRECTORY,
  MIGRATION_SCRIPT_NAME,
  SCHEMA_FILE,
} from "@/src/db/migrations/paths";

export const ZMigrationName = z
  .string()
  .regex(/^[a-z0-9_]{1,80}$/, { error: "use 1 to 80 lowercase letters, digits or underscores, e.g. add_owner" });

export type TCreateMigrationOptions = {
  name: string;
  /** The moment used for the folder's timestamp prefix (UTC). */
  now: Date;
  migrationsDirectory?: string;
  schemaFile?: string;
};

export type TCreateMigrationResult =
  | { created: true; folder: string; script: string }
  | { created: false };

/** `YYYYMMDDHHMMSS` in UTC, the prefix Prisma gives migration folders. */
export function migrationTimestamp(now: Date): string {
  return now.toISOString().replace(/\D/g, "").slice(0, 14);
}

/** Creates `<migrations>/<timestamp>_<name>/migration.sql`, or nothing when the schema has no change. */
export async function createMigration(options: TCreateMigrationOptions): Promise<TCreateMigrationResult> {
  const name = ZMigrationName.parse(options.name);
  const migrationsDirectory = options.migrationsDirectory ?? MIGRATIONS_DIRECTORY;
  const schemaFile = options.schemaFile ?? SCHEMA_FILE;
  const migrationsList = await readMigrationList(migrationsDirectory);
  // Computing a diff touches no real database: the engine's main connection is an in-memory one.
  const opened = await openSchemaEngine(":memory:", schemaFile);
  try {
    const schemaText = await readFile(schemaFile, "utf8");
    const diff = await opened.run((engine) =>
      engine.diff({
        from: { tag: "migrations", ...migrationsList },
        to: { tag: "schemaDatamodel", files: [{ path: schemaFile, content: schemaText }] },
        script: true,
        // Exit code 2 means "there is a difference", 0 means none (as `prisma migrate diff --exit-code`).
        exitCode: true,
        filters: { externalTables: [], externalEnums: [] },
      }),
    );
    if (diff.exitCode !== 2 || !diff.stdout) return { created: false };
    const folder = path.join(migrationsDirectory, `${migrationTimestamp(options.now)}_${name}`);
    await mkdir(migrationsDirectory, { recursive: true });
    // Not recursive: an existing folder of the same name and second is an error, never overwritten.
    await mkdir(folder);
    await writeFile(path.join(folder, MIGRATION_SCRIPT_NAME), diff.stdout);
    await writeFile(path.join(migrationsDirectory, LOCKFILE_NAME), migrationsList.lockfile.content ?? "");
    return { created: true, folder, script: diff.stdout };
  } finally {
    opened.close();
  }
}
