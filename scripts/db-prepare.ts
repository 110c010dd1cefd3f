// npm run db:prepare (run by `npm start` and `npm run dev`): checks the DATABASE_URL file, applies pending
// migrations and seeds the demo plant into an empty database. Unusable files get a one-paragraph message.
import { environment } from "@/src/config/env";
import { prepareDatabase } from "@/src/db/prepare";
import { runScript } from "@/src/db/script-runner";
import { isDatabaseEmpty, seedDemoPlant } from "@/src/demo/seed";

await runScript(async () => {
  const { databaseFile } = environment();
  const result = await prepareDatabase(databaseFile, { isDatabaseEmpty, seed: (prisma) => seedDemoPlant(prisma) });
  const migrations =
    result.appliedMigrations.length === 0 ? "no pending migrations" : `applied ${result.appliedMigrations.join(", ")}`;
  const data = result.seeded === undefined ? "existing data kept" : "seeded the demo plant";
  console.log(`Database ${databaseFile}: ${migrations}; ${data}.`);
});
