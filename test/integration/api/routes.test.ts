// Happy paths of every API route on a real SQLite file: the answers' status and shape, what was stored,
// and live detection through the API (a signal created, then extended by the next subgroup).
import { beforeAll, describe, expect, test } from "vitest";
import { GET as listCharacteristics } from "@/app/api/v1/characteristics/route";
import { GET as getCharacteristic } from "@/app/api/v1/characteristics/[id]/route";
import { POST as postSubgroups } from "@/app/api/v1/characteristics/[id]/subgroups/route";
import { GET as listSignals } from "@/app/api/v1/characteristics/[id]/signals/route";
import { GET as listEvents, POST as postEvent } from "@/app/api/v1/processes/[id]/events/route";
import { GET as openApi } from "@/app/api/v1/openapi.json/route";
import { ZCharacteristicList, ZEventList, ZSignalList, ZSubgroupsPostAnswer } from "@/shared/api";
import { reviseLimits } from "@/src/limits";
import { call } from "./client";
import { minutesIn, registerApiFixture, wallSubgroup, type TApiFixture } from "./fixture";

const openFixture = registerApiFixture("api-routes");
let fixture: TApiFixture;
const BASELINE = 20;

beforeAll(async () => {
  fixture = await openFixture();
});

describe("the API on a real database", () => {
  test("GET /characteristics lists both (by process, then name), with no limits in force yet", async () => {
    const answer = await call(listCharacteristics, { path: "/api/v1/characteristics" });
    expect(answer.status).toBe(200);
    expect(ZCharacteristicList.parse(answer.json)).toEqual(answer.json);
    expect(answer.json.characteristics.map((c: { name: string }) => c.name)).toEqual(["Short shots", "Wall thickness"]);
    expect(answer.json.characteristics[1]).toMatchObject({
      id: fixture.wallId,
      unit: "mm",
      process: { id: fixture.processId, name: "Press A" },
      chartType: "xbar-r",
      subgroupSize: 5,
      lowerSpecLimit: 1.8,
      upperSpecLimit: 2.2,
      target: null,
      ruleSet: "nelson",
      subgroupCount: 0,
      limitsInForce: null,
    });
  });

  test("POST subgroups before any limits stores them and says no rule was evaluated", async () => {
    const subgroups = Array.from({ length: BASELINE }, (_, index) => ({ ...wallSubgroup(index, minutesIn(index * 30)), tags: { cavity: `${(index % 4) + 1}` } }));
    const answer = await call(postSubgroups, { path: `/api/v1/characteristics/${fixture.wallId}/subgroups`, params: { id: String(fixture.wallId) }, body: { subgroups } });
    expect(answer.status).toBe(201);
    expect(ZSubgroupsPostAnswer.parse(answer.json)).toEqual(answer.json);
    expect(answer.json.stored.map((s: { sequence: number }) => s.sequence)).toEqual(Array.from({ length: BASELINE }, (_, index) => index));
    expect(answer.json.stored[3]).toMatchObject({ timestamp: minutesIn(90), values: subgroups[3]!.values, count: null, tags: { cavity: "4" }, firedRules: [] });
    expect(answer.json.signals).toEqual([]);
    expect(answer.json.limits).toBeNull();
    expect(answer.json.notes).toEqual(["no limits yet: the subgroups are stored and no rule was evaluated"]);
    expect(await fixture.db.measurement.count()).toBe(BASELINE * 5);
  });

  test("after a limit revision, GET /characteristics/{id} shows the limits in force", async () => {
    await reviseLimits(fixture.db, fixture.wallId, { baselineStart: 0, baselineEnd: BASELINE, reason: "first baseline", approvedBy: "Quality lead" }, new Date("2026-03-02T00:00:00Z"));
    const answer = await call(getCharacteristic, { path: `/api/v1/characteristics/${fixture.wallId}`, params: { id: String(fixture.wallId) } });
    expect(answer.status).toBe(200);
    expect(answer.json).toMatchObject({ id: fixture.wallId, subgroupCount: BASELINE });
    expect(answer.json.limitsInForce).toMatchObject({
      version: 1,
      appliesFrom: 0,
      baselineStart: 0,
      baselineEnd: BASELINE,
      baselineUsed: BASELINE,
      reason: "first baseline",
      approvedBy: "Quality lead",
      exclusions: [],
      createdAt: "2026-03-02T00:00:00.000Z",
    });
    // The centre is the grand mean of the baseline values (Montgomery §6.2), recomputed here.
    const values = Array.from({ length: BASELINE }, (_, index) => wallSubgroup(index, "").values).flat();
    expect(answer.json.limitsInForce.center).toBeCloseTo(values.reduce((sum, value) => sum + value, 0) / values.length, 12);
  });

  test("a subgroup far above the limits raises a signal, and the next one extends it", async () => {
    const far = (minutes: number) => ({ timestamp: minutesIn(minutes), values: [2.15, 2.16, 2.17, 2.16, 2.15] });
    const path = `/api/v1/characteristics/${fixture.wallId}/subgroups`;
    const first = await call(postSubgroups, { path, params: { id: String(fixture.wallId) }, body: { subgroups: [far(BASELINE * 30)] } });
    expect(first.status).toBe(201);
    expect(first.json.limits).toEqual({ version: 1 });
    expect(first.json.stored[0]).toMatchObject({ sequence: BASELINE, firedRules: expect.arrayContaining(["nelson-1"]) });
    const opened = first.json.signals.find((signal: { rule: string; statistic: string }) => signal.rule === "nelson-1" && signal.statistic === "xbar");
    expect(opened).toMatchObject({
      ruleDescription: "1 point beyond the control limits",
      limitSetVersion: 1,
      startSequence: BASELINE,
      endSequence: BASELINE,
      firing: [BASELINE],
      side: "above",
      status: "new",
      change: "created",
    });

    const second = await call(postSubgroups, { path, params: { id: String(fixture.wallId) }, body: { subgroups: [far(BASELINE * 30 + 30)] } });
    expect(second.status).toBe(201);
    const extended = second.json.signals.find((signal: { rule: string; statistic: string }) => signal.rule === "nelson-1" && signal.statistic === "xbar");
    expect(extended).toMatchObject({ id: opened.id, startSequence: BASELINE, endSequence: BASELINE + 1, firing: [BASELINE, BASELINE + 1], change: "extended" });
  });

  test("GET signals lists the stored signals, filtered by a range of sequences", async () => {
    const path = `/api/v1/characteristics/${fixture.wallId}/signals`;
    const all = await call(listSignals, { path, params: { id: String(fixture.wallId) } });
    expect(all.status).toBe(200);
    expect(ZSignalList.parse(all.json)).toEqual(all.json);
    expect(all.json.signals.length).toBe(await fixture.db.signal.count({ where: { characteristicId: fixture.wallId } }));
    expect(all.json.signals.some((signal: { rule: string; ruleDescription: string }) => signal.rule === "nelson-1")).toBe(true);
    const before = await call(listSignals, { path: `${path}?from=0&to=${BASELINE - 1}`, params: { id: String(fixture.wallId) } });
    expect(before.json.signals.filter((signal: { endSequence: number }) => signal.endSequence < BASELINE - 10)).toEqual([]);
    const after = await call(listSignals, { path: `${path}?from=${BASELINE + 1}`, params: { id: String(fixture.wallId) } });
    expect(after.json.signals.every((signal: { endSequence: number }) => signal.endSequence >= BASELINE + 1)).toBe(true);
    expect(after.json.signals.length).toBeGreaterThan(0);
  });

  test("POST /processes/{id}/events records an event; GET lists events, filtered by time", async () => {
    const path = `/api/v1/processes/${fixture.processId}/events`;
    const params = { id: String(fixture.processId) };
    const reading = { occurredAt: "2026-03-01T08:00:00+01:00", kind: "environment", causeCategory: "environment", description: "Dryer dew point", value: -38.5, unit: "°C" };
    const created = await call(postEvent, { path, params, body: reading });
    expect(created.status).toBe(201);
    expect(created.json).toEqual({ id: expect.any(Number), processId: fixture.processId, ...reading, occurredAt: "2026-03-01T07:00:00.000Z" });
    const lot = await call(postEvent, { path, params, body: { occurredAt: "2026-03-01T12:00:00Z", kind: "lot-change", description: "New resin lot" } });
    expect(lot.json).toMatchObject({ kind: "lot-change", causeCategory: null, value: null, unit: null });

    const all = await call(listEvents, { path, params });
    expect(all.status).toBe(200);
    expect(ZEventList.parse(all.json)).toEqual(all.json);
    expect(all.json.events.map((event: { kind: string }) => event.kind)).toEqual(["environment", "lot-change"]);
    const morning = await call(listEvents, { path: `${path}?from=2026-03-01T06:00:00Z&to=2026-03-01T09:00:00Z`, params });
    expect(morning.json.events.map((event: { description: string }) => event.description)).toEqual(["Dryer dew point"]);
  });

  test("GET /openapi.json serves the document", async () => {
    const answer = await call(openApi, { path: "/api/v1/openapi.json" });
    expect(answer.status).toBe(200);
    expect(answer.json.openapi).toBe("3.1.0");
    expect(Object.keys(answer.json.paths)).toContain("/api/v1/characteristics/{id}/subgroups");
  });
});
