/**
 * The SQL script that takes a database from a starting state (no tables, or the state a migrations
 * directory produces) to the state the Prisma schema describes, as computed by the schema engine.
 */
import { readFile } from "node:fs/promises";
import type { DiffTarget } from "@prisma/schema-engine-wasm";
import { openSchemaEngine } from "@/src/db/migrations/engine";

/**
 * Returns the script, or null when the starting state already matches the schema. `databaseFile` is the
 * engine's main connection, read only when `from` is `schemaDatasource` (the live database).
 */
export async function diffToSchema(from: DiffTarget, schemaFile: string, databaseFile = ":memory:"): Promise<string | null> {
  const schemaText = await readFile(schemaFile, "utf8");
  // When `from` is a migrations directory, the engine replays it into the adapter's in-memory shadow database.
  const opened = await openSchemaEngine(databaseFile, schemaFile);
  try {
    const diff = await opened.run((engine) =>
      engine.diff({
        from,
        to: { tag: "schemaDatamodel", files: [{ path: schemaFile, content: schemaText }] },
        script: true,
        // Exit code 2 means "there is a difference", 0 none (as `prisma migrate diff --exit-code`).
        exitCode: true,
        filters: { externalTables: [], externalEnums: [] },
      }),
    );
    return diff.exitCode === 2 && diff.stdout ? diff.stdout : null;
  } finally {
    await opened.close();
  }
}
