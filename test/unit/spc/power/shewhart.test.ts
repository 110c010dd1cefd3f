/**
 * Closed-form detection power of the 3-sigma Shewhart chart against the table in
 * /work/shared/reference/published-values.md §7 (formula: NIST Dataplot OC_XBAR.DP).
 * Published checks: ARL₁ 43.89 (δ = 1, n = 1), 6.30 (δ = 2), 2.00 (δ = 3) and in-control 370.40 —
 * Champ & Woodall (1987), Technometrics 29, Table 1, column C1 (published (secondary)); 43.9 also in
 * Montgomery & Runger, Applied Statistics and Probability for Engineers §16-6. The other figures are
 * the reference file's computed values, printed to 4 decimals: tolerance 5e-5 (half a unit in the
 * last printed digit).
 */
import { describe, expect, test } from "vitest";
import {
  shewhartAverageRunLength,
  shewhartMissProbability,
  shewhartSignalProbability,
  subgroupsNeeded,
} from "@/src/spc/power";
import { SpcInputError } from "@/src/spc/types";

describe("average run length (published)", () => {
  test.each([
    { delta: 0, arl: 370.4 },
    { delta: 1, arl: 43.89 },
    { delta: 2, arl: 6.3 },
    { delta: 3, arl: 2.0 },
  ])("δ = $delta, n = 1: ARL $arl (Champ & Woodall C1, 2 decimals: tolerance 0.005)", ({ delta, arl }) => {
    expect(Math.abs(shewhartAverageRunLength(delta, 1) - arl)).toBeLessThan(0.005);
  });
});

describe("signal probability within m subgroups (reference §7 table, computed)", () => {
  test.each([
    { n: 1, delta: 1, beta: 0.9772, within3: 0.0668, within5: 0.1088, within10: 0.2058 },
    { n: 1, delta: 2, beta: 0.8413, within3: 0.4044, within5: 0.5784, within10: 0.8223 },
    { n: 1, delta: 3, beta: 0.5, within3: 0.875, within5: 0.9688, within10: 0.999 },
    { n: 4, delta: 1, beta: 0.8413, within3: 0.4044, within5: 0.5784, within10: 0.8223 },
    { n: 5, delta: 1, beta: 0.7775, within3: 0.5299, within5: 0.7158, within10: 0.9192 },
    { n: 5, delta: 0.5, beta: 0.9701, within3: 0.0872, within5: 0.141, within10: 0.2621 },
  ])("n = $n, δ = $delta", ({ n, delta, beta, within3, within5, within10 }) => {
    const tolerance = 5e-5;
    expect(Math.abs(shewhartMissProbability(delta, n) - beta)).toBeLessThan(tolerance);
    expect(Math.abs(shewhartSignalProbability(delta, n, 3) - within3)).toBeLessThan(tolerance);
    expect(Math.abs(shewhartSignalProbability(delta, n, 5) - within5)).toBeLessThan(tolerance);
    expect(Math.abs(shewhartSignalProbability(delta, n, 10) - within10)).toBeLessThan(tolerance);
  });

  test("n = 5, δ = 2: β = 0.0705 (Montgomery's OC example prints 0.0708 with z rounded to −1.47, from memory)", () => {
    expect(shewhartMissProbability(2, 5)).toBeCloseTo(0.0705, 4);
  });

  test("δ = 0 gives rule 1's false-alarm probability 1 − (1 − 0.0027)^m", () => {
    // 0.0027 is 2Φ(−3) = 0.0026998 rounded; over 50 subgroups: 1 − 0.9973002^50 = 0.12625.
    expect(shewhartSignalProbability(0, 1, 50)).toBeCloseTo(1 - (1 - 0.0026998) ** 50, 5);
    expect(shewhartSignalProbability(0, 1, 0)).toBe(0);
  });
});

describe("subgroupsNeeded", () => {
  test.each([
    // δ = 1, n = 1, 90 %: β = 1 − 1/43.89 = 0.977218, log(0.1)/log(β) = 99.9 → 100.
    { delta: 1, n: 1, probability: 0.9, expected: 100 },
    // δ = 1, n = 5: log(0.1)/log(0.77749) = 9.16 → 10 (0.9192 within 10 in the §7 table, 0.896 within 9).
    { delta: 1, n: 5, probability: 0.9, expected: 10 },
    // δ = 2, n = 1: log(0.1)/log(0.84134) = 13.28 → 14.
    { delta: 2, n: 1, probability: 0.9, expected: 14 },
  ])("δ = $delta, n = $n, $probability → $expected", ({ delta, n, probability, expected }) => {
    const m = subgroupsNeeded({ delta, n, probability });
    expect(m).toBe(expected);
    expect(shewhartSignalProbability(delta, n, m)).toBeGreaterThanOrEqual(probability);
    expect(shewhartSignalProbability(delta, n, m - 1)).toBeLessThan(probability);
  });

  test("defaults are δ = 1, n = 1, 90 %", () => {
    expect(subgroupsNeeded()).toBe(100);
  });

  test("bad input is refused", () => {
    expect(() => subgroupsNeeded({ probability: 1 })).toThrow(SpcInputError);
    expect(() => shewhartSignalProbability(1, 0, 5)).toThrow(/subgroup size/);
    expect(() => shewhartSignalProbability(Number.NaN, 1, 5)).toThrow(/delta/);
    expect(() => shewhartSignalProbability(1, 1, 2.5)).toThrow(/number of subgroups/);
  });
});
