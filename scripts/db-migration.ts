// npm run db:migration -- <name>: writes prisma/migrations/<timestamp>_<name>/migration.sql for the
// difference between the existing migrations and prisma/schema.prisma, or nothing when there is none.
import path from "node:path";
import { createMigration } from "@/src/db/migrations/create-migration";
import { runScript } from "@/src/db/script-runner";

await runScript(async () => {
  const name = process.argv[2];
  if (name === undefined || process.argv.length > 3) {
    console.error("Usage: npm run db:migration -- <name>   (lowercase letters, digits and underscores)");
    process.exitCode = 1;
    return;
  }
  const result = await createMigration({ name, now: new Date() });
  console.log(
    result.created
      ? `Created ${path.relative(process.cwd(), result.folder)}/migration.sql; apply it with npm run db:migrate.`
      : "The schema matches the existing migrations: no migration written.",
  );
});
