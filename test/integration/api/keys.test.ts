// Keys on posted subgroups, on a real SQLite file: a retried post stores nothing twice and answers with the
// subgroups stored the first time; a post mixing stored and new keys stores and evaluates only the new ones;
// a replayed subgroup is not held to time order while a new one is; subgroups without keys are stored every
// time, as before keys existed.
import { beforeAll, describe, expect, test } from "vitest";
import { POST as postSubgroups } from "@/app/api/v1/characteristics/[id]/subgroups/route";
import { ZSubgroupsPostAnswer } from "@/shared/api";
import { reviseLimits } from "@/src/limits";
import { rowCounts } from "@/test/integration/intake/database";
import { call } from "./client";
import { minutesIn, registerApiFixture, wallSubgroup, type TApiFixture } from "./fixture";

const openFixture = registerApiFixture("api-keys");
let fixture: TApiFixture;
const BASELINE = 20;

const post = async (subgroups: unknown[]) => {
  const answer = await call(postSubgroups, { path: `/api/v1/characteristics/${fixture.wallId}/subgroups`, params: { id: String(fixture.wallId) }, body: { subgroups } });
  if (answer.status < 300) expect(ZSubgroupsPostAnswer.parse(answer.json)).toEqual(answer.json);
  return answer;
};
/** Subgroup `index` of the in-control wall, half an hour after the one before, with a key. */
const usual = (index: number, key: string) => ({ ...wallSubgroup(index, minutesIn(index * 30)), key });
/** Subgroup `index` far above the wall's limits (about 0.16 mm above a centre near 2.00 mm). */
const high = (index: number, key: string) => ({ timestamp: minutesIn(index * 30), values: [2.15, 2.16, 2.17, 2.16, 2.15], key });
/** Posts `subgroups`, expects `status` with `error`, and checks that nothing was written. */
async function expectRefusal(subgroups: unknown[], status: number, error: { code: string; message: string; issues: { path: string; message: string }[] }) {
  const counts = await rowCounts(fixture.db);
  const answer = await post(subgroups);
  expect(answer.status).toBe(status);
  expect(answer.json.error).toEqual(error);
  expect(await rowCounts(fixture.db)).toEqual(counts);
}
const signalRows = () => fixture.db.signal.findMany({ where: { characteristicId: fixture.wallId }, orderBy: { id: "asc" } });

beforeAll(async () => {
  fixture = await openFixture();
  const baseline = await post(Array.from({ length: BASELINE }, (_, index) => wallSubgroup(index, minutesIn(index * 30))));
  expect(baseline.status).toBe(201);
  await reviseLimits(fixture.db, fixture.wallId, { baselineStart: 0, baselineEnd: BASELINE, reason: "first baseline", approvedBy: "Quality lead" }, new Date("2026-03-02T00:00:00Z"));
});

describe("subgroups posted with the line system's keys", () => {
  test("a retried post stores nothing twice and answers 200 with the subgroups stored the first time", async () => {
    const subgroups = [usual(20, "press4-0020"), high(21, "press4-0021")];
    const first = await post(subgroups);
    expect(first.status).toBe(201);
    const [calm, beyond] = first.json.stored;
    expect(first.json.outcomes).toEqual([
      { key: "press4-0020", status: "stored", id: calm.id, sequence: 20 },
      { key: "press4-0021", status: "stored", id: beyond.id, sequence: 21 },
    ]);
    expect(first.json.signals).toContainEqual(expect.objectContaining({ rule: "nelson-1", statistic: "xbar", firing: [21], change: "created" }));
    const stored = await fixture.db.subgroup.findMany({ where: { id: { in: [calm.id, beyond.id] } }, orderBy: { id: "asc" }, select: { sourceKey: true } });
    expect(stored.map((row) => row.sourceKey)).toEqual(["api:press4-0020", "api:press4-0021"]);

    const counts = await rowCounts(fixture.db);
    const signals = await signalRows();
    const retry = await post(subgroups);
    expect(retry.status).toBe(200);
    expect(retry.json).toEqual({
      outcomes: [
        { key: "press4-0020", status: "already-present", id: calm.id, sequence: 20 },
        { key: "press4-0021", status: "already-present", id: beyond.id, sequence: 21 },
      ],
      stored: [],
      signals: [],
      limits: { version: 1 },
      notes: ["every subgroup was already stored; nothing was added"],
    });
    expect(await rowCounts(fixture.db)).toEqual(counts);
    // Not even a signal's updatedAt moves: the replay evaluates nothing.
    expect(await signalRows()).toEqual(signals);
  });

  test("a post mixing stored and new keys stores only the new ones, and only they raise or extend signals", async () => {
    const before = await signalRows();
    const answer = await post([high(21, "press4-0021"), high(22, "press4-0022"), usual(23, "press4-0023")]);
    expect(answer.status).toBe(201);
    expect(answer.json.outcomes.map((outcome: { key: string; status: string; sequence: number }) => [outcome.key, outcome.status, outcome.sequence])).toEqual([
      ["press4-0021", "already-present", 21],
      ["press4-0022", "stored", 22],
      ["press4-0023", "stored", 23],
    ]);
    expect(answer.json.stored.map((subgroup: { sequence: number }) => subgroup.sequence)).toEqual([22, 23]);
    expect(await fixture.db.subgroup.count({ where: { characteristicId: fixture.wallId } })).toBe(24);
    // Subgroup 21's signal is extended by 22 alone: had 21 been stored again, a second high point would
    // have joined it and the firing would list another sequence.
    expect(answer.json.signals).toContainEqual(
      expect.objectContaining({ rule: "nelson-1", statistic: "xbar", startSequence: 21, endSequence: 22, firing: [21, 22], change: "extended" }),
    );
    for (const signal of answer.json.signals) expect(signal.endSequence).toBeGreaterThanOrEqual(22);
    // Every stored signal the answer does not name is as it was.
    const named = new Set(answer.json.signals.map((signal: { id: number }) => signal.id));
    const after = await signalRows();
    expect(after.filter((row) => !named.has(row.id))).toEqual(before.filter((row) => !named.has(row.id)));
    expect(after.filter((row) => named.has(row.id)).length).toBe(named.size);
  });

  test("a replayed subgroup is not held to time order; a new one that goes back in time is refused, naming its place in the post", async () => {
    // Subgroup 20 is older than the last stored one (23): sent again, it is recognised, not refused.
    const replay = await post([usual(20, "press4-0020")]);
    expect(replay.status).toBe(200);
    expect(replay.json.outcomes).toEqual([{ key: "press4-0020", status: "already-present", id: expect.any(Number), sequence: 20 }]);

    await expectRefusal([usual(20, "press4-0020"), { ...wallSubgroup(24, minutesIn(22 * 30)), key: "press4-0024" }], 422, {
      code: "invalid-input",
      message: "Timestamps go backwards; nothing was stored",
      issues: [
        {
          path: "subgroups.1.timestamp",
          message: `${minutesIn(22 * 30)} is earlier than the last stored subgroup (sequence 23) at ${minutesIn(23 * 30)}; subgroups must arrive in time order`,
        },
      ],
    });
  });

  test("a key already stored for a reading at another time is a conflict, and nothing of the post is stored", async () => {
    // The line system's counter started again: key 0021 now names a new reading, half an hour after the last.
    await expectRefusal([usual(24, "press4-0024"), usual(25, "press4-0021")], 409, {
      code: "conflict",
      message: "1 of 2 subgroups carry the key of another stored reading; nothing was stored",
      issues: [
        {
          path: "subgroups.1.key",
          message: `is already the key of the subgroup at ${minutesIn(21 * 30)} (sequence 21), not of one at ${minutesIn(25 * 30)}; a key names one reading`,
        },
      ],
    });
  });

  test("subgroups without keys are stored every time, as before keys existed", async () => {
    const subgroup = wallSubgroup(24, minutesIn(24 * 30));
    const first = await post([subgroup]);
    const second = await post([subgroup]);
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(first.json.outcomes).toEqual([{ key: null, status: "stored", id: first.json.stored[0].id, sequence: 24 }]);
    expect(second.json.outcomes).toEqual([{ key: null, status: "stored", id: second.json.stored[0].id, sequence: 25 }]);
    const rows = await fixture.db.subgroup.findMany({ where: { characteristicId: fixture.wallId, sequence: { in: [24, 25] } }, select: { sourceKey: true } });
    expect(rows).toEqual([{ sourceKey: null }, { sourceKey: null }]);
  });

  test("a key is one characteristic's: the same key on another characteristic is a new subgroup", async () => {
    const answer = await call(postSubgroups, {
      path: `/api/v1/characteristics/${fixture.shortShotsId}/subgroups`,
      params: { id: String(fixture.shortShotsId) },
      body: { subgroups: [{ timestamp: minutesIn(0), count: 3, size: 200, key: "press4-0020" }] },
    });
    expect(answer.status).toBe(201);
    expect(answer.json.outcomes).toEqual([{ key: "press4-0020", status: "stored", id: expect.any(Number), sequence: 0 }]);
  });

  test("a key of exactly 100 characters, the longest allowed, is stored (101 is refused: malformed.test.ts)", async () => {
    const key = `press4/${"0".repeat(93)}`;
    expect(key.length).toBe(100);
    const answer = await post([usual(26, key)]);
    expect(answer.status).toBe(201);
    expect(answer.json.outcomes).toEqual([{ key, status: "stored", id: expect.any(Number), sequence: 26 }]);
  });
});
