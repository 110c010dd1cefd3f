// Limit revision (versions, exclusions with reasons, the points each version applies to, a recorded
// re-evaluation), corrections (original kept with who, when and why; summaries updated; signals
// re-evaluated and recorded) and the process event log, on a real SQLite file.
import { beforeAll, describe, expect, test } from "vitest";
import { createCharacteristic, getCharacteristic, updateCharacteristic } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import { eventsFor, recordEvent } from "@/src/events";
import { limitSetInForce, limitSetsFor, reviseLimits } from "@/src/limits";
import { signalsFor } from "@/src/signals";
import { estimateParameters } from "@/src/spc/charts";
import { variablesData } from "@/src/spc/data";
import { appendSubgroups, correctionsFor, correctValue } from "@/src/subgroups";
import { registerTestDatabase } from "./database";
import { seededSubgroups } from "./series";

const openDatabase = registerTestDatabase("revise");
const NOW = new Date("2026-04-01T08:00:00Z");
let db: PrismaClient;
let processId: number;

beforeAll(async () => {
  ({ db, processId } = await openDatabase());
});

describe("limit revision", () => {
  test("versions count up, exclusions keep their reasons, and each version applies from its baseline start", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Rim height", unit: "mm", chartType: "xbar-r", subgroupSize: 5 });
    const inputs = seededSubgroups("xbar-r", 120, 5, 60, 3);
    await appendSubgroups(db, characteristic.id, inputs, { source: "import", now: NOW });

    const first = await reviseLimits(
      db,
      characteristic.id,
      { baselineStart: 0, baselineEnd: 40, exclusions: [{ sequence: 7, reason: "gauge dropped, reading confirmed wrong" }], reason: "initial limits", approvedBy: "Process engineer" },
      NOW,
    );
    // The frozen parameters are the engine's Phase I estimate on the same values without subgroup 7.
    const expected = estimateParameters("xbar-r", variablesData(inputs.slice(0, 40).map((input) => input.values!)), { baseline: { exclude: [7] }, subgroupSize: 5 });
    expect(first).toMatchObject({ version: 1, center: expected.center, sigma: expected.sigma, baselineUsed: 39, appliesFrom: 0, exclusions: [{ sequence: 7, reason: "gauge dropped, reading confirmed wrong" }] });
    const signalsOfFirst = await signalsFor(db, characteristic.id);
    expect(signalsOfFirst.some((signal) => signal.startSequence >= 60)).toBe(true);

    const later = new Date("2026-04-02T08:00:00Z");
    const second = await reviseLimits(db, characteristic.id, { baselineStart: 70, baselineEnd: 110, reason: "new level after the die change", approvedBy: "Process engineer" }, later);
    expect(second).toMatchObject({ version: 2, appliesFrom: 70, appliesTo: { from: 70, to: null } });
    const versions = await limitSetsFor(db, characteristic.id);
    // The chart reads which version applied to which points from here.
    expect(versions.map((version) => [version.version, version.appliesTo])).toEqual([[1, { from: 0, to: 70 }], [2, { from: 70, to: null }]]);
    expect((await limitSetInForce(db, characteristic.id, 69))?.version).toBe(1);
    expect((await limitSetInForce(db, characteristic.id, 70))?.version).toBe(2);
    expect((await getCharacteristic(db, characteristic.id)).limitsInForce?.version).toBe(2);
    // Signals from 70 on are judged against version 2; the re-evaluation is recorded.
    const signals = await signalsFor(db, characteristic.id);
    expect(signals.every((signal) => (signal.startSequence >= 70 ? signal.limitSetVersion === 2 : signal.limitSetVersion === 1))).toBe(true);
    const evaluations = await db.signalEvaluation.findMany({ where: { characteristicId: characteristic.id }, orderBy: { id: "asc" } });
    expect(evaluations.map((evaluation) => [evaluation.trigger, evaluation.reason, evaluation.requestedBy])).toEqual([
      ["limit-revision", "initial limits", "Process engineer"],
      ["limit-revision", "new level after the die change", "Process engineer"],
    ]);
    expect(evaluations[1]).toMatchObject({ signalsBefore: signalsOfFirst.length, signalsAfter: signals.length, at: later, limitSetId: second.id });
  });
});

describe("corrections", () => {
  test("keep the original with who, when and why, update the summaries and re-evaluate the signals", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Cap torque", unit: "N m", chartType: "imr", subgroupSize: 1, ruleSet: "we-1" });
    const inputs = seededSubgroups("imr", 40, 8, 40);
    const typo = { ...inputs[35]!, values: [100.1] }; // a decimal point typed in the wrong place
    await appendSubgroups(db, characteristic.id, [...inputs.slice(0, 35), typo, ...inputs.slice(36)], { source: "entry", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 30, reason: "initial limits", approvedBy: "Line lead" }, NOW);
    const beforeSignals = await signalsFor(db, characteristic.id);
    expect(beforeSignals.some((signal) => signal.firing.includes(35))).toBe(true);

    const subgroup = await db.subgroup.findFirstOrThrow({ where: { characteristicId: characteristic.id, sequence: 35 } });
    const correctedAt = new Date("2026-04-03T09:30:00Z");
    const outcome = await correctValue(db, { subgroupId: subgroup.id, position: 0, field: "value" }, { newValue: 10.01, reason: "decimal point slipped on entry", correctedBy: "Line lead" }, correctedAt);
    expect(outcome.correction).toMatchObject({ field: "value", originalValue: 100.1, correctedValue: 10.01, reason: "decimal point slipped on entry", correctedBy: "Line lead", correctedAt });
    const after = await db.subgroup.findUniqueOrThrow({ where: { id: subgroup.id }, include: { measurements: true } });
    expect(after.measurements[0]!.value).toBe(10.01);
    expect(after.mean).toBe(10.01);
    expect((await signalsFor(db, characteristic.id)).some((signal) => signal.firing.includes(35))).toBe(false);
    const evaluation = await db.signalEvaluation.findFirstOrThrow({ where: { characteristicId: characteristic.id, trigger: "correction" } });
    expect(evaluation).toMatchObject({ requestedBy: "Line lead", at: correctedAt, signalsBefore: beforeSignals.length });
    expect(evaluation.reason).toContain("subgroup 35, value 0: 100.1 → 10.01: decimal point slipped on entry");

    // A second correction keeps the chain: the as-recorded value stays in the first row.
    await correctValue(db, { subgroupId: subgroup.id, position: 0, field: "value" }, { newValue: 10.1, reason: "checked against the gauge log", correctedBy: "Quality lead" }, new Date("2026-04-04T09:00:00Z"));
    const chain = await correctionsFor(db, characteristic.id);
    expect(chain.map((row) => [row.sequence, row.position, row.originalValue, row.correctedValue, row.correctedBy])).toEqual([
      [35, 0, 100.1, 10.01, "Line lead"],
      [35, 0, 10.01, 10.1, "Quality lead"],
    ]);
  });

  test("a count correction on a p chart updates the subgroup and its signals", async () => {
    const characteristic = await createCharacteristic(db, { processId, name: "Leakers", unit: "items", chartType: "p", subgroupSize: 1, ruleSet: "we-1" });
    const inputs = seededSubgroups("p", 40, 9, 40);
    await appendSubgroups(db, characteristic.id, inputs, { source: "api", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 40, reason: "initial limits", approvedBy: "Line lead" }, NOW);
    const subgroup = await db.subgroup.findFirstOrThrow({ where: { characteristicId: characteristic.id, sequence: 39 } });
    await correctValue(db, { subgroupId: subgroup.id, field: "count" }, { newValue: subgroup.size!, reason: "all rejected: wrong tray counted", correctedBy: "Line lead" }, NOW);
    expect((await db.subgroup.findUniqueOrThrow({ where: { id: subgroup.id } })).count).toBe(subgroup.size);
    expect((await signalsFor(db, characteristic.id)).some((signal) => signal.firing.includes(39) && signal.side === "above")).toBe(true);
  });
});

describe("characteristic settings", () => {
  test("a changed rule set re-evaluates the stored signals, recorded; the settings read back as saved", async () => {
    const settings = { processId, name: "Seal width", unit: "mm", chartType: "imr" as const, subgroupSize: 1, ruleSet: "nelson", target: 10, lowerSpecLimit: 9, upperSpecLimit: 11 };
    const characteristic = await createCharacteristic(db, settings);
    await appendSubgroups(db, characteristic.id, seededSubgroups("imr", 80, 31, 50, 1.5), { source: "api", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 40, reason: "initial limits", approvedBy: "Engineer" }, NOW);
    const withNelson = await signalsFor(db, characteristic.id);
    const changedAt = new Date("2026-04-05T10:00:00Z");
    const updated = await updateCharacteristic(db, characteristic.id, { ...settings, ruleSet: "we-1", description: "width of the heat seal" }, { now: changedAt, changedBy: "Quality lead" });
    expect(updated).toMatchObject({ ruleSet: "we-1", description: "width of the heat seal", subgroupCount: 80, limitsInForce: { version: 1 }, process: { id: processId } });
    const withRuleOne = await signalsFor(db, characteristic.id);
    expect(withRuleOne.every((signal) => signal.rule === "we-1")).toBe(true);
    expect(withNelson.some((signal) => signal.rule !== "nelson-1")).toBe(true);
    const evaluation = await db.signalEvaluation.findFirstOrThrow({ where: { characteristicId: characteristic.id, trigger: "request" } });
    expect(evaluation).toMatchObject({ reason: 'rule set changed from "nelson" to "we-1"', requestedBy: "Quality lead", at: changedAt, signalsBefore: withNelson.length, signalsAfter: withRuleOne.length });
  });
});

describe("process events", () => {
  test("are recorded with kind, cause category, text and reading, and listed in time order within a range", async () => {
    const later = await recordEvent(db, processId, { occurredAt: "2026-04-02T14:00:00Z", kind: "environment", causeCategory: "environment", description: "Dryer dew point high", value: -18.5, unit: "°C" }, NOW);
    const earlier = await recordEvent(db, processId, { occurredAt: "2026-04-01T06:00:00+02:00", kind: "lot-change", description: "Resin lot 24-117 loaded" }, NOW);
    expect(later).toMatchObject({ kind: "environment", causeCategory: "environment", value: -18.5, unit: "°C", occurredAt: new Date("2026-04-02T14:00:00Z") });
    expect(earlier).toMatchObject({ kind: "lot-change", causeCategory: null, value: null, occurredAt: new Date("2026-04-01T04:00:00Z") });
    expect((await eventsFor(db, processId)).map((event) => event.id)).toEqual([earlier.id, later.id]);
    expect((await eventsFor(db, processId, { from: new Date("2026-04-02T00:00:00Z") })).map((event) => event.id)).toEqual([later.id]);
    expect(await eventsFor(db, processId, { to: new Date("2026-03-31T00:00:00Z") })).toEqual([]);
  });
});
