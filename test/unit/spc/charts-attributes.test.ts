/** Attributes charts against published worked examples, Phase I exclusions and Phase II frozen limits. */
import { describe, expect, test } from "vitest";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { attributesData } from "@/src/spc/data";
import { SpcInputError } from "@/src/spc/types";

// Montgomery, Introduction to Statistical Quality Control, orange-juice cans (Example 7.1): 30 samples of
// 50, as published (secondary) in published-values.md §6c.
const CANS = [12, 15, 8, 10, 4, 7, 16, 9, 14, 10, 5, 6, 17, 12, 22, 8, 10, 5, 13, 11, 20, 18, 24, 15, 9, 12, 7, 13, 9, 6];
const FIFTIES = CANS.map(() => 50);

describe("p chart: orange-juice cans (published (secondary), published-values.md §6c)", () => {
  const data = attributesData(CANS, FIFTIES);
  const parameters = estimateParameters("p", data);
  const [fraction] = evaluateChart(data, parameters).statistics;

  test("p-bar 0.2313333, sigma 0.05963526, limits 0.05242755 and 0.4102391", () => {
    // Published to 7 significant digits; no table constants involved: tolerance 1e-7.
    expect(Math.abs(parameters.center - 0.2313333)).toBeLessThan(1e-7);
    expect(Math.abs(fraction!.sigma[0]! - 0.05963526)).toBeLessThan(1e-7);
    expect(Math.abs(fraction!.lcl[0]! - 0.05242755)).toBeLessThan(1e-7);
    expect(Math.abs(fraction!.ucl[0]! - 0.4102391)).toBeLessThan(1e-7);
    expect(fraction!.points[14]).toBeCloseTo(22 / 50, 15);
  });

  test("Phase I: dropping samples 15 and 23 (indices 14, 22) gives the revised p-bar 0.215", () => {
    const revised = estimateParameters("p", data, { baseline: { exclude: [14, 22] } });
    expect(revised.center).toBeCloseTo(0.215, 12);
    expect(revised.baseline).toEqual({ start: 0, end: 30, excluded: [14, 22], used: 28 });
  });

  test("np chart on the same data: CL n·p-bar = 11.5667, limits 50·(p-bar ∓ 3σ)", () => {
    const [count] = evaluateChart(data, estimateParameters("np", data)).statistics;
    expect(count!.center).toBeCloseTo(347 / 30, 12);
    expect(Math.abs(count!.lcl[0]! - 50 * 0.05242755)).toBeLessThan(5e-6);
    expect(Math.abs(count!.ucl[0]! - 50 * 0.4102391)).toBeLessThan(5e-6);
  });

  test("Phase II: frozen parameters from the first 20 samples apply to all 30", () => {
    const frozen = estimateParameters("p", data, { baseline: { end: 20 } });
    const [later] = evaluateChart(data, frozen).statistics;
    const firstTwenty = CANS.slice(0, 20).reduce((sum, value) => sum + value, 0) / 1000;
    expect(frozen.center).toBeCloseTo(firstTwenty, 14);
    expect(later!.points.length).toBe(30);
    expect(later!.center).toBe(frozen.center);
  });
});

describe("p chart with varying sample sizes: per-subgroup limits", () => {
  test("each limit uses its own n (invented data)", () => {
    const data = attributesData([3, 10, 2], [40, 200, 10]);
    const parameters = estimateParameters("p", data);
    const [fraction] = evaluateChart(data, parameters).statistics;
    const pBar = 15 / 250;
    expect(parameters.center).toBeCloseTo(pBar, 15);
    [40, 200, 10].forEach((size, index) => {
      const sigma = Math.sqrt((pBar * (1 - pBar)) / size);
      expect(fraction!.sigma[index]).toBeCloseTo(sigma, 15);
      expect(fraction!.ucl[index]).toBeCloseTo(pBar + 3 * sigma, 15);
      expect(fraction!.lcl[index]).toBe(Math.max(0, pBar - 3 * sigma));
    });
    expect(fraction!.lcl[2]).toBe(0);
  });

  test("np refuses varying sample sizes, naming the subgroup", () => {
    expect(() => estimateParameters("np", attributesData([3, 10, 2], [40, 40, 10]))).toThrow(/subgroup 2/);
  });

  test("a defectives count above its sample size is refused for p and np", () => {
    const data = attributesData([3, 51], [50, 50]);
    expect(() => estimateParameters("p", data)).toThrow(/subgroup 1: 51 defectives exceed/);
    expect(() => estimateParameters("np", data)).toThrow(SpcInputError);
  });
});

describe("c chart: wafer defects (NIST/SEMATECH e-Handbook §6.3.3.1, via a third-party fixture; partly verified)", () => {
  const counts = [16, 14, 28, 16, 12, 20, 10, 12, 10, 17, 19, 17, 14, 16, 15, 13, 14, 16, 11, 20, 11, 19, 16, 31, 13];
  test("c-bar 16, limits 4 and 28", () => {
    const [defects] = evaluateChart(attributesData(counts), estimateParameters("c", attributesData(counts))).statistics;
    // Exact arithmetic (sqrt(16) = 4): tolerance 1e-12.
    expect(defects!.center).toBeCloseTo(16, 12);
    expect(defects!.lcl[0]).toBeCloseTo(4, 12);
    expect(defects!.ucl[0]).toBeCloseTo(28, 12);
    expect(defects!.zoneRulesByDefault).toBe(true);
  });
});

describe("u chart: per-subgroup limits with units (Montgomery §7.3 formulas; invented data)", () => {
  test("u-bar = Σc/Σn and limits u-bar ± 3√(u-bar/nᵢ), LCL truncated at 0", () => {
    const data = attributesData([12, 4, 30], [5, 1, 10]);
    const [rate] = evaluateChart(data, estimateParameters("u", data)).statistics;
    const uBar = 46 / 16;
    expect(rate!.center).toBeCloseTo(uBar, 15);
    expect(rate!.points[0]).toBeCloseTo(12 / 5, 15);
    [5, 1, 10].forEach((units, index) => {
      const sigma = Math.sqrt(uBar / units);
      expect(rate!.ucl[index]).toBeCloseTo(uBar + 3 * sigma, 14);
      expect(rate!.lcl[index]).toBe(Math.max(0, uBar - 3 * sigma));
    });
  });
});

describe("attributes input validation", () => {
  test("negative count, zero size, non-finite count each name the index", () => {
    expect(() => attributesData([1, -2], [5, 5])).toThrow(/count 1 is negative/);
    expect(() => attributesData([1, 2], [5, 0])).toThrow(/size 1 must be positive/);
    expect(() => attributesData([1, Number.NaN])).toThrow(/count 1 is not a finite number/);
    expect(() => attributesData([1, 2], [5, Number.POSITIVE_INFINITY])).toThrow(/size 1 is not a finite/);
  });

  test("a variables chart on counts, and an attributes chart on values, are refused", () => {
    expect(() => estimateParameters("imr", attributesData([1, 2, 3]))).toThrow(/needs measured values/);
  });
});
