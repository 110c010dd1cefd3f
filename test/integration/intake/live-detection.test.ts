// Live detection equals batch evaluation: a seeded series is appended point by point (and in small
// batches) after limits are frozen, and the stored signals must equal what the engine's batch functions
// (evaluateChart + evaluateRules on the whole series with the same frozen parameters) report, for every
// chart type; a second limit version, and the stored signals against a full re-evaluation.
import { describe, expect, test } from "vitest";
import { CHART_TYPES, VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import type { TSubgroupInput } from "@/shared/intake";
import { createCharacteristic } from "@/src/characteristics/setup";
import { chartParametersOf, limitSetsFor, reviseLimits } from "@/src/limits";
import { reevaluateSignals, signalsFor } from "@/src/signals";
import { evaluateChart } from "@/src/spc/charts";
import { attributesData, variablesData } from "@/src/spc/data";
import { evaluateRules, resolveRuleSet } from "@/src/spc/rules";
import { appendSubgroups } from "@/src/subgroups";
import { registerTestDatabase } from "./database";
import { seededSubgroups, SUBGROUP_SIZE } from "./series";

const openDatabase = registerTestDatabase("live");
const NOW = new Date("2026-06-01T12:00:00Z");
const BASELINE = 30;
const LENGTH = 140;

function chartData(chart: ChartType, inputs: readonly TSubgroupInput[]) {
  return VARIABLES_CHART_TYPES.includes(chart)
    ? variablesData(inputs.map((input) => input.values!))
    : attributesData(
        inputs.map((input) => input.count!),
        inputs.map((input) => (chart === "u" ? input.units! : chart === "c" ? 1 : input.size!)),
      );
}

const comparable = (signal: { rule: string; statistic?: string; chart?: string; startSequence?: number; start?: number; endSequence?: number; end?: number; firing: readonly number[]; side?: string | null }) => ({
  rule: signal.rule,
  statistic: signal.statistic ?? signal.chart,
  start: signal.startSequence ?? signal.start,
  end: signal.endSequence ?? signal.end,
  firing: [...signal.firing],
  side: signal.side ?? null,
});
const order = (a: ReturnType<typeof comparable>, b: ReturnType<typeof comparable>) =>
  a.start! - b.start! || a.rule.localeCompare(b.rule) || a.statistic!.localeCompare(b.statistic!);

describe("live detection equals batch evaluation", () => {
  test.each(CHART_TYPES.map((chart, index) => [chart, index] as const))("%s chart, appended point by point", async (chart, index) => {
    const { db, processId } = await openDatabase();
    const ruleSet = chart === "imr" || chart === "xbar-r" ? "nelson" : "we";
    const characteristic = await createCharacteristic(db, {
      processId,
      name: `Series ${chart}`,
      unit: VARIABLES_CHART_TYPES.includes(chart) ? "mm" : "items",
      chartType: chart,
      subgroupSize: SUBGROUP_SIZE[chart],
      ruleSet,
    });
    const inputs = seededSubgroups(chart, LENGTH, 1000 + index);
    const first = await appendSubgroups(db, characteristic.id, inputs.slice(0, BASELINE), { source: "import", now: NOW });
    expect(first.limits).toBeNull();
    expect(first.notes).toEqual(["no limits yet: the subgroups are stored and no rule was evaluated"]);
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: BASELINE, reason: "initial baseline", approvedBy: "Test engineer" }, NOW);
    // One point at a time, then the rest in batches of 1..4 so both paths run.
    let next = BASELINE;
    while (next < LENGTH) {
      const take = next < 90 ? 1 : 1 + (next % 4);
      await appendSubgroups(db, characteristic.id, inputs.slice(next, next + take), { source: "api", now: NOW });
      next += take;
    }
    const [limitSet] = await limitSetsFor(db, characteristic.id);
    const result = evaluateChart(chartData(chart, inputs), chartParametersOf(chart, limitSet!));
    const rules = resolveRuleSet(ruleSet);
    const expected = result.statistics.flatMap((series) => evaluateRules(series, rules).signals).map(comparable).sort(order);
    const stored = (await signalsFor(db, characteristic.id)).map(comparable).sort(order);
    expect(expected.length).toBeGreaterThan(0);
    expect(stored).toEqual(expected);

    // The cached EWMA/CUSUM state written live equals the engine's statistic, to the bit.
    if (chart === "ewma" || chart === "cusum") {
      const rows = await db.subgroup.findMany({ where: { characteristicId: characteristic.id }, orderBy: { sequence: "asc" } });
      const key = chart === "ewma" ? "ewma" : "cusum-upper";
      const engine = result.statistics.find((series) => series.key === key)!.points;
      expect(rows.map((row) => (chart === "ewma" ? row.ewma : row.cusumUpper))).toEqual(Array.from(engine));
    }

    // A full re-evaluation finds the same signals again (and keeps their detection times).
    const outcome = await reevaluateSignals(db, characteristic.id, { trigger: "request", reason: "check", requestedBy: "Test", now: new Date("2026-06-02T00:00:00Z") });
    expect(outcome.signalsAfter).toBe(outcome.signalsBefore);
    const again = await signalsFor(db, characteristic.id);
    expect(again.map(comparable).sort(order)).toEqual(expected);
    expect(again.every((signal) => signal.detectedAt.getTime() === NOW.getTime())).toBe(true);
  });

  test("a second limit version starts a fresh segment: live signals equal a re-evaluation", async () => {
    const { db, processId } = await openDatabase();
    const characteristic = await createCharacteristic(db, { processId, name: "Two versions", unit: "mm", chartType: "imr", subgroupSize: 1 });
    const inputs = seededSubgroups("imr", 160, 77, 70, 2);
    await appendSubgroups(db, characteristic.id, inputs.slice(0, 40), { source: "api", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 0, baselineEnd: 40, reason: "initial baseline", approvedBy: "A. Tester" }, NOW);
    for (let next = 40; next < 120; next++) await appendSubgroups(db, characteristic.id, [inputs[next]!], { source: "entry", now: NOW });
    await reviseLimits(db, characteristic.id, { baselineStart: 80, baselineEnd: 120, reason: "new level after the shift", approvedBy: "A. Tester" }, NOW);
    for (let next = 120; next < 160; next++) await appendSubgroups(db, characteristic.id, [inputs[next]!], { source: "entry", now: NOW });
    const live = (await signalsFor(db, characteristic.id)).map((signal) => ({ ...comparable(signal), version: signal.limitSetVersion })).sort(order);
    await reevaluateSignals(db, characteristic.id, { trigger: "request", reason: "check", requestedBy: "Test", now: NOW });
    const batch = (await signalsFor(db, characteristic.id)).map((signal) => ({ ...comparable(signal), version: signal.limitSetVersion })).sort(order);
    expect(live).toEqual(batch);
    expect(new Set(batch.map((signal) => signal.version))).toEqual(new Set([1, 2]));
    // Version 2 applies from its baseline start: no version-1 signal reaches past sequence 79.
    expect(batch.filter((signal) => signal.version === 1).every((signal) => signal.end! < 80)).toBe(true);
  });
});
