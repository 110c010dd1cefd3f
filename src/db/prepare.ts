/**
 * Makes the database ready for the app: the file is usable, every migration is applied, and an empty
 * database receives the demo plant. Run by `npm run db:prepare` before `next start` / `next dev`; a second
 * run finds the migrations applied and the data present, and changes nothing.
 */
import { checkDatabaseFile } from "@/src/db/database-file";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";

/** What fills an empty database (the demo plant in the app; passed in so this layer does not depend on it). */
export type TSeeder<TSummary> = {
  isDatabaseEmpty(prisma: PrismaClient): Promise<boolean>;
  seed(prisma: PrismaClient): Promise<TSummary>;
};

export type TPrepareResult<TSummary> = {
  appliedMigrations: string[];
  /** The seeder's summary when this run seeded, undefined when the database already held data. */
  seeded: TSummary | undefined;
};

export async function prepareDatabase<TSummary>(
  databaseFile: string,
  seeder: TSeeder<TSummary>,
): Promise<TPrepareResult<TSummary>> {
  await checkDatabaseFile(databaseFile);
  const appliedMigrations = await applyMigrations({ databaseFile });
  const prisma = createPrismaClient(`file:${databaseFile}`);
  try {
    const seeded = (await seeder.isDatabaseEmpty(prisma)) ? await seeder.seed(prisma) : undefined;
    return { appliedMigrations, seeded };
  } finally {
    await prisma.$disconnect();
  }
}
