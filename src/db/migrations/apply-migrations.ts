/**
 * Applies the pending migration folders to a database, as `prisma migrate deploy` does: each script runs
 * once, in folder-name order, and is recorded in `_prisma_migrations` with the SHA-256 checksum of its
 * text. Already-applied migrations are skipped, so running it again changes nothing.
 */
import { openSchemaEngine } from "@/src/db/migrations/engine";
import { readMigrationList } from "@/src/db/migrations/migration-list";
import { MIGRATIONS_DIRECTORY, SCHEMA_FILE } from "@/src/db/migrations/paths";

export type TApplyMigrationsOptions = {
  /** Absolute path of the SQLite file; created when missing. */
  databaseFile: string;
  migrationsDirectory?: string;
  schemaFile?: string;
};

/** Returns the names of the migrations applied by this call (empty when the database was up to date). */
export async function applyMigrations(options: TApplyMigrationsOptions): Promise<string[]> {
  const migrationsList = await readMigrationList(options.migrationsDirectory ?? MIGRATIONS_DIRECTORY);
  const opened = await openSchemaEngine(options.databaseFile, options.schemaFile ?? SCHEMA_FILE);
  try {
    const output = await opened.run((engine) =>
      engine.applyMigrations({ migrationsList, filters: { externalTables: [], externalEnums: [] } }),
    );
    return output.appliedMigrationNames;
  } finally {
    await opened.close();
  }
}
