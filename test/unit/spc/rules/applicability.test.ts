/**
 * Which rules apply where (issue 3: "no run rules on a range chart unless asked"; "attribute charts with
 * LCL truncated at 0 skip lower-zone tests where they are undefined; say so in the output").
 */
import { describe, expect, test } from "vitest";
import { NELSON_RULES, WESTERN_ELECTRIC_RULES } from "@/shared/constants";
import { evaluateRules } from "@/src/spc/rules";
import { alternate, fixedSeries, repeat } from "./series";

describe("skipped rules", () => {
  test("a range chart gets rule 1 only, and the others are listed with the reason", () => {
    const series = fixedSeries([...repeat(0.5, 9), 4], { key: "r", zoneRulesByDefault: false, floor: 0 });
    const evaluation = evaluateRules(series, NELSON_RULES);
    expect(evaluation.signals.map((signal) => signal.rule)).toEqual(["nelson-1"]);
    expect(evaluation.skipped.map((skipped) => skipped.rule)).toEqual(NELSON_RULES.slice(1));
    expect(evaluation.skipped[0]!.reason).toBe("run rules do not apply to a range chart unless asked");
  });

  test("asked with forceZoneRules, the run rules apply to a range chart", () => {
    const series = fixedSeries(repeat(0.5, 9), { key: "r", zoneRulesByDefault: false });
    const evaluation = evaluateRules(series, ["nelson-2"], { forceZoneRules: true });
    expect(evaluation.skipped).toEqual([]);
    expect(evaluation.signals.map((signal) => signal.rule)).toEqual(["nelson-2"]);
  });

  test("EWMA: the reason names the autocorrelation", () => {
    const series = fixedSeries(repeat(0.5, 9), { key: "ewma", zoneRulesByDefault: false });
    const { skipped } = evaluateRules(series, WESTERN_ELECTRIC_RULES);
    expect(skipped.map((entry) => entry.rule)).toEqual(["we-2", "we-3", "we-4"]);
    expect(skipped[0]!.reason).toMatch(/autocorrelated/);
  });

  test("CUSUM forced: rules needing zones are skipped (no sigma), direction and side rules run", () => {
    const series = { ...fixedSeries(repeat(0.5, 9), { key: "cusum-upper", zoneRulesByDefault: false }) };
    const noSigma = { ...series, sigma: new Float64Array(9).fill(Number.NaN) };
    const { skipped, signals } = evaluateRules(noSigma, NELSON_RULES, { forceZoneRules: true });
    expect(skipped.map((entry) => entry.rule)).toEqual(["nelson-5", "nelson-6", "nelson-7", "nelson-8"]);
    expect(skipped[0]!.reason).toMatch(/zones are undefined/);
    expect(signals.map((signal) => signal.rule)).toEqual(["nelson-2"]);
  });
});

describe("lower zone boundaries below the floor", () => {
  test("a note names the rules and the points where the lower 2σ boundary is undefined", () => {
    // A p chart: centre 0.05; sigma varies with the sample size; floor 0.
    const sigma = [0.03, 0.03, 0.02, 0.02, 0.03];
    const series = fixedSeries([0.05, 0.04, 0.06, 0.05, 0.05], { center: 0.05, sigma, floor: 0, lcl: 0, ucl: 0.14 });
    const { notes } = evaluateRules(series, ["we-2", "nelson-5", "nelson-6"]);
    expect(notes).toEqual([
      "x: the lower 2σ zone boundary is below the floor (0) at points 0–1, 4; we-2, nelson-5 cannot use points " +
        "below the centre line there.",
    ]);
  });

  test("Nelson 7 does not count points below the centre where the lower 1σ boundary is undefined", () => {
    // A c chart with a small centre: 0.5 ± 0.6 reaches below the floor 0.
    const values = alternate(0.4, 0.6, 15);
    const truncated = fixedSeries(values, { center: 0.5, sigma: 0.6, floor: 0, lcl: 0, ucl: 2.3 });
    const evaluation = evaluateRules(truncated, ["nelson-7"]);
    expect(evaluation.signals).toEqual([]);
    expect(evaluation.notes[0]).toMatch(/lower 1σ zone boundary is below the floor \(0\) at points 0–14; nelson-7/);
    const unbounded = fixedSeries(values, { center: 0.5, sigma: 0.6, ucl: 2.3, lcl: -1.3 });
    expect(evaluateRules(unbounded, ["nelson-7"]).signals.map((signal) => signal.end)).toEqual([14]);
  });

  test("no note when the boundaries stay above the floor, or for rules that need none", () => {
    const series = fixedSeries(repeat(5, 10), { center: 5, sigma: 1, floor: 0 });
    expect(evaluateRules(series, NELSON_RULES).notes).toEqual([]);
    const low = fixedSeries(repeat(0.5, 10), { center: 0.5, sigma: 1, floor: 0 });
    expect(evaluateRules(low, ["nelson-1", "nelson-2", "nelson-3", "nelson-4"]).notes).toEqual([]);
  });
});
