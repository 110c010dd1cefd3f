// Characteristic setup and limit versions through the API, on a real SQLite file: creating and changing a
// characteristic, listing and revising limit versions (happy paths), and malformed requests, each refused
// with its status, code, field path and message, and writing nothing (row counts before and after).
import { beforeAll, describe, expect, test } from "vitest";
import { POST as createCharacteristic } from "@/app/api/v1/characteristics/route";
import { POST as updateCharacteristic } from "@/app/api/v1/characteristics/[id]/route";
import { GET as listLimitSets, POST as reviseLimits } from "@/app/api/v1/characteristics/[id]/limit-sets/route";
import { POST as postSubgroups } from "@/app/api/v1/characteristics/[id]/subgroups/route";
import { ZCharacteristicView, ZLimitRevisionAnswer, ZLimitSetList } from "@/shared/api";
import { call } from "./client";
import { minutesIn, registerApiFixture, wallSubgroup, type TApiFixture } from "./fixture";
import { expectRefusedWithoutWriting, invalidField, type TRefusal } from "./refusal";

const openFixture = registerApiFixture("api-setup");
let fixture: TApiFixture;
const BASELINE = 20;

const atId = (id: number, suffix = "") => ({ path: `/api/v1/characteristics/${id}${suffix}`, params: { id: String(id) } });
const revise = (id: number, body: unknown) => call(reviseLimits, { ...atId(id, "/limit-sets"), body });
const change = (id: number, body: unknown) => call(updateCharacteristic, { ...atId(id), body });

beforeAll(async () => {
  fixture = await openFixture();
  // The wall has subgroups stored (its chart type is then fixed); the short-shots chart has none.
  const subgroups = Array.from({ length: BASELINE }, (_, index) => wallSubgroup(index, minutesIn(index * 30)));
  expect((await call(postSubgroups, { ...atId(fixture.wallId, "/subgroups"), body: { subgroups } })).status).toBe(201);
});

describe("setting up characteristics and their limits through the API", () => {
  test("POST /characteristics answers 201 with the new characteristic, defaults filled in", async () => {
    const body = { processId: fixture.processId, name: "Cap height", unit: "mm", chartType: "imr", subgroupSize: 1, target: 12, lowerSpecLimit: 11.8, upperSpecLimit: 12.2 };
    const answer = await call(createCharacteristic, { path: "/api/v1/characteristics", body });
    expect(answer.status).toBe(201);
    expect(ZCharacteristicView.parse(answer.json)).toEqual(answer.json);
    expect(answer.json).toMatchObject({ name: "Cap height", unit: "mm", chartType: "imr", subgroupSize: 1, target: 12, lowerSpecLimit: 11.8, upperSpecLimit: 12.2, process: { id: fixture.processId, name: "Press A" }, ruleSet: "nelson", safetyRelated: false, description: null, subgroupCount: 0, limitsInForce: null });
    expect(await fixture.db.characteristic.count({ where: { name: "Cap height" } })).toBe(1);
  });

  test("POST /characteristics/{id} changes only the fields given, clears one with null, and records a rule-set change by name", async () => {
    const answer = await change(fixture.wallId, { ruleSet: "we", target: 2, description: "Measured at the gate", changedBy: "Shift lead" });
    expect(answer.status).toBe(200);
    expect(ZCharacteristicView.parse(answer.json)).toEqual(answer.json);
    expect(answer.json).toMatchObject({ name: "Wall thickness", chartType: "xbar-r", subgroupSize: 5, lowerSpecLimit: 1.8, upperSpecLimit: 2.2, target: 2, ruleSet: "we", description: "Measured at the gate", subgroupCount: BASELINE });
    const evaluation = await fixture.db.signalEvaluation.findFirstOrThrow({ where: { characteristicId: fixture.wallId }, orderBy: { id: "desc" } });
    expect(evaluation).toMatchObject({ trigger: "request", requestedBy: "Shift lead", reason: 'rule set changed from "nelson" to "we"' });

    const cleared = await change(fixture.wallId, { target: null, ruleSet: "nelson", changedBy: "Shift lead" });
    expect(cleared.status).toBe(200);
    expect(cleared.json).toMatchObject({ target: null, ruleSet: "nelson", description: "Measured at the gate", lowerSpecLimit: 1.8 });
  });

  test("GET limit-sets is empty before the first version; POST limit-sets answers 201 with the frozen version and its re-evaluation", async () => {
    const empty = await call(listLimitSets, atId(fixture.wallId, "/limit-sets"));
    expect(empty).toEqual({ status: 200, json: { limitSets: [] } });

    const answer = await revise(fixture.wallId, {
      baselineStart: 0,
      baselineEnd: BASELINE,
      exclusions: [{ sequence: 4, reason: "gauge dropped and re-zeroed" }],
      reason: "first baseline",
      approvedBy: "Quality lead",
    });
    expect(answer.status).toBe(201);
    expect(ZLimitRevisionAnswer.parse(answer.json)).toEqual(answer.json);
    expect(answer.json.limitSet).toMatchObject({
      version: 1,
      subgroupSize: 5,
      appliesFrom: 0,
      baselineStart: 0,
      baselineEnd: BASELINE,
      baselineUsed: BASELINE - 1,
      exclusions: [{ sequence: 4, reason: "gauge dropped and re-zeroed" }],
      reason: "first baseline",
      approvedBy: "Quality lead",
      appliesTo: { from: 0, to: null },
    });
    // The centre is the mean of the 19 kept subgroup means, read back from the stored values.
    const kept = Array.from({ length: BASELINE }, (_, index) => wallSubgroup(index, minutesIn(0)).values).filter((_, index) => index !== 4);
    const grandMean = kept.reduce((sum, values) => sum + values.reduce((a, b) => a + b, 0) / values.length, 0) / kept.length;
    // Tolerance: double-precision sums in a different order.
    expect(answer.json.limitSet.center).toBeCloseTo(grandMean, 12);
    expect(answer.json.reevaluation).toMatchObject({ signalsBefore: 0 });
    const stored = await fixture.db.signalEvaluation.findUniqueOrThrow({ where: { id: answer.json.reevaluation.id } });
    expect(stored).toMatchObject({ trigger: "limit-revision", reason: "first baseline", requestedBy: "Quality lead", signalsAfter: answer.json.reevaluation.signalsAfter });
  });

  test("a second version from a later baseline: GET limit-sets shows which subgroups each version applies to", async () => {
    const answer = await revise(fixture.wallId, { baselineStart: 5, baselineEnd: BASELINE, reason: "after the nozzle change", approvedBy: "Quality lead" });
    expect(answer.status).toBe(201);
    const listed = await call(listLimitSets, atId(fixture.wallId, "/limit-sets"));
    expect(listed.status).toBe(200);
    expect(ZLimitSetList.parse(listed.json)).toEqual(listed.json);
    expect(listed.json.limitSets.map((set: { version: number; appliesTo: unknown }) => [set.version, set.appliesTo])).toEqual([
      [1, { from: 0, to: 5 }],
      [2, { from: 5, to: null }],
    ]);
  });
});

const setup = (fields: Record<string, unknown>) => () =>
  call(createCharacteristic, {
    path: "/api/v1/characteristics",
    body: { processId: fixture.processId, name: "Closure torque", unit: "N·m", chartType: "xbar-s", subgroupSize: 4, ...fields },
  });
const revision = (fields: Record<string, unknown>) => () =>
  revise(fixture.wallId, { baselineStart: 0, baselineEnd: BASELINE, reason: "refreshed baseline", approvedBy: "Quality lead", ...fields });

const cases: Record<string, TRefusal> = {
  "an unknown field on setup": invalidField(setup({ colour: "red" }), "request body", "colour", "is not a known field"),
  "a lower specification limit at the upper one": invalidField(setup({ lowerSpecLimit: 5, upperSpecLimit: 5 }), "request body", "upperSpecLimit", "must be above the lower specification limit"),
  "a rule set naming an unknown rule": {
    request: setup({ ruleSet: "nelson-1,nelson-9" }),
    status: 422,
    code: "invalid-input",
    message: expect.stringMatching(/^The request body is not valid: ruleSet must be "we", "nelson" or a comma-separated list of /) as string,
    issues: [{ path: "ruleSet", message: expect.stringMatching(/^must be "we", "nelson" or a comma-separated list of /) as string }],
  },
  "an individuals chart with subgroups of 2": invalidField(setup({ chartType: "imr", subgroupSize: 2 }), "request body", "subgroupSize", "must be 1 for an individuals chart"),
  "an unknown process": {
    request: setup({ processId: 9999 }),
    status: 404,
    code: "not-found",
    message: "Process 9999 does not exist",
    issues: [{ path: "processId", message: "does not exist" }],
  },
  "a name already used on the process": {
    request: setup({ name: "Wall thickness" }),
    status: 409,
    code: "conflict",
    message: 'This process already has a characteristic named "Wall thickness"',
    issues: [{ path: "name", message: "is already used on this process" }],
  },
  "a change of chart type after subgroups are stored": {
    request: () => change(fixture.wallId, { chartType: "xbar-s", changedBy: "Shift lead" }),
    status: 409,
    code: "conflict",
    message: `The chartType cannot change once subgroups are stored (${BASELINE} are); set up a new characteristic instead`,
    issues: [{ path: "chartType", message: "cannot change once subgroups are stored" }],
  },
  "a change that puts the lower specification limit above the stored upper one": {
    request: () => change(fixture.wallId, { lowerSpecLimit: 2.5, changedBy: "Shift lead" }),
    status: 422,
    code: "invalid-input",
    // The body alone is valid; the settings it leads to are not (the target was cleared above).
    message: "The characteristic is not valid: upperSpecLimit must be above the lower specification limit.",
    issues: [{ path: "upperSpecLimit", message: "must be above the lower specification limit" }],
  },
  "a change without the name of who makes it": invalidField(() => change(fixture.wallId, { ruleSet: "we" }), "request body", "changedBy", "Invalid input: expected string, received undefined"),
  "a change of an unknown characteristic": {
    request: () => change(9999, { name: "Anything", changedBy: "Shift lead" }),
    status: 404,
    code: "not-found",
    message: "Characteristic 9999 does not exist",
    issues: [],
  },
  "a limit revision without a reason": invalidField(revision({ reason: undefined }), "request body", "reason", "Invalid input: expected string, received undefined"),
  "a limit revision whose reason is too short to say why": {
    request: revision({ reason: "ok" }),
    status: 422,
    code: "invalid-input",
    message: expect.stringMatching(/^The request body is not valid: reason must say why, in at least \d+ characters\.$/) as string,
    issues: [{ path: "reason", message: expect.stringMatching(/^must say why, in at least \d+ characters$/) as string }],
  },
  "a baseline that ends before it starts": invalidField(revision({ baselineStart: 10, baselineEnd: 4 }), "request body", "baselineEnd", "must be after the baseline start"),
  "an exclusion outside the baseline": invalidField(revision({ baselineStart: 0, baselineEnd: 10, exclusions: [{ sequence: 12, reason: "short shot on cavity 2" }] }), "request body", "exclusions.0.sequence", "must lie inside the baseline window"),
  "a baseline beyond the stored subgroups": {
    request: revision({ baselineEnd: BASELINE + 5 }),
    status: 422,
    code: "refused",
    message: `The baseline 0–${BASELINE + 4} needs ${BASELINE + 5} stored subgroups; ${BASELINE} are stored there`,
    issues: [{ path: "baselineEnd", message: "is beyond the stored subgroups" }],
  },
  "limit versions of an unknown characteristic": {
    request: () => call(listLimitSets, atId(9999, "/limit-sets")),
    status: 404,
    code: "not-found",
    message: "Characteristic 9999 does not exist",
    issues: [],
  },
};

describe("malformed setup and limit requests are refused with a reason and write nothing", () => {
  test.each(Object.entries(cases))("%s", async (_label, expected) => {
    await expectRefusedWithoutWriting(fixture.db, expected);
  });

  test(`there are at least 8 cases (${Object.keys(cases).length})`, () => {
    expect(Object.keys(cases).length).toBeGreaterThanOrEqual(8);
  });
});
