/**
 * Variables charts against published worked examples. Published limits were computed with rounded table
 * constants (d2 = 1.128, A2 = 0.577, D4 = 2.114, 3.267); the engine uses exact constants, so each check
 * states a tolerance covering that rounding (worked out beside it).
 */
import { describe, expect, test } from "vitest";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { individualsData, variablesData } from "@/src/spc/data";
import { SpcInputError, type StatisticSeries } from "@/src/spc/types";
import { PISTON_RINGS } from "./fixtures/piston-rings";

function series(statistics: readonly StatisticSeries[], key: string): StatisticSeries {
  const found = statistics.find((candidate) => candidate.key === key);
  if (found === undefined) throw new Error(`no ${key} series`);
  return found;
}

describe("X-bar and R chart: piston rings (Montgomery, published (secondary), published-values.md §6a)", () => {
  const data = variablesData(PISTON_RINGS);
  const parameters = estimateParameters("xbar-r", data);
  const result = evaluateChart(data, parameters);
  const mean = series(result.statistics, "xbar");
  const range = series(result.statistics, "r");

  test("grand mean 74.00118 and sigma R-bar/d2 = 0.009785 (published with d2 = 2.326)", () => {
    // Grand mean is exact arithmetic: tolerance 5e-6 covers the 5-decimal print.
    expect(parameters.center).toBeCloseTo(74.00118, 5);
    // d2 = 2.326 vs exact 2.325929: relative 3e-5, so 0.009785 ± 1e-6.
    expect(Math.abs(parameters.sigma - 0.009785039)).toBeLessThan(1e-6);
    expect(range.center).toBeCloseTo(0.02276, 6);
  });

  test("X-bar limits 73.98805 and 74.0143", () => {
    // A2 = 0.577 vs exact 0.576825 moves the limits by 0.000175·R-bar = 4e-6; tolerance 1e-5.
    expect(Math.abs(mean.lcl[0]! - 73.98805)).toBeLessThan(1e-5);
    expect(Math.abs(mean.ucl[0]! - 74.0143)).toBeLessThan(1e-5);
  });

  test("R chart LCL 0 and UCL 0.04812533", () => {
    expect(range.lcl[0]).toBe(0);
    // Published UCL uses exact-ish D4; the recomputed exact value is 0.04813: tolerance 2e-5.
    expect(Math.abs(range.ucl[0]! - 0.04812533)).toBeLessThan(2e-5);
  });

  test("S-bar 0.009240037 on the same data (published (secondary))", () => {
    const sChart = evaluateChart(data, estimateParameters("xbar-s", data));
    // Arithmetic only: tolerance 1e-9.
    expect(Math.abs(series(sChart.statistics, "s").center - 0.009240037)).toBeLessThan(1e-9);
  });

  test("ragged subgroups are refused naming the first odd subgroup", () => {
    const ragged = variablesData([...PISTON_RINGS.slice(0, 3), [74, 74.01, 74.02], ...PISTON_RINGS.slice(3)]);
    expect(() => estimateParameters("xbar-r", ragged)).toThrow(SpcInputError);
    expect(() => estimateParameters("xbar-s", ragged)).toThrow(/subgroup 3 has 3 values/);
  });
});

describe("I-MR chart: NIST/SEMATECH e-Handbook §6.3.2.2 flow rate (published)", () => {
  const data = individualsData([49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1]);
  const result = evaluateChart(data, estimateParameters("imr", data));
  const individual = series(result.statistics, "x");
  const movingRange = series(result.statistics, "mr");

  test("centre 50.81 and MR-bar 1.8778", () => {
    expect(individual.center).toBeCloseTo(50.81, 10);
    expect(movingRange.center).toBeCloseTo(1.8778, 4);
    expect(Number.isNaN(movingRange.points[0]!)).toBe(true);
  });

  test("limits 45.8159 and 55.8041 (NIST uses d2 = 1.128)", () => {
    // Exact d2 = 1.128379 gives 45.8176 / 55.8024: a difference of 0.0017, so tolerance 0.002.
    expect(Math.abs(individual.lcl[0]! - 45.8159)).toBeLessThan(0.002);
    expect(Math.abs(individual.ucl[0]! - 55.8041)).toBeLessThan(0.002);
  });

  test("MR chart UCL 3.267·MR-bar = 6.1347 (computed from the published MR-bar with the table D4)", () => {
    // Exact D4 = 3.26653 gives 6.1338: tolerance 0.001.
    expect(Math.abs(movingRange.ucl[0]! - 6.1347)).toBeLessThan(0.001);
    expect(movingRange.lcl[0]).toBe(0);
  });
});

describe("I-MR chart: Montgomery viscosity, 20 batches (published (secondary), published-values.md §6b)", () => {
  const data = individualsData([
    34.05, 34.4, 33.59, 35.96, 34.7, 33.51, 33.79, 34.04, 34.52, 33.75, 33.27, 33.71, 34.03, 34.58, 34.02, 33.97,
    34.05, 34.04, 33.73, 34.05,
  ]);
  const parameters = estimateParameters("imr", data);
  const individual = series(evaluateChart(data, parameters).statistics, "x");

  test("CL 34.088, limits 32.56504 and 35.61096 (published with d2 = 1.128)", () => {
    expect(parameters.center).toBeCloseTo(34.088, 10);
    // Exact d2 gives 32.56556 / 35.61044: tolerance 6e-4 covers the d2 rounding.
    expect(Math.abs(individual.lcl[0]! - 32.56504)).toBeLessThan(6e-4);
    expect(Math.abs(individual.ucl[0]! - 35.61096)).toBeLessThan(6e-4);
    // sigma published as 0.5076521 with d2 = 1.128: relative rounding 3.4e-4.
    expect(Math.abs(parameters.sigma / 0.5076521 - 1)).toBeLessThan(4e-4);
  });
});
