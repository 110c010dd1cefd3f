/** Reads the migrations directory into the engine's `MigrationList` (folders in name order, lock file). */
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import type { MigrationDirectory, MigrationList } from "@prisma/schema-engine-wasm";
import { LOCKFILE_CONTENT, LOCKFILE_NAME, MIGRATION_SCRIPT_NAME } from "@/src/db/migrations/paths";

async function readTextIfPresent(file: string): Promise<string | null> {
  try {
    return await readFile(file, "utf8");
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw error;
  }
}

/**
 * The migration folders under `migrationsDirectory` (a missing directory means no migrations). With no lock
 * file yet, the engine is told the provider it is about to be written with, since it refuses to guess.
 */
export async function readMigrationList(migrationsDirectory: string): Promise<MigrationList> {
  const entries = await readdir(migrationsDirectory, { withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
    if (error.code === "ENOENT") return [];
    throw error;
  });
  const folders = entries
    .filter((entry) => entry.isDirectory())
    .map((entry) => entry.name)
    .sort();
  const migrationDirectories: MigrationDirectory[] = await Promise.all(
    folders.map(async (folder) => {
      const script = await readTextIfPresent(path.join(migrationsDirectory, folder, MIGRATION_SCRIPT_NAME));
      return {
        path: folder,
        migrationFile: {
          path: MIGRATION_SCRIPT_NAME,
          content:
            script === null
              ? { tag: "error" as const, value: `${MIGRATION_SCRIPT_NAME} is missing in ${folder}` }
              : { tag: "ok" as const, value: script },
        },
      };
    }),
  );
  const lockfile = await readTextIfPresent(path.join(migrationsDirectory, LOCKFILE_NAME));
  return {
    baseDir: migrationsDirectory,
    lockfile: { path: LOCKFILE_NAME, content: lockfile ?? LOCKFILE_CONTENT },
    shadowDbInitScript: "",
    migrationDirectories,
  };
}
