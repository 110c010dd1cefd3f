// A caller's key can never equal an import's key, on a real SQLite file. An import stores each subgroup
// under "csv:<time>:..." and looks a key up only for a subgroup no later than the last stored one
// (src/imports/write.ts), so a posted key equal to the key of a later file row would slip past that look-up
// and break the import on the unique key index. Posted keys are stored as "api:<key>", which no import key
// equals; this test posts exactly such a key and then imports that row.
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { POST as postSubgroups } from "@/app/api/v1/characteristics/[id]/subgroups/route";
import { setApiDatabaseForTests } from "@/src/api/database";
import { createTestCharacteristic, openImportTestDatabase, runImport, tableCounts } from "@/test/integration/imports/harness";
import { call } from "./client";

const harness = openImportTestDatabase("api-keys");
const CSV = "time,value\n2026-03-01T08:00:00Z,10.5\n";
const MAPPING = { timestamp: "time", value: "value" };

beforeAll(() => setApiDatabaseForTests(harness.prisma));
afterAll(() => setApiDatabaseForTests(undefined));

const post = (characteristicId: number, subgroups: unknown[]) =>
  call(postSubgroups, { path: `/api/v1/characteristics/${characteristicId}/subgroups`, params: { id: String(characteristicId) }, body: { subgroups } });

describe("posted keys and import keys", () => {
  test("a posted key equal to an import key is stored with the api: prefix, and the import of that row still succeeds", async () => {
    // The key the import gives the file's row, read from a characteristic the file was imported into.
    const scratch = await createTestCharacteristic(harness.prisma, "imr", 1);
    await runImport(harness, scratch, CSV, { mapping: MAPPING });
    const { sourceKey: importKey } = await harness.prisma.subgroup.findFirstOrThrow({ where: { characteristicId: scratch }, select: { sourceKey: true } });
    expect(importKey).toMatch(/^csv:/);

    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const posted = await post(id, [{ timestamp: "2026-03-01T06:00:00Z", values: [10.1], key: importKey }]);
    expect(posted.status).toBe(201);
    expect(posted.json.outcomes).toEqual([{ key: importKey, status: "stored", id: expect.any(Number), sequence: 0 }]);
    const stored = await harness.prisma.subgroup.findUniqueOrThrow({ where: { id: posted.json.outcomes[0].id }, select: { sourceKey: true } });
    expect(stored.sourceKey).toBe(`api:${importKey}`);

    // The file's row is later than the posted subgroup, so the import does not look its key up; it is new.
    const imported = await runImport(harness, id, CSV, { mapping: MAPPING });
    expect(imported).toMatchObject({ status: "imported", subgroupsAdded: 1, subgroupsAlreadyPresent: 0, addedSequences: [1, 1] });
    const keys = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" }, select: { sourceKey: true } });
    expect(keys.map((row) => row.sourceKey)).toEqual([`api:${importKey}`, importKey]);

    // And the other way round: the imported row does not answer for the caller's key.
    const counts = await tableCounts(harness.prisma);
    const retry = await post(id, [{ timestamp: "2026-03-01T06:00:00Z", values: [10.1], key: importKey }]);
    expect(retry.status).toBe(200);
    expect(retry.json.outcomes).toEqual([{ key: importKey, status: "already-present", id: posted.json.outcomes[0].id, sequence: 0 }]);
    expect(await tableCounts(harness.prisma)).toEqual(counts);
  });
});
