// `npm run db:prepare`, run as the separate process it is before `next start`: a fresh database is migrated
// and seeded once; a second start keeps the data; unusable files and paths give one clear paragraph on
// stderr, exit code 1, no stack trace, and leave the file as it was.
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, test } from "vitest";
import { runDatabaseScript, type TScriptOutcome } from "@/test/integration/db/run-script";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();
const PREPARE = "scripts/db-prepare.ts";

function countRows(databaseFile: string): Record<string, number> {
  const database = new Database(databaseFile, { readonly: true });
  try {
    const count = (table: string) => database.prepare(`SELECT COUNT(*) FROM "${table}"`).pluck().get() as number;
    return { sites: count("Site"), characteristics: count("Characteristic"), subgroups: count("Subgroup"), history: count("_prisma_migrations") };
  } finally {
    database.close();
  }
}

/** One paragraph naming the file, and none of the lines a stack trace is made of. */
function expectClearFailure(outcome: TScriptOutcome, databaseFile: string, reason: RegExp): void {
  expect(outcome.exitCode).toBe(1);
  expect(outcome.stderr).toContain(databaseFile);
  expect(outcome.stderr).toMatch(reason);
  expect(outcome.stderr).toMatch(/DATABASE_URL/);
  expect(outcome.stderr).not.toMatch(/^\s+at /m);
  expect(outcome.stderr.trim().split("\n")).toHaveLength(1);
}

describe("db:prepare", () => {
  test("migrates and seeds a new database once; a second start keeps the data as it is", async () => {
    const databaseFile = path.join(temporaryDirectory("prepare"), "data", "assignable.db");

    const first = await runDatabaseScript(PREPARE, `file:${databaseFile}`);
    expect(first.stderr).toBe("");
    expect(first.exitCode).toBe(0);
    expect(first.stdout).toMatch(/seeded the demo plant/);
    const afterFirst = countRows(databaseFile);
    expect(afterFirst.sites).toBeGreaterThan(0);
    expect(afterFirst.subgroups).toBeGreaterThan(0);

    const second = await runDatabaseScript(PREPARE, `file:${databaseFile}`);
    expect(second.exitCode).toBe(0);
    expect(second.stdout).toMatch(/no pending migrations; existing data kept/);
    expect(countRows(databaseFile)).toEqual(afterFirst);
  });

  test("a file that is not a SQLite database is reported and left untouched", async () => {
    const databaseFile = path.join(temporaryDirectory("corrupt"), "assignable.db");
    // Deterministic non-database bytes: a text pattern where SQLite expects its 100-byte header.
    const bytes = Buffer.from("these bytes are not a SQLite database file. ".repeat(200));
    writeFileSync(databaseFile, bytes);

    const outcome = await runDatabaseScript(PREPARE, `file:${databaseFile}`);

    expectClearFailure(outcome, databaseFile, /not a SQLite database/);
    expect(readFileSync(databaseFile).equals(bytes)).toBe(true);
  });

  test("a path under an existing file is reported", async () => {
    const directory = temporaryDirectory("not-directory");
    writeFileSync(path.join(directory, "plain-file"), "a file where a directory should be\n");
    const databaseFile = path.join(directory, "plain-file", "data", "assignable.db");

    expectClearFailure(await runDatabaseScript(PREPARE, `file:${databaseFile}`), databaseFile, /existing file, not a directory/);
  });

  test("a directory that cannot be created is reported", async () => {
    // The kernel's process file system refuses new directories, even for root (tests may run as root,
    // for whom permission bits are no obstacle).
    const databaseFile = "/proc/assignable-test/assignable.db";

    expectClearFailure(await runDatabaseScript(PREPARE, `file:${databaseFile}`), databaseFile, /cannot be created/);
  });

  test("a DATABASE_URL that is not a file URL is reported", async () => {
    const outcome = await runDatabaseScript(PREPARE, "postgres://localhost/assignable");
    expect(outcome.exitCode).toBe(1);
    expect(outcome.stderr).toMatch(/DATABASE_URL must be a SQLite file URL/);
    expect(outcome.stderr).not.toMatch(/^\s+at /m);
  });
});
