/**
 * Writes a new migration folder holding the SQL that takes a database from the state the existing
 * migrations produce to the state the Prisma schema describes.
 *
 * The engine's own `createMigration` cannot replay the history for SQLite when driven through an adapter
 * (it wants a shadow database it is not given), so this asks for `diff` from the migrations directory to
 * the schema instead, which replays the history into the adapter's in-memory shadow database.
 */
import { mkdir, writeFile } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { diffToSchema } from "@/src/db/migrations/diff";
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
  const script = await diffToSchema({ tag: "migrations", ...migrationsList }, schemaFile);
  if (script === null) return { created: false };
  const folder = path.join(migrationsDirectory, `${migrationTimestamp(options.now)}_${name}`);
  await mkdir(migrationsDirectory, { recursive: true });
  // Not recursive: an existing folder of the same name and second is an error, never overwritten.
  await mkdir(folder);
  await writeFile(path.join(folder, MIGRATION_SCRIPT_NAME), script);
  await writeFile(path.join(migrationsDirectory, LOCKFILE_NAME), migrationsList.lockfile.content ?? "");
  return { created: true, folder, script };
}
