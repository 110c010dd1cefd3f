// The demo history's stored signals equal what `analyze` (src/spc/analyze.ts, the command line's pure
// composition) reports for the same data, the same baseline (subgroups 0–99) and the same rule set: the
// intake path (stored subgroups, frozen limit set v1, batch re-evaluation) and the analysis path agree
// signal for signal. Seeding time with limits and signals is printed as a figure for the report.
import { describe, expect, test, beforeAll } from "vitest";
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { limitSetsFor } from "@/src/limits";
import { DEMO_BASELINE, DEMO_LIMITS_APPROVER } from "@/src/demo/limits";
import { DEFAULT_DEMO_SEED, generateDemoScenario } from "@/src/demo/scenario";
import { seedDemoPlant, type SeedSummary } from "@/src/demo/seed";
import { signalsFor } from "@/src/signals";
import { analyze } from "@/src/spc/analyze";
import { attributesData, variablesData } from "@/src/spc/data";
import type { PrismaClient } from "@/src/db/connect";
import { appendSubgroups } from "@/src/subgroups";
import { registerTestDatabase } from "./database";

const openDatabase = registerTestDatabase("demo");
const END = new Date("2026-11-30T18:30:00Z");
let db: PrismaClient;
let summary: SeedSummary;

beforeAll(async () => {
  ({ db } = await openDatabase());
  await db.site.deleteMany();
  summary = await seedDemoPlant(db, { end: END });
  console.log(`Seeded the demo plant with ${summary.limitSets} limit sets and ${summary.signals} signals in ${summary.milliseconds} ms`);
});

describe("demo history signals", () => {
  const scenario = generateDemoScenario({ seed: DEFAULT_DEMO_SEED, end: END });

  test("each demo characteristic has limit set v1 from the documented baseline", async () => {
    expect(summary.limitSets).toBe(scenario.characteristics.length);
    for (const characteristic of await db.characteristic.findMany()) {
      const [limitSet, ...others] = await limitSetsFor(db, characteristic.id);
      expect(others).toEqual([]);
      expect(limitSet).toMatchObject({
        version: 1,
        baselineStart: DEMO_BASELINE.start,
        baselineEnd: DEMO_BASELINE.end,
        baselineUsed: DEMO_BASELINE.end - DEMO_BASELINE.start,
        appliesFrom: 0,
        approvedBy: DEMO_LIMITS_APPROVER,
        appliesTo: { from: 0, to: null },
      });
    }
    expect(await db.signalEvaluation.count({ where: { trigger: "limit-revision" } })).toBe(scenario.characteristics.length);
  });

  test.each(scenario.characteristics.map((characteristic) => [characteristic.name, characteristic] as const))(
    "%s: stored signals equal analyze's",
    async (_name, demo) => {
      const stored = await db.characteristic.findFirstOrThrow({ where: { name: demo.name }, select: { id: true } });
      const data = VARIABLES_CHART_TYPES.includes(demo.chartType)
        ? variablesData(demo.subgroups.map((subgroup) => subgroup.values))
        : attributesData(
            demo.subgroups.map((subgroup) => subgroup.count!),
            demo.subgroups.map((subgroup) => subgroup.size!),
          );
      const report = analyze(demo.chartType, data, { rules: demo.ruleSet, baseline: DEMO_BASELINE.end, subgroupSize: demo.subgroupSize });
      const expected = report.signals.map(({ rule, chart, start, end, firing, side }) => ({ rule, chart, start, end, firing, side: side ?? null }));
      const signals = (await signalsFor(db, stored.id)).map((signal) => ({
        rule: signal.rule,
        chart: signal.statistic,
        start: signal.startSequence,
        end: signal.endSequence,
        firing: signal.firing,
        side: signal.side,
      }));
      const order = (a: (typeof expected)[number], b: (typeof expected)[number]) =>
        a.start - b.start || a.rule.localeCompare(b.rule) || a.chart.localeCompare(b.chart);
      expect(expected.length).toBeGreaterThan(0);
      expect(signals.sort(order)).toEqual(expected.sort(order));
    },
  );

  test("the seeded history carries the cached summaries, so live appends continue it", async () => {
    for (const demo of scenario.characteristics) {
      const stored = await db.characteristic.findFirstOrThrow({ where: { name: demo.name }, select: { id: true } });
      const variables = VARIABLES_CHART_TYPES.includes(demo.chartType);
      const missing = await db.subgroup.count({ where: { characteristicId: stored.id, ...(variables ? { mean: null } : { count: null }) } });
      expect(missing).toBe(0);
      const last = demo.subgroups.at(-1)!;
      const next = {
        timestamp: new Date(last.timestamp.getTime() + 3_600_000).toISOString(),
        ...(variables ? { values: last.values } : demo.chartType === "u" ? { count: last.count!, units: last.size! } : { count: last.count!, size: last.size! }),
      };
      const result = await appendSubgroups(db, stored.id, [next], { source: "api", now: END });
      expect(result.limits?.version).toBe(1);
      expect(result.stored[0]!.sequence).toBe(demo.subgroups.length);
    }
  });

  test("signals inside planted episodes carry the pattern the engine reads", async () => {
    const withPattern = await db.signal.count({ where: { pattern: { not: null } } });
    expect(withPattern).toBeGreaterThan(0);
  });
});
