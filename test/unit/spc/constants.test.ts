/**
 * Control-chart constants against published values.
 *
 * Source of the table: published-values.md §1b, the exact constants rounded to 4 decimals (5 for c4, d2,
 * d3), which match digit for digit a published 4-decimal table of Shewhart constants for n = 2..24 (as
 * stated there); the 4-decimal values pinned separately below are the published ones named in §1b.
 * Tolerance: half a unit in the last printed digit (the table is a rounding of the exact values).
 */
import { describe, expect, test } from "vitest";
import { c4, controlConstants, d2, d3 } from "@/src/spc/constants";
import { SpcInputError } from "@/src/spc/types";

// n, A2, A3, c4, B3, B4, d2, d3, D3, D4, E2
const TABLE: readonly (readonly number[])[] = [
  [2, 1.88, 2.6587, 0.79788, 0, 3.2665, 1.12838, 0.8525, 0, 3.2665, 2.6587],
  [3, 1.0233, 1.9544, 0.88623, 0, 2.5682, 1.69257, 0.88837, 0, 2.5746, 1.7725],
  [4, 0.7286, 1.6281, 0.92132, 0, 2.266, 2.05875, 0.87981, 0, 2.2821, 1.4572],
  [5, 0.5768, 1.4273, 0.93999, 0, 2.089, 2.32593, 0.86408, 0, 2.1145, 1.2898],
  [6, 0.4832, 1.2871, 0.95153, 0.0304, 1.9696, 2.53441, 0.84804, 0, 2.0038, 1.1837],
  [7, 0.4193, 1.1819, 0.95937, 0.1177, 1.8823, 2.70436, 0.83321, 0.0757, 1.9243, 1.1093],
  [8, 0.3725, 1.0991, 0.96503, 0.1851, 1.8149, 2.8472, 0.81983, 0.1362, 1.8638, 1.0537],
  [9, 0.3367, 1.0317, 0.96931, 0.2391, 1.7609, 2.97003, 0.80783, 0.184, 1.816, 1.0101],
  [10, 0.3083, 0.9754, 0.97266, 0.2837, 1.7163, 3.07751, 0.79705, 0.223, 1.777, 0.9748],
  [11, 0.2851, 0.9274, 0.97535, 0.3213, 1.6787, 3.17287, 0.78731, 0.2556, 1.7444, 0.9455],
  [12, 0.2658, 0.8859, 0.97756, 0.3535, 1.6465, 3.25846, 0.77848, 0.2833, 1.7167, 0.9207],
  [13, 0.2494, 0.8495, 0.97941, 0.3816, 1.6184, 3.33598, 0.77042, 0.3072, 1.6928, 0.8993],
  [14, 0.2354, 0.8173, 0.98097, 0.4062, 1.5938, 3.40676, 0.76302, 0.3281, 1.6719, 0.8806],
  [15, 0.2231, 0.7885, 0.98232, 0.4282, 1.5718, 3.47183, 0.75621, 0.3466, 1.6534, 0.8641],
  [16, 0.2123, 0.7626, 0.98348, 0.4479, 1.5521, 3.53198, 0.74991, 0.363, 1.637, 0.8494],
  [17, 0.2028, 0.7391, 0.98451, 0.4657, 1.5343, 3.58788, 0.74405, 0.3779, 1.6221, 0.8361],
  [18, 0.1943, 0.7176, 0.98541, 0.4818, 1.5182, 3.64006, 0.73859, 0.3913, 1.6087, 0.8242],
  [19, 0.1866, 0.6979, 0.98621, 0.4966, 1.5034, 3.68896, 0.73348, 0.4035, 1.5965, 0.8132],
  [20, 0.1796, 0.6797, 0.98693, 0.5102, 1.4898, 3.73495, 0.72869, 0.4147, 1.5853, 0.8032],
  [21, 0.1733, 0.6629, 0.98758, 0.5228, 1.4772, 3.77834, 0.72417, 0.425, 1.575, 0.794],
  [22, 0.1675, 0.6473, 0.98817, 0.5344, 1.4656, 3.81938, 0.71991, 0.4345, 1.5655, 0.7855],
  [23, 0.1621, 0.6327, 0.9887, 0.5452, 1.4548, 3.85832, 0.71589, 0.4434, 1.5566, 0.7775],
  [24, 0.1572, 0.6191, 0.98919, 0.5553, 1.4447, 3.89535, 0.71207, 0.4516, 1.5484, 0.7701],
  [25, 0.1526, 0.6063, 0.98964, 0.5648, 1.4352, 3.93063, 0.70844, 0.4593, 1.5407, 0.7632],
];

const FOUR_DECIMALS = 0.5e-4 + 1e-12;
const FIVE_DECIMALS = 0.5e-5 + 1e-12;

describe("constants match the 4-decimal table (published-values.md §1b)", () => {
  test.each(TABLE.map((row) => ({ n: row[0]!, row })))("n = $n", ({ n, row }) => {
    const [, A2, A3, tableC4, B3, B4, tableD2, tableD3, D3, D4, E2] = row;
    const computed = controlConstants(n);
    expect(Math.abs(computed.A2 - A2!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.A3 - A3!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.c4 - tableC4!)).toBeLessThanOrEqual(FIVE_DECIMALS);
    expect(Math.abs(computed.B3 - B3!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.B4 - B4!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.d2 - tableD2!)).toBeLessThanOrEqual(FIVE_DECIMALS);
    expect(Math.abs(computed.d3 - tableD3!)).toBeLessThanOrEqual(FIVE_DECIMALS);
    expect(Math.abs(computed.D3 - D3!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.D4 - D4!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(Math.abs(computed.E2 - E2!)).toBeLessThanOrEqual(FOUR_DECIMALS);
    expect(d2(n)).toBe(computed.d2);
    expect(d3(n)).toBe(computed.d3);
    expect(c4(n)).toBe(computed.c4);
  });
});

describe("exact identities", () => {
  test("n = 2: d2 = 2/√π, d3 = √(2 − 4/π) (W = |X1 − X2| = √2·|Z|), c4 = √(2/π), c4·√2 = d2", () => {
    // The integration is designed to a relative 1e-12; these are closed forms.
    expect(d2(2)).toBeCloseTo(2 / Math.sqrt(Math.PI), 12);
    expect(d3(2)).toBeCloseTo(Math.sqrt(2 - 4 / Math.PI), 12);
    expect(c4(2)).toBeCloseTo(Math.sqrt(2 / Math.PI), 14);
    expect(c4(2) * Math.SQRT2).toBeCloseTo(d2(2), 12);
  });

  test("n = 3: d2 = 3/√π (the mean range of three normals has a closed form, Tippett 1925)", () => {
    expect(d2(3)).toBeCloseTo(3 / Math.sqrt(Math.PI), 12);
  });
});

describe("published table digits where tables disagree (published-values.md §1d)", () => {
  test("D4(3) rounds to 2.575, not the classic 2.574; D4(18) to 1.609; E2(2) to 2.659, not 3/1.128 = 2.660", () => {
    expect(controlConstants(3).D4).toBeCloseTo(2.57459, 5);
    expect(controlConstants(18).D4).toBeCloseTo(1.60872, 5);
    expect(controlConstants(2).E2).toBeCloseTo(2.65868, 5);
  });
});

describe("sizes outside 2..25", () => {
  test.each([1, 26, 2.5, Number.NaN, 0, -3])("n = %s throws SpcInputError", (n) => {
    expect(() => controlConstants(n)).toThrow(SpcInputError);
  });
});
