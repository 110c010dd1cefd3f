// npm run db:migrate: applies pending migrations in prisma/migrations to the DATABASE_URL database.
import { environment } from "@/src/config/env";
import { checkDatabaseFile } from "@/src/db/database-file";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { runScript } from "@/src/db/script-runner";

await runScript(async () => {
  const { databaseFile } = environment();
  await checkDatabaseFile(databaseFile);
  const applied = await applyMigrations({ databaseFile });
  console.log(
    applied.length === 0
      ? `Database ${databaseFile} is up to date.`
      : `Applied ${applied.length} migration(s) to ${databaseFile}: ${applied.join(", ")}.`,
  );
});
