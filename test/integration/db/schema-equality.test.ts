// A fresh database migrated by `npm run db:migrate` has exactly the structure the Prisma schema describes.
// Two independent readings of "what the schema describes" are compared with the migrated file:
// (1) the schema engine's script from an empty database to the schema, applied to a second file, both files
//     read through SQLite's pragmas; (2) the engine's own diff from the live migrated database to the schema.
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, test } from "vitest";
import { diffToSchema } from "@/src/db/migrations/diff";
import { SCHEMA_FILE } from "@/src/db/migrations/paths";
import { runDatabaseScript } from "@/test/integration/db/run-script";
import { describeDatabase, executeScript } from "@/test/integration/db/sqlite-structure";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();

describe("schema equality", () => {
  test("the migrated database has the tables, columns, keys and indexes of the Prisma schema", async () => {
    const directory = temporaryDirectory("schema");
    const migratedFile = path.join(directory, "migrated.db");
    const referenceFile = path.join(directory, "reference.db");

    const outcome = await runDatabaseScript("scripts/db-migrate.ts", `file:${migratedFile}`);
    expect(outcome.stderr).toBe("");
    expect(outcome.exitCode).toBe(0);

    const creationScript = await diffToSchema({ tag: "empty" }, SCHEMA_FILE);
    expect(creationScript).not.toBeNull();
    executeScript(referenceFile, creationScript!);

    const migrated = describeDatabase(migratedFile);
    expect(migrated).toEqual(describeDatabase(referenceFile));

    // Guard against comparing two empty databases: every model of the schema is a table.
    const modelNames = [...readFileSync(SCHEMA_FILE, "utf8").matchAll(/^model (\w+) \{/gm)].map((match) => match[1]);
    expect(modelNames.length).toBeGreaterThan(0);
    expect(migrated.map((table) => table.name).sort()).toEqual([...modelNames].sort());

    const remaining = await diffToSchema(
      { tag: "schemaDatasource", files: [{ path: SCHEMA_FILE, content: readFileSync(SCHEMA_FILE, "utf8") }], configDir: process.cwd() },
      SCHEMA_FILE,
      migratedFile,
    );
    expect(remaining).toBeNull();
  });

  test("the comparison notices a missing column", async () => {
    const directory = temporaryDirectory("schema-drift");
    const referenceFile = path.join(directory, "reference.db");
    const driftedFile = path.join(directory, "drifted.db");
    const creationScript = (await diffToSchema({ tag: "empty" }, SCHEMA_FILE))!;
    executeScript(referenceFile, creationScript);
    executeScript(driftedFile, creationScript);
    executeScript(driftedFile, 'ALTER TABLE "Characteristic" DROP COLUMN "description";');
    expect(describeDatabase(driftedFile)).not.toEqual(describeDatabase(referenceFile));
  });
});
