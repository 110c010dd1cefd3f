import { describe, expect, test } from "vitest";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { individualsData, variablesData } from "@/src/spc/data";
import { calibratePatterns, DEFAULT_CALIBRATION_DESIGN, SIMULATED_KINDS } from "@/src/spc/patterns/calibration";
import { patternReport, readPatterns, simulatePattern } from "@/src/spc/patterns";
import { createRng } from "@/src/spc/random";
import { evaluateRules, resolveRuleSet } from "@/src/spc/rules";
import type { ChartData, ChartType } from "@/src/spc/types";

function read(chart: ChartType, data: ChartData, baselineEnd: number, printedValues?: string[]) {
  const result = evaluateChart(data, estimateParameters(chart, data, { baseline: { end: baselineEnd } }));
  const signals = result.statistics.flatMap((series) => evaluateRules(series, resolveRuleSet("nelson")).signals);
  return readPatterns(result, signals, data, printedValues ? { printedValues } : {});
}

describe("readPatterns on seeded simulations (invented data)", () => {
  // A small version of scripts/calibrate-patterns.ts: 4 series per cell, 48 per kind (about 2 s).
  // The minimums are the accuracies this seed gives, rounded down to the next 5 %, and sit at or below
  // those of the large run in docs/patterns-and-verification.md; a change to the classifier that costs
  // more than that on any kind fails here.
  const result = calibratePatterns({ ...DEFAULT_CALIBRATION_DESIGN, replicates: 4, seed: 11 });
  const minimums = {
    none: 0.7,
    shift: 0.9,
    trend: 0.9,
    cycle: 0.6,
    mixture: 0.7,
    stratification: 0.85,
    outlier: 0.65,
    spread: 0.8,
  } as const;
  test.each(SIMULATED_KINDS.map((kind) => ({ kind })))("$kind is read correctly often enough", ({ kind }) => {
    expect(result.accuracy[kind]).toBeGreaterThanOrEqual(minimums[kind]);
  });
});

describe("readPatterns on constructed cases", () => {
  test("a long in-control series without signals reports no pattern", () => {
    const rng = createRng(1);
    // Individuals chart with the Western Electric rules: the seed gives a series without any firing,
    // and without a signal there is nothing to read.
    const { data } = simulatePattern({ kind: "none", subgroupSize: 5, baseline: 40, monitoring: 10, onset: 45, size: 0 }, rng);
    const result = evaluateChart(data, estimateParameters("xbar-r", data, { baseline: { end: 40 } }));
    const signals = result.statistics.flatMap((series) => evaluateRules(series, resolveRuleSet("we")).signals);
    expect(signals).toEqual([]);
    expect(readPatterns(result, signals, data)).toEqual([]);
  });

  test("a step of 3σ is a shift whose change point window holds the true change", () => {
    const rng = createRng(5);
    const { data } = simulatePattern({ kind: "shift", subgroupSize: 5, baseline: 30, monitoring: 30, onset: 40, size: 3 }, rng);
    const patterns = read("xbar-r", data, 30);
    const shift = patterns.find((pattern) => pattern.kind === "shift");
    expect(shift?.changePoint?.model).toBe("step");
    // The last in-control subgroup is 39.
    expect(shift!.changePoint!.window.start).toBeLessThanOrEqual(39);
    expect(shift!.changePoint!.window.end).toBeGreaterThanOrEqual(39);
    expect(shift!.evidence.shiftInSigma).toBeGreaterThan(2);
    expect(shift!.causes.map((cause) => cause.category)).toContain("material");
  });

  test("an isolated transposed reading is an outlier with the intended value", () => {
    const rng = createRng(9);
    const values = Array.from({ length: 50 }, () => Math.round((2.62 + 0.02 * rng.normal()) * 100) / 100);
    values[44] = 2.26;
    const printed = values.map((value) => value.toFixed(2));
    const patterns = read("imr", individualsData(values), 40, printed);
    const outlier = patterns.find((pattern) => pattern.kind === "outlier");
    expect(outlier?.start).toBe(44);
    expect(outlier?.evidence.recordingSlip?.candidates[0]).toMatchObject({ slip: "transposed-digits", text: "2.62" });
    expect(outlier?.causes.map((cause) => cause.category)).toEqual(["measurement", "people", "material"]);
    // The outlier's two large moving ranges are not read as a separate change in spread.
    expect(patterns.filter((pattern) => pattern.kind === "spread")).toEqual([]);
  });

  test("a misplaced decimal point on a subgroup chart names the reading inside the subgroup", () => {
    const rng = createRng(13);
    const subgroups = Array.from({ length: 40 }, () => Array.from({ length: 4 }, () => Math.round((2.6 + 0.03 * rng.normal()) * 100) / 100));
    subgroups[35]![2] = 26.1;
    const patterns = read("xbar-r", variablesData(subgroups), 30);
    const outlier = patterns.find((pattern) => pattern.kind === "outlier");
    expect(outlier?.evidence.recordingSlip).toMatchObject({ printed: "26.1", valueIndex: 35 * 4 + 2 });
    expect(outlier?.evidence.recordingSlip?.candidates[0]).toMatchObject({ slip: "misplaced-decimal", value: 2.61 });
  });
});

describe("patternReport", () => {
  test("lists each pattern's change point with its chart and kind", () => {
    const rng = createRng(5);
    const { data } = simulatePattern({ kind: "shift", subgroupSize: 5, baseline: 30, monitoring: 30, onset: 40, size: 3 }, rng);
    const result = evaluateChart(data, estimateParameters("xbar-r", data, { baseline: { end: 30 } }));
    const signals = result.statistics.flatMap((series) => evaluateRules(series, resolveRuleSet("nelson")).signals);
    const report = patternReport(result, signals, data);
    expect(report.changePoints.length).toBe(report.patterns.filter((pattern) => pattern.changePoint).length);
    expect(report.changePoints[0]).toMatchObject({ chart: "xbar", kind: "shift", model: "step" });
  });
});
