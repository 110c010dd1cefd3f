/**
 * Autocorrelation (Box & Jenkins definition) and periodogram / Fisher's g test.
 * Hand computations are written out in the comments; simulation checks are seeded.
 */
import { describe, expect, test } from "vitest";
import { autocorrelation, dominantPeriod, fisherGPValue, periodogram, whiteNoiseBand } from "@/src/spc/evidence";
import { createRng } from "@/src/spc/random";
import { SpcInputError } from "@/src/spc/types";

describe("autocorrelation", () => {
  test("matches a hand computation on 1, 2, 3, 4, 5", () => {
    // Mean 3, deviations −2 −1 0 1 2; Σd² = 10. Lag 1: (2 + 0 + 0 + 2) = 4 → r1 = 0.4.
    // Lag 2: (−2·0) + (−1·1) + (0·2) = −1 → r2 = −0.1. Lag 3: (−2·1) + (−1·2) = −4 → r3 = −0.4.
    const r = autocorrelation(Float64Array.of(1, 2, 3, 4, 5), 3);
    expect(Array.from(r)).toEqual([1, 0.4, -0.1, -0.4].map((value) => expect.closeTo(value, 12)));
  });

  test("a sine wave of period 8 has r_8 near +1 and r_4 near −1", () => {
    const values = Float64Array.from({ length: 96 }, (_, index) => Math.sin((2 * Math.PI * index) / 8));
    const r = autocorrelation(values, 8);
    // With divisor N the lag-k value shrinks by (N − k)/N: 88/96 and 92/96.
    expect(r[8]).toBeCloseTo(88 / 96, 9);
    expect(r[4]).toBeCloseTo(-92 / 96, 9);
  });

  test("white noise stays mostly inside the 1.96/√N band (about 95 % of lags)", () => {
    const rng = createRng(11);
    const values = Float64Array.from({ length: 400 }, () => rng.normal());
    const r = autocorrelation(values, 40);
    const band = whiteNoiseBand(400);
    const outside = Array.from(r.subarray(1)).filter((value) => Math.abs(value) > band).length;
    // Expected 2 of 40; 8 or more would happen with probability < 0.001 (binomial(40, 0.05)).
    expect(outside).toBeLessThan(8);
  });

  test("refusals: constant data, NaN, bad lag", () => {
    expect(() => autocorrelation(new Float64Array(10).fill(2), 3)).toThrow(/constant/);
    expect(() => autocorrelation(Float64Array.of(1, 2, Number.NaN, 4), 1)).toThrow(/index 2/);
    expect(() => autocorrelation(Float64Array.of(1, 2, 3, 4), 4)).toThrow(SpcInputError);
  });
});

describe("periodogram and dominantPeriod", () => {
  test("a pure cosine puts all its variance at its harmonic (Parseval)", () => {
    // x_t = cos(2π·5t/60): I(f_5) = (1/N)|Σ cos·e^{−iθ}|² = (1/N)(N/2)² = N/4 = 15, zero elsewhere.
    const values = Float64Array.from({ length: 60 }, (_, index) => Math.cos((2 * Math.PI * 5 * index) / 60));
    const { ordinates, frequencies } = periodogram(values);
    expect(ordinates[4]).toBeCloseTo(15, 9);
    expect(frequencies[4]).toBeCloseTo(5 / 60, 12);
    const peak = dominantPeriod(values);
    expect(peak.period).toBeCloseTo(12, 12);
    expect(peak.strength).toBeCloseTo(1, 9);
    expect(peak.pValue).toBeLessThan(1e-12);
  });

  test("a cycle of period 12 buried in noise is found", () => {
    const rng = createRng(5);
    const values = Float64Array.from({ length: 72 }, (_, index) => Math.sin((2 * Math.PI * index) / 12) + 0.7 * rng.normal());
    const peak = dominantPeriod(values);
    expect(peak.period).toBeCloseTo(12, 12);
    expect(peak.pValue).toBeLessThan(0.001);
  });

  test("Fisher's test holds its size on white noise (seeded, 2000 series of 41)", () => {
    const rng = createRng(2024);
    let rejections = 0;
    const runs = 2000;
    for (let run = 0; run < runs; run++) {
      const values = Float64Array.from({ length: 41 }, () => rng.normal());
      if (dominantPeriod(values).pValue < 0.05) rejections++;
    }
    // Binomial(2000, 0.05) has sd 0.0049; ±0.015 is three sd.
    expect(Math.abs(rejections / runs - 0.05)).toBeLessThan(0.015);
  });

  test("Fisher's p-value: first term is the Bonferroni bound m(1−g)^(m−1), tight for small p", () => {
    // For g = 0.4, m = 20: 20·0.6^19 = 1.2187e-3; the second term C(20,2)·0.2^19 ≈ 1e-11 is negligible.
    expect(fisherGPValue(0.4, 20)).toBeCloseTo(20 * 0.6 ** 19, 9);
    // m = 2 and g > 1/2: only k = 1 contributes, P = 2(1 − g).
    expect(fisherGPValue(0.8, 2)).toBeCloseTo(0.4, 12);
  });

  test("refusals: too short, constant, pure alternation", () => {
    expect(() => dominantPeriod(Float64Array.of(1, 2, 3, 4))).toThrow(/at least 5/);
    expect(() => dominantPeriod(new Float64Array(20).fill(1))).toThrow(/constant/);
    expect(() => dominantPeriod(Float64Array.from({ length: 20 }, (_, index) => index % 2))).toThrow(/period-2/);
  });
});
