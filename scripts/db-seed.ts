// npm run db:seed -- [--seed <n>] [--end <ISO time>] [--force]: applies pending migrations to the
// DATABASE_URL database and writes the demo plant into it when it holds no plant yet. With --force, the
// existing plant data (every site, and with it its processes, characteristics, subgroups and events) is
// deleted first, in the same transaction as the new plant is written, so the demo starts afresh.
import { parseArgs } from "node:util";
import { z } from "zod";
import { environment } from "@/src/config/env";
import { createPrismaClient } from "@/src/db/connect";
import { checkDatabaseFile } from "@/src/db/database-file";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { runScript } from "@/src/db/script-runner";
import { DEFAULT_DEMO_SEED } from "@/src/demo/scenario";
import { isDatabaseEmpty, seedDemoPlant, type SeedSummary } from "@/src/demo/seed";

const ZSeedArguments = z.object({
  seed: z.coerce
    .number({ error: "--seed must be a whole number" })
    .int({ error: "--seed must be a whole number" })
    .min(0, { error: "--seed must be 0 or more" })
    .max(0xffff_ffff, { error: "--seed must be below 2^32" })
    .default(DEFAULT_DEMO_SEED),
  end: z.coerce.date({ error: "--end must be a date and time, e.g. 2026-11-30T18:00:00Z" }).optional(),
  force: z.boolean().default(false),
});

function printSummary(summary: SeedSummary): void {
  console.log(
    [
      ...(summary.deletedSites > 0 ? [`Deleted ${summary.deletedSites} existing site(s) and all their data.`] : []),
      `Seeded "${summary.siteName}" (seed ${summary.seed}) in ${summary.milliseconds} ms:`,
      `  history ${summary.start.toISOString()} .. ${summary.end.toISOString()}`,
      `  ${summary.processes} processes, ${summary.characteristics} characteristics, ${summary.subgroups} subgroups,`,
      `  ${summary.measurements} measurements, ${summary.tags} subgroup tags, ${summary.events} process events.`,
      "  Planted episodes (subgroup sequence numbers):",
      ...summary.plantedEpisodes.map(
        (episode) => `    ${episode.kind} in ${episode.characteristic} ${episode.first}..${episode.last}`,
      ),
      // Demo accounts arrive with the accounts feature; their logins will be printed here.
      "  Demo accounts: none yet (accounts are not part of this version).",
    ].join("\n"),
  );
}

await runScript(async () => {
  const { values } = parseArgs({
    options: { seed: { type: "string" }, end: { type: "string" }, force: { type: "boolean" } },
    strict: true,
  });
  const options = ZSeedArguments.parse(values);
  const { databaseFile } = environment();
  await checkDatabaseFile(databaseFile);
  await applyMigrations({ databaseFile });
  const prisma = createPrismaClient(`file:${databaseFile}`);
  try {
    if (!options.force && !(await isDatabaseEmpty(prisma))) {
      console.log(`Database ${databaseFile} already holds a plant; nothing seeded (use --force to start afresh).`);
      return;
    }
    printSummary(await seedDemoPlant(prisma, { seed: options.seed, end: options.end, replace: options.force }));
  } finally {
    await prisma.$disconnect();
  }
});
