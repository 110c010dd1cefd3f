/**
 * EWMA and CUSUM formulas on small hand-checkable series, Phase I/II behaviour, and the zone convention.
 * Expected values are worked out beside each check from the formulas in the chart files (Montgomery,
 * Introduction to Statistical Quality Control, §9.1–9.2); data are invented.
 */
import { describe, expect, test } from "vitest";
import { DEFAULT_CUSUM_DESIGN, DEFAULT_EWMA_DESIGN, estimateParameters, evaluateChart, zoneOf } from "@/src/spc/charts";
import { individualsData, variablesData } from "@/src/spc/data";
import type { ChartParameters } from "@/src/spc/types";

const BASELINE = { start: 0, end: 3, excluded: [], used: 3 } as const;

describe("EWMA", () => {
  const parameters: ChartParameters = {
    chart: "ewma",
    center: 10,
    sigma: 2,
    subgroupSize: 1,
    ewma: { lambda: 0.2, L: 3 },
    baseline: BASELINE,
  };

  test("z_i = λx_i + (1 − λ)z_{i−1} from z_0 = centre, with exact time-varying limits", () => {
    const [series] = evaluateChart(individualsData([12, 8, 15]), parameters).statistics;
    // z1 = 0.2·12 + 0.8·10 = 10.4; z2 = 0.2·8 + 0.8·10.4 = 9.92; z3 = 0.2·15 + 0.8·9.92 = 10.936.
    expect(Array.from(series!.points)).toEqual([10.4, 9.92, 10.936].map((value) => expect.closeTo(value, 12)));
    // σ_1 = 2·√(0.2/1.8·(1 − 0.8²)) = 2·√0.04 = 0.4, so UCL_1 = 11.2.
    expect(series!.sigma[0]).toBeCloseTo(0.4, 12);
    expect(series!.ucl[0]).toBeCloseTo(11.2, 12);
    expect(series!.lcl[0]).toBeCloseTo(8.8, 12);
    const asymptotic = 2 * Math.sqrt(0.2 / 1.8);
    expect(series!.sigma[2]).toBeCloseTo(asymptotic * Math.sqrt(1 - 0.8 ** 6), 12);
    expect(series!.zoneRulesByDefault).toBe(false);
  });

  test("asymptotic limits use σ·√(λ/(2 − λ)) from the first point", () => {
    const fixed = { ...parameters, ewma: { lambda: 0.2, L: 3, asymptoticLimits: true } };
    const [series] = evaluateChart(individualsData([12, 8, 15]), fixed).statistics;
    expect(series!.ucl[0]).toBeCloseTo(10 + 3 * 2 * Math.sqrt(0.2 / 1.8), 12);
    expect(series!.ucl[2]).toBe(series!.ucl[0]);
  });

  test("on subgroup means, σ_x̄ = σ/√n; default design λ = 0.2, L = 3", () => {
    const data = variablesData([
      [1, 2, 3, 4],
      [2, 3, 4, 5],
      [0, 2, 2, 4],
    ]);
    const estimated = estimateParameters("ewma", data);
    expect(estimated.ewma).toEqual(DEFAULT_EWMA_DESIGN);
    expect(estimated.subgroupSize).toBe(4);
    const [series] = evaluateChart(data, estimated).statistics;
    const meanSigma = estimated.sigma / 2;
    expect(series!.sigma[0]).toBeCloseTo(meanSigma * Math.sqrt((0.2 / 1.8) * (1 - 0.64)), 12);
  });

  test("design outside its range is refused", () => {
    expect(() => estimateParameters("ewma", individualsData([1, 2, 3]), { ewma: { lambda: 0, L: 3 } })).toThrow(/lambda/);
    expect(() => estimateParameters("ewma", individualsData([1, 2, 3]), { ewma: { lambda: 0.3, L: -1 } })).toThrow(/L must/);
  });
});

describe("tabular CUSUM", () => {
  const parameters: ChartParameters = {
    chart: "cusum",
    center: 10,
    sigma: 2,
    subgroupSize: 1,
    cusum: { k: 0.5, h: 4 },
    baseline: BASELINE,
  };

  test("C⁺ and C⁻ in data units, decision interval h·σ, LCL 0", () => {
    const statistics = evaluateChart(individualsData([13, 14, 9, 4, 10]), parameters).statistics;
    const [upper, lower] = statistics;
    // K = kσ = 1. C⁺: max(0, 3 − 1) = 2; 2 + 4 − 1 = 5; 5 − 1 − 1 = 3; 3 − 6 − 1 < 0 → 0; 0 + 0 − 1 → 0.
    expect(Array.from(upper!.points)).toEqual([2, 5, 3, 0, 0]);
    // C⁻: 0; 0; max(0, 1 − 1) = 0; 6 − 1 = 5; 5 + 0 − 1 = 4.
    expect(Array.from(lower!.points)).toEqual([0, 0, 0, 5, 4]);
    expect(upper!.key).toBe("cusum-upper");
    expect(lower!.key).toBe("cusum-lower");
    expect(upper!.ucl[0]).toBe(8);
    expect(lower!.lcl[0]).toBe(0);
    expect(upper!.center).toBe(0);
    expect(Number.isNaN(upper!.sigma[0]!)).toBe(true);
    expect(upper!.zoneRulesByDefault).toBe(false);
  });

  test("default design k = 0.5, h = 5; a target replaces the baseline mean", () => {
    const estimated = estimateParameters("cusum", individualsData([1, 2, 3, 2]), { target: 2.5 });
    expect(estimated.cusum).toEqual(DEFAULT_CUSUM_DESIGN);
    expect(estimated.center).toBe(2.5);
  });
});

describe("Phase I and Phase II", () => {
  const values = [5, 6, 5, 7, 30, 6, 5, 6, 7, 5, 40, 42];

  test("excluded points leave the centre and their moving ranges out of the estimate", () => {
    const data = individualsData(values);
    const parameters = estimateParameters("imr", data, { baseline: { end: 10, exclude: [4] } });
    const kept = [5, 6, 5, 7, 6, 5, 6, 7, 5];
    expect(parameters.center).toBeCloseTo(kept.reduce((sum, value) => sum + value, 0) / kept.length, 12);
    // Moving ranges with both ends kept: |6−5|, |5−6|, |7−5|, |5−6|, |6−5|, |7−6|, |5−7| → mean 9/7.
    expect(parameters.sigma).toBeCloseTo(9 / 7 / (2 / Math.sqrt(Math.PI)), 12);
    expect(parameters.baseline).toEqual({ start: 0, end: 10, excluded: [4], used: 9 });
    // Phase II: the frozen limits apply to every point, including the later ones.
    const [individual] = evaluateChart(data, parameters).statistics;
    expect(individual!.points.length).toBe(12);
    expect(individual!.points[11]!).toBeGreaterThan(individual!.ucl[11]!);
  });

  test("bad baselines are refused", () => {
    const data = individualsData(values);
    expect(() => estimateParameters("imr", data, { baseline: { end: 40 } })).toThrow(/baseline end/);
    expect(() => estimateParameters("imr", data, { baseline: { end: 5, exclude: [7] } })).toThrow(/excluded subgroup 7/);
    expect(() => estimateParameters("imr", data, { baseline: { end: 2, exclude: [0] } })).toThrow(/keeps 1 subgroup/);
  });

  test("Phase II X-bar/R data must keep the frozen subgroup size", () => {
    const frozen = estimateParameters("xbar-r", variablesData([[1, 2, 3], [2, 3, 4]]));
    expect(() => evaluateChart(variablesData([[1, 2, 3], [1, 2]]), frozen)).toThrow(/subgroup 1 has 2 values where 3/);
  });
});

describe("zoneOf: strict boundaries, a point exactly at kσ is in the inner zone", () => {
  test.each([
    [10, 0],
    [10.5, 1],
    [11, 1],
    [11.0001, 2],
    [12, 2],
    [13, 3],
    [13.0001, 4],
    [9, -1],
    [7, -3],
    [6.9, -4],
  ])("value %s → zone %s (centre 10, σ 1)", (value, zone) => {
    expect(zoneOf(value, 10, 1)).toBe(zone);
  });

  test("σ = 0: on centre 0, elsewhere ±4; NaN value or σ gives NaN", () => {
    expect(zoneOf(10, 10, 0)).toBe(0);
    expect(zoneOf(10.1, 10, 0)).toBe(4);
    expect(zoneOf(9.9, 10, 0)).toBe(-4);
    expect(zoneOf(Number.NaN, 10, 1)).toBeNaN();
    expect(zoneOf(11, 10, Number.NaN)).toBeNaN();
  });
});
