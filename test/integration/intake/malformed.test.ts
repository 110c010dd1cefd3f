// Malformed inputs across the intake services: each is refused with an application error whose code,
// field path and message are stated here, and nothing is written (row counts of every intake table
// before and after are equal).
import { beforeAll, describe, expect, test } from "vitest";
import { createCharacteristic, updateCharacteristic } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import { AppError, type TAppErrorCode } from "@/src/errors";
import { recordEvent } from "@/src/events";
import { reviseLimits } from "@/src/limits";
import { appendSubgroups, correctValue } from "@/src/subgroups";
import { registerTestDatabase, rowCounts } from "./database";
import { seededSubgroups } from "./series";

const openDatabase = registerTestDatabase("malformed");
const NOW = new Date("2026-05-01T08:00:00Z");
let db: PrismaClient;
let processId: number;
const ids = { imr: 0, xbar: 0, p: 0, imrSubgroup: 0, pSubgroup: 0 };

beforeAll(async () => {
  ({ db, processId } = await openDatabase());
  ids.imr = (await createCharacteristic(db, { processId, name: "Neck height", unit: "mm", chartType: "imr", subgroupSize: 1 })).id;
  ids.xbar = (await createCharacteristic(db, { processId, name: "Part weight", unit: "g", chartType: "xbar-r", subgroupSize: 5 })).id;
  ids.p = (await createCharacteristic(db, { processId, name: "Rejects", unit: "items", chartType: "p", subgroupSize: 1 })).id;
  await appendSubgroups(db, ids.imr, seededSubgroups("imr", 30, 21), { source: "api", now: NOW });
  await appendSubgroups(db, ids.p, seededSubgroups("p", 30, 22), { source: "api", now: NOW });
  await reviseLimits(db, ids.imr, { baselineStart: 0, baselineEnd: 25, reason: "initial limits", approvedBy: "Engineer" }, NOW);
  ids.imrSubgroup = (await db.subgroup.findFirstOrThrow({ where: { characteristicId: ids.imr, sequence: 3 } })).id;
  ids.pSubgroup = (await db.subgroup.findFirstOrThrow({ where: { characteristicId: ids.p, sequence: 3 } })).id;
});

const at = (hour: number) => `2026-02-01T${String(hour).padStart(2, "0")}:00:00Z`;
const append = (id: () => number, inputs: unknown[], sourceKeys?: string[]) => () =>
  appendSubgroups(db, id(), inputs, { source: "api", now: NOW, ...(sourceKeys ? { sourceKeys } : {}) });

interface TCase {
  readonly label: string;
  readonly run: () => Promise<unknown>;
  readonly code: TAppErrorCode;
  /** Expected issue path and message; for errors without issues, the whole message. */
  readonly path?: string;
  readonly message: string;
}

const cases: TCase[] = [
  // Appending subgroups
  { label: "values on a p chart", run: append(() => ids.p, [{ timestamp: at(1), values: [1], count: 1, size: 10 }]), code: "invalid-input", path: "subgroups.0.values", message: "is not used on a p chart" },
  { label: "no values on an individuals chart", run: append(() => ids.imr, [{ timestamp: at(1) }]), code: "invalid-input", path: "subgroups.0.values", message: "is required on a imr chart" },
  { label: "four values where the subgroup size is five", run: append(() => ids.xbar, [{ timestamp: at(1), values: [1, 2, 3, 4] }]), code: "invalid-input", path: "subgroups.0.values", message: "must hold exactly 5 values (the subgroup size of this characteristic)" },
  { label: "more defectives than inspected", run: append(() => ids.p, [{ timestamp: at(1), count: 12, size: 10 }]), code: "invalid-input", path: "subgroups.0.count", message: "must not exceed the number inspected (size)" },
  { label: "a timestamp without a zone", run: append(() => ids.xbar, [{ timestamp: "2026-02-01T06:00:00", values: [1, 2, 3, 4, 5] }]), code: "invalid-input", path: "subgroups.0.timestamp", message: "must be an ISO 8601 date-time with a zone, e.g. 2026-03-01T06:00:00Z" },
  { label: "a value that is text", run: append(() => ids.imr, [{ timestamp: at(1), values: ["10.2"] }]), code: "invalid-input", path: "subgroups.0.values.0", message: "must be a number" },
  { label: "one bad subgroup among good ones rejects them all", run: append(() => ids.xbar, [{ timestamp: at(1), values: [1, 2, 3, 4, 5] }, { timestamp: at(2), values: [1, 2, 3, 4, 5] }, { timestamp: at(3), values: [1, 2, 3, 4, 5], count: 2 }]), code: "invalid-input", path: "subgroups.2.count", message: "is not used on a xbar-r chart" },
  { label: "an unknown field", run: append(() => ids.xbar, [{ timestamp: at(1), values: [1, 2, 3, 4, 5], operator: "night shift" }]), code: "invalid-input", path: "subgroups.0", message: 'Unrecognized key: "operator"' },
  { label: "no subgroups", run: append(() => ids.imr, []), code: "invalid-input", path: "subgroups", message: "must hold at least one subgroup" },
  { label: "a timestamp before the last stored subgroup", run: append(() => ids.imr, [{ timestamp: "2026-01-01T00:00:00Z", values: [10] }]), code: "invalid-input", path: "subgroups.0.timestamp", message: "2026-01-01T00:00:00Z is earlier than the last stored subgroup (sequence 29) at 2026-01-06T11:00:00.000Z; subgroups must arrive in time order" },
  { label: "timestamps going backwards within one call", run: append(() => ids.xbar, [{ timestamp: at(5), values: [1, 2, 3, 4, 5] }, { timestamp: at(4), values: [1, 2, 3, 4, 5] }]), code: "invalid-input", path: "subgroups.1.timestamp", message: "2026-02-01T04:00:00Z is earlier than subgroup 0 at 2026-02-01T05:00:00.000Z; subgroups must arrive in time order" },
  { label: "the same source key twice in one call", run: append(() => ids.xbar, [{ timestamp: at(1), values: [1, 2, 3, 4, 5] }, { timestamp: at(2), values: [1, 2, 3, 4, 5] }], ["row-1", "row-1"]), code: "invalid-input", path: "subgroups.1", message: 'repeats the key "row-1" of subgroup 0' },
  { label: "an unknown characteristic", run: append(() => 999_999, [{ timestamp: at(1), values: [1] }]), code: "not-found", message: "Characteristic 999999 does not exist" },
  // Limit revisions
  { label: "a revision without a reason", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 20, reason: " ", approvedBy: "Engineer" }, NOW), code: "invalid-input", path: "reason", message: "must say why, in at least 3 characters" },
  { label: "a baseline beyond the stored subgroups", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 50, reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "refused", path: "baselineEnd", message: "is beyond the stored subgroups" },
  { label: "an exclusion outside the baseline", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 20, exclusions: [{ sequence: 25, reason: "mould flash" }], reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "invalid-input", path: "exclusions.0.sequence", message: "must lie inside the baseline window" },
  { label: "an exclusion without a reason", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 20, exclusions: [{ sequence: 5, reason: "" }], reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "invalid-input", path: "exclusions.0.reason", message: "must say why, in at least 3 characters" },
  { label: "the same subgroup excluded twice", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 20, exclusions: [{ sequence: 5, reason: "wrong tray" }, { sequence: 5, reason: "wrong tray again" }], reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "invalid-input", path: "exclusions.1.sequence", message: "is already excluded" },
  { label: "exclusions leaving one subgroup", run: () => reviseLimits(db, ids.p, { baselineStart: 0, baselineEnd: 2, exclusions: [{ sequence: 1, reason: "wrong tray" }], reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "refused", path: "exclusions", message: "leave too few subgroups" },
  { label: "a baseline with no subgroups stored", run: () => reviseLimits(db, ids.xbar, { baselineStart: 0, baselineEnd: 20, reason: "initial limits", approvedBy: "Engineer" }, NOW), code: "refused", path: "baselineEnd", message: "is beyond the stored subgroups" },
  // Corrections
  { label: "a correction without a reason", run: () => correctValue(db, { subgroupId: ids.imrSubgroup, position: 0, field: "value" }, { newValue: 10, reason: "", correctedBy: "Engineer" }, NOW), code: "invalid-input", path: "reason", message: "must say why, in at least 3 characters" },
  { label: "a correction at a position the subgroup does not have", run: () => correctValue(db, { subgroupId: ids.imrSubgroup, position: 3, field: "value" }, { newValue: 10, reason: "typo", correctedBy: "Engineer" }, NOW), code: "invalid-input", path: "position", message: "Subgroup 3 has no value at position 3" },
  { label: "a count correction on a measured chart", run: () => correctValue(db, { subgroupId: ids.imrSubgroup, field: "count" }, { newValue: 10, reason: "typo", correctedBy: "Engineer" }, NOW), code: "invalid-input", path: "field", message: 'A imr chart has measured values: correct "value" at a position' },
  { label: "a corrected count above the sample size", run: () => correctValue(db, { subgroupId: ids.pSubgroup, field: "count" }, { newValue: 5000, reason: "typo", correctedBy: "Engineer" }, NOW), code: "invalid-input", path: "newValue", message: "count must not exceed the number inspected (size)" },
  { label: "a corrected count that is not whole", run: () => correctValue(db, { subgroupId: ids.pSubgroup, field: "count" }, { newValue: 2.5, reason: "typo", correctedBy: "Engineer" }, NOW), code: "invalid-input", path: "newValue", message: "count must be a whole number" },
  // Events
  { label: "an unknown event kind", run: () => recordEvent(db, processId, { occurredAt: at(1), kind: "coffee-break" as "maintenance", description: "break" }, NOW), code: "invalid-input", path: "kind", message: 'Invalid option: expected one of "lot-change"|"maintenance"|"setting-change"|"operator-change"|"shift-change"|"calibration"|"environment"' },
  { label: "a unit without a reading", run: () => recordEvent(db, processId, { occurredAt: at(1), kind: "environment", description: "dew point", unit: "°C" }, NOW), code: "invalid-input", path: "value", message: "is required when a unit is given" },
  { label: "an event for an unknown process", run: () => recordEvent(db, 424_242, { occurredAt: at(1), kind: "maintenance", description: "new heater band" }, NOW), code: "not-found", message: "Process 424242 does not exist" },
  // Characteristics
  { label: "an individuals chart with subgroups of two", run: () => createCharacteristic(db, { processId, name: "Odd one", unit: "mm", chartType: "imr", subgroupSize: 2 }), code: "invalid-input", path: "subgroupSize", message: "must be 1 for an individuals chart" },
  { label: "specification limits the wrong way round", run: () => createCharacteristic(db, { processId, name: "Odd two", unit: "mm", chartType: "imr", subgroupSize: 1, lowerSpecLimit: 5, upperSpecLimit: 4 }), code: "invalid-input", path: "upperSpecLimit", message: "must be above the lower specification limit" },
  { label: "a name already used on the process", run: () => createCharacteristic(db, { processId, name: "Neck height", unit: "mm", chartType: "imr", subgroupSize: 1 }), code: "conflict", path: "name", message: "is already used on this process" },
  { label: "a chart type change once subgroups are stored", run: () => updateCharacteristic(db, ids.imr, { processId, name: "Neck height", unit: "mm", chartType: "ewma", subgroupSize: 1 }), code: "conflict", path: "chartType", message: "cannot change once subgroups are stored" },
];

describe("malformed inputs change nothing", () => {
  test.each(cases.map((entry) => [entry.label, entry] as const))("%s", async (_label, entry) => {
    const before = await rowCounts(db);
    const error = await entry.run().then(
      () => undefined,
      (caught: unknown) => caught,
    );
    expect(error).toBeInstanceOf(AppError);
    const appError = error as AppError;
    expect(appError.code).toBe(entry.code);
    if (entry.path === undefined) expect(appError.message).toBe(entry.message);
    else expect(appError.issues).toContainEqual(expect.objectContaining({ path: entry.path, message: entry.message }));
    expect(await rowCounts(db)).toEqual(before);
  });

  test("the list covers at least 25 distinct inputs", () => {
    expect(new Set(cases.map((entry) => entry.label)).size).toBe(cases.length);
    expect(cases.length).toBeGreaterThanOrEqual(25);
  });
});
