// A site's time zone: existing databases get UTC from the migration, the setting is validated on the
// server (a refused zone changes nothing), and pages find the zone of a process through its site.
import { cpSync, mkdirSync, readdirSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, test } from "vitest";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { MIGRATIONS_DIRECTORY } from "@/src/db/migrations/paths";
import { isAppError } from "@/src/errors";
import { setSiteZone, siteZones, zoneOfProcess } from "@/src/sites/zone";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";
import { registerTestDatabase } from "@/test/integration/intake/database";

const temporaryDirectory = registerTemporaryDirectories();
const testDatabase = registerTestDatabase("site-zone");
const ZONE_MIGRATION = "20261202043056_site_zone";

describe("the site_zone migration", () => {
  test("a site stored before the migration gets UTC and keeps its areas and processes", async () => {
    const directory = temporaryDirectory("zone-migration");
    const earlier = path.join(directory, "migrations");
    mkdirSync(earlier);
    // Every migration up to (not including) the zone migration, as a database made before it has them.
    for (const entry of readdirSync(MIGRATIONS_DIRECTORY)) {
      if (entry < ZONE_MIGRATION) cpSync(path.join(MIGRATIONS_DIRECTORY, entry), path.join(earlier, entry), { recursive: true });
    }
    const databaseFile = path.join(directory, "before.db");
    expect(await applyMigrations({ databaseFile, migrationsDirectory: earlier })).not.toContain(ZONE_MIGRATION);
    const before = new Database(databaseFile);
    before.exec(`INSERT INTO "Site" ("name") VALUES ('Older plant');
      INSERT INTO "Area" ("siteId", "name") VALUES (1, 'Hall');
      INSERT INTO "Process" ("areaId", "name", "kind") VALUES (1, 'Press', 'press');`);
    before.close();

    expect(await applyMigrations({ databaseFile })).toEqual([ZONE_MIGRATION]);
    const after = new Database(databaseFile, { readonly: true });
    try {
      expect(after.prepare(`SELECT "name", "zone" FROM "Site"`).all()).toEqual([{ name: "Older plant", zone: "UTC" }]);
      expect(after.prepare(`SELECT COUNT(*) AS count FROM "Area" JOIN "Process" ON "Process"."areaId" = "Area"."id"`).get()).toEqual({ count: 1 });
      expect(after.pragma("foreign_key_check")).toEqual([]);
    } finally {
      after.close();
    }
  });
});

describe("setting a site's zone", () => {
  test("a new site is in UTC; a known zone is stored and found through the process", async () => {
    const { db, processId } = await testDatabase();
    expect(await zoneOfProcess(db, processId)).toBe("UTC");
    const [site] = await siteZones(db);
    expect(site).toMatchObject({ name: "Test site", zone: "UTC", processIds: [processId] });
    expect(await setSiteZone(db, { siteId: site!.id, zone: " Europe/Vienna " })).toEqual({ id: site!.id, name: "Test site", zone: "Europe/Vienna" });
    expect(await zoneOfProcess(db, processId)).toBe("Europe/Vienna");
  });

  test.each([
    { zone: "Europe/Atlantis", message: 'The site time zone is not valid: zone must be an IANA time zone name such as "Europe/London", or "UTC".' },
    { zone: "CEST", message: 'The site time zone is not valid: zone must be an IANA time zone name such as "Europe/London", or "UTC".' },
    { zone: "", message: 'The site time zone is not valid: zone must be an IANA time zone name such as "Europe/London", or "UTC".' },
  ])("the zone $zone is refused with its field named, and nothing changes", async ({ zone, message }) => {
    const { db, processId } = await testDatabase();
    const [site] = await siteZones(db);
    const refused = await setSiteZone(db, { siteId: site!.id, zone }).then(
      () => null,
      (error: unknown) => error,
    );
    expect(isAppError(refused) && { code: refused.code, message: refused.message, paths: refused.issues.map((issue) => issue.path) }).toEqual({
      code: "invalid-input",
      message,
      paths: ["zone"],
    });
    expect(await zoneOfProcess(db, processId)).toBe("UTC");
  });

  test("an unknown site or process is not found", async () => {
    const { db } = await testDatabase();
    await expect(setSiteZone(db, { siteId: 999, zone: "UTC" })).rejects.toMatchObject({ code: "not-found", issues: [{ path: "siteId", message: "does not exist" }] });
    await expect(zoneOfProcess(db, 999)).rejects.toMatchObject({ code: "not-found" });
  });
});
