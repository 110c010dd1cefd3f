/**
 * Average run lengths of the EWMA and tabular CUSUM charts by seeded simulation, against published tables.
 *
 * Each run applies frozen Phase II parameters (centre 0, σ = 1) to standard normal values shifted by δ,
 * through the engine's own `evaluateChart`, and records the first point beyond a limit (strictly).
 * Tolerance: 4 Monte Carlo standard errors of the mean run length (sample standard deviation / √runs),
 * so a correct engine fails with probability below 1e-4; the test also requires that standard error to
 * be at most 1.5% of the published ARL, so the check stays meaningful. Both schemes start at the target
 * (zero state, no head start), as the tables assume.
 */
import { describe, expect, test } from "vitest";
import { evaluateChart } from "@/src/spc/charts";
import { individualsData } from "@/src/spc/data";
import { createRng, type Rng } from "@/src/spc/random";
import type { ChartParameters, StatisticSeries } from "@/src/spc/types";

const BASELINE = { start: 0, end: 2, excluded: [], used: 2 } as const;

function firstSignal(statistics: readonly StatisticSeries[]): number {
  let first = -1;
  for (const series of statistics) {
    for (let index = 0; index < series.points.length; index++) {
      if (first >= 0 && index >= first) break;
      const point = series.points[index]!;
      if (point > series.ucl[index]! || point < series.lcl[index]!) {
        first = index;
        break;
      }
    }
  }
  return first;
}

/** One run length: values are generated once and the chart re-evaluated on a doubling window. */
function runLength(rng: Rng, shift: number, parameters: ChartParameters, initialLength: number): number {
  let values = new Float64Array(initialLength);
  let filled = 0;
  for (let length = initialLength; ; length *= 2) {
    if (values.length < length) {
      const grown = new Float64Array(length);
      grown.set(values);
      values = grown;
    }
    for (; filled < length; filled++) values[filled] = shift + rng.normal();
    const signal = firstSignal(evaluateChart(individualsData(values), parameters).statistics);
    if (signal >= 0) return signal + 1;
  }
}

function simulateArl(seed: number, runs: number, shift: number, parameters: ChartParameters, initialLength: number) {
  const rng = createRng(seed);
  let sum = 0;
  let sumOfSquares = 0;
  for (let run = 0; run < runs; run++) {
    const length = runLength(rng, shift, parameters, initialLength);
    sum += length;
    sumOfSquares += length * length;
  }
  const mean = sum / runs;
  const standardError = Math.sqrt((sumOfSquares / runs - mean * mean) / (runs - 1));
  return { mean, standardError };
}

function expectArl(simulated: { mean: number; standardError: number }, published: number): void {
  expect(simulated.standardError / published).toBeLessThan(0.015);
  expect(Math.abs(simulated.mean - published)).toBeLessThan(4 * simulated.standardError);
}

describe("two-sided tabular CUSUM, k = 0.5, h = 4 (Lucas & Crosier 1982, Technometrics 24, Table 1)", () => {
  const parameters: ChartParameters = {
    chart: "cusum",
    center: 0,
    sigma: 1,
    subgroupSize: 1,
    cusum: { k: 0.5, h: 4 },
    baseline: BASELINE,
  };

  test("in control: ARL 168 (computed 167.68)", () => {
    // 6000 runs: standard error about 168/√6000 ≈ 2.1 (1.3%).
    expectArl(simulateArl(11, 6000, 0, parameters, 256), 168);
  });

  test("1σ shift: ARL 8.38", () => {
    // Run lengths vary less at this shift (sd ≈ 4.8, measured), so 4000 runs give a standard error near 0.08.
    expectArl(simulateArl(12, 4000, 1, parameters, 32), 8.38);
  });
});

describe("EWMA λ = 0.5, L = 3.071, fixed asymptotic limits (Lucas & Saccucci 1990, Technometrics 32, Table 3)", () => {
  const parameters: ChartParameters = {
    chart: "ewma",
    center: 0,
    sigma: 1,
    subgroupSize: 1,
    ewma: { lambda: 0.5, L: 3.071, asymptoticLimits: true },
    baseline: BASELINE,
  };

  test("in control: ARL 500 (computed 499.91)", () => {
    // 6000 runs: standard error about 500/√6000 ≈ 6.5 (1.3%).
    expectArl(simulateArl(21, 6000, 0, parameters, 512), 500);
  });

  test("1σ shift: ARL 17.5 (computed 17.48)", () => {
    // 6000 runs: sd ≈ 15 (measured), standard error near 0.19 (1.1%).
    expectArl(simulateArl(22, 6000, 1, parameters, 64), 17.5);
  });
});
