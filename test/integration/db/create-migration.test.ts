// Creating a migration after a schema edit: a new standard folder appears with the SQL of the change, the
// folder applies on top of the existing ones, and the result again matches the edited schema.
import { cpSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, test } from "vitest";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { createMigration } from "@/src/db/migrations/create-migration";
import { diffToSchema } from "@/src/db/migrations/diff";
import { MIGRATIONS_DIRECTORY, SCHEMA_FILE } from "@/src/db/migrations/paths";
import { describeDatabase, executeScript } from "@/test/integration/db/sqlite-structure";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();

/** A copy of the repository's schema and migrations in a temporary directory, to edit freely. */
function copyProject(label: string): { schemaFile: string; migrationsDirectory: string; directory: string } {
  const directory = temporaryDirectory(label);
  const schemaFile = path.join(directory, "schema.prisma");
  const migrationsDirectory = path.join(directory, "migrations");
  cpSync(SCHEMA_FILE, schemaFile);
  cpSync(MIGRATIONS_DIRECTORY, migrationsDirectory, { recursive: true });
  return { schemaFile, migrationsDirectory, directory };
}

function editSchema(schemaFile: string, edit: (text: string) => string): void {
  const before = readFileSync(schemaFile, "utf8");
  const after = edit(before);
  expect(after).not.toBe(before);
  writeFileSync(schemaFile, after);
}

const NOW = new Date("2027-03-04T05:06:07Z");

describe("creating a migration", () => {
  test("an added column and an added model give a new folder that applies and matches the schema", async () => {
    const project = copyProject("create");
    editSchema(project.schemaFile, (text) =>
      text
        .replace("model Site {\n", "model Site {\n  timeZone  String?\n")
        .concat("\nmodel Shift {\n  id   Int    @id @default(autoincrement())\n  name String @unique\n}\n"),
    );
    const existing = readdirSync(project.migrationsDirectory);

    const result = await createMigration({ name: "add_shift", now: NOW, ...project });

    expect(result.created).toBe(true);
    const folders = readdirSync(project.migrationsDirectory);
    expect(folders.filter((name) => !existing.includes(name))).toEqual(["20270304050607_add_shift"]);
    const script = readFileSync(path.join(project.migrationsDirectory, "20270304050607_add_shift", "migration.sql"), "utf8");
    expect(script).toContain('ALTER TABLE "Site" ADD COLUMN "timeZone" TEXT;');
    expect(script).toContain('CREATE TABLE "Shift"');
    expect(script).toContain('CREATE UNIQUE INDEX "Shift_name_key"');
    expect(readFileSync(path.join(project.migrationsDirectory, "migration_lock.toml"), "utf8")).toContain('provider = "sqlite"');

    const databaseFile = path.join(project.directory, "migrated.db");
    const applied = await applyMigrations({ databaseFile, ...project });
    expect(applied).toEqual(folders.filter((name) => name !== "migration_lock.toml").sort());

    const referenceFile = path.join(project.directory, "reference.db");
    executeScript(referenceFile, (await diffToSchema({ tag: "empty" }, project.schemaFile))!);
    expect(describeDatabase(databaseFile)).toEqual(describeDatabase(referenceFile));
    expect(describeDatabase(databaseFile).map((table) => table.name)).toContain("Shift");
  });

  test("an unchanged schema writes nothing", async () => {
    const project = copyProject("unchanged");
    const before = readdirSync(project.migrationsDirectory);
    const result = await createMigration({ name: "nothing", now: NOW, ...project });
    expect(result).toEqual({ created: false });
    expect(readdirSync(project.migrationsDirectory)).toEqual(before);
  });

  test.each([["Add-Shift"], ["add shift"], [""], ["../escape"]])("the name %j is refused before anything is written", async (name) => {
    const project = copyProject("bad-name");
    editSchema(project.schemaFile, (text) => text.replace("model Site {\n", "model Site {\n  timeZone  String?\n"));
    const before = readdirSync(project.migrationsDirectory);
    await expect(createMigration({ name, now: NOW, ...project })).rejects.toThrow(/lowercase letters, digits or underscores/);
    expect(readdirSync(project.migrationsDirectory)).toEqual(before);
  });
});
