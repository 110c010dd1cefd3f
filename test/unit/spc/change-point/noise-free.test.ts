/**
 * Noise-free checks suggested in /work/shared/reference/published-values.md §4 (no published numeric
 * example exists): a clean step or ramp must be dated exactly, and the new level / slope recovered.
 * Exact-arithmetic expectations; floating-point tolerance 1e-9 (sums of 30 terms).
 */
import { describe, expect, test } from "vitest";
import {
  binomialChangePoint,
  clockWindow,
  driftChangePoint,
  likelihoodThreshold,
  poissonChangePoint,
  stepChangePoint,
} from "@/src/spc/change-point";
import { SpcInputError } from "@/src/spc/types";

/** 30 points: in control (value `before`) up to index `last`, then `after(i)`. */
function series(last: number, before: number, after: (index: number) => number, length = 30): Float64Array {
  return Float64Array.from({ length }, (_, index) => (index <= last ? before : after(index)));
}

describe("stepChangePoint", () => {
  test("a clean +1 sigma step after subgroup 20 (1-based) is dated at 0-based index 19", () => {
    // 1-based "change after t = 20, signal at T = 30" is 0-based last in-control index 19.
    const result = stepChangePoint(series(19, 10, () => 11), { center: 10, sigma: 1 });
    expect(result.index).toBe(19);
    expect(result.newLevel).toBeCloseTo(11, 9);
    expect(result.shiftInSigma).toBeCloseTo(1, 9);
    // ℓ(19) = (T−k)·δ²/2 = 10·1/2 = 5.
    expect(result.logLikelihoodRatio).toBeCloseTo(5, 9);
    expect(result.confidenceSet.start).toBeLessThanOrEqual(19);
    expect(result.confidenceSet.end).toBeGreaterThanOrEqual(19);
  });

  test("a downward step and a change before the first point", () => {
    expect(stepChangePoint(series(4, 0, () => -2), { center: 0, sigma: 0.5 }).index).toBe(4);
    const all = stepChangePoint(series(-1, 0, () => 3), { center: 0, sigma: 1 });
    expect(all.index).toBe(-1);
    expect(all.newLevel).toBeCloseTo(3, 9);
  });

  test("varying sigma weights each point by its precision", () => {
    const sigma = Float64Array.from({ length: 30 }, (_, index) => (index % 2 === 0 ? 1 : 2));
    const result = stepChangePoint(series(9, 5, () => 7), { center: 5, sigma });
    expect(result.index).toBe(9);
    expect(result.newLevel).toBeCloseTo(7, 9);
  });

  test("ties go to the earliest candidate: an all-in-control series gives -1", () => {
    // Every ℓ(k) is 0 when every point sits on μ0.
    const result = stepChangePoint(new Float64Array(10).fill(3), { center: 3, sigma: 1 });
    expect(result.index).toBe(-1);
    expect(result.logLikelihoodRatio).toBe(0);
  });

  test("bad input throws SpcInputError naming the index", () => {
    const values = Float64Array.from([1, 2, Number.NaN, 4]);
    expect(() => stepChangePoint(values, { center: 0, sigma: 1 })).toThrow(/index 2/);
    expect(() => stepChangePoint(Float64Array.of(1), { center: 0, sigma: 1 })).toThrow(SpcInputError);
    expect(() => stepChangePoint(Float64Array.of(1, 2), { center: 0, sigma: 0 })).toThrow(/sigma at index 0/);
  });
});

describe("driftChangePoint", () => {
  test("a clean ramp of 0.3 per subgroup after subgroup 20 (1-based) is dated at index 19", () => {
    const result = driftChangePoint(series(19, 50, (index) => 50 + 0.3 * (index - 19)), { center: 50, sigma: 1 });
    expect(result.index).toBe(19);
    expect(result.slope).toBeCloseTo(0.3, 9);
    expect(result.newLevel).toBeCloseTo(53, 9);
  });

  test("long series do not lose the ramp to cancellation (positions measured from the end)", () => {
    const result = driftChangePoint(series(9_000, 0, (index) => 1e-3 * (index - 9_000), 10_000), { center: 0, sigma: 1 });
    expect(result.index).toBe(9_000);
    expect(result.slope).toBeCloseTo(1e-3, 9);
  });
});

describe("poissonChangePoint and binomialChangePoint", () => {
  test("a clean doubling of a defect rate is dated exactly (c chart and u chart)", () => {
    expect(poissonChangePoint(series(14, 4, () => 8), { rate: 4 }).index).toBe(14);
    const units = Float64Array.from({ length: 30 }, (_, index) => 1 + (index % 3));
    const counts = Float64Array.from(units, (size, index) => (index <= 14 ? 2 * size : 6 * size));
    const result = poissonChangePoint(counts, { rate: 2, units });
    expect(result.index).toBe(14);
    expect(result.newLevel).toBeCloseTo(6, 9);
    expect(result.ratio).toBeCloseTo(3, 9);
  });

  test("a drop to zero defects is a change too", () => {
    expect(poissonChangePoint(series(19, 5, () => 0), { rate: 5 }).index).toBe(19);
  });

  test("a clean rise in fraction defective is dated exactly (p chart, varying sizes)", () => {
    const sizes = Float64Array.from({ length: 30 }, (_, index) => 50 + 10 * (index % 2));
    const defectives = Float64Array.from(sizes, (size, index) => (index <= 21 ? 0.1 * size : 0.3 * size));
    const result = binomialChangePoint(defectives, { fraction: 0.1, sizes });
    expect(result.index).toBe(21);
    expect(result.newLevel).toBeCloseTo(0.3, 9);
  });

  test("counts above their sample size are refused", () => {
    expect(() => binomialChangePoint(Float64Array.of(1, 60), { fraction: 0.1, sizes: Float64Array.of(50, 50) })).toThrow(
      /index 1/,
    );
  });
});

describe("confidence set and clock window", () => {
  test("the 95 % cut is χ²₁(0.95)/2 = 3.841459/2", () => {
    // χ²₁ 0.95 quantile 3.841459 (any chi-square table, e.g. NIST e-Handbook §1.3.6.7.4).
    expect(likelihoodThreshold(0.95)).toBeCloseTo(1.9207, 4);
  });

  test("an index window becomes the clock interval (time[start], time[end + 1]]", () => {
    const times = Float64Array.from({ length: 10 }, (_, index) => 1_000 + 60 * index);
    expect(clockWindow({ start: 3, end: 5 }, times)).toEqual({ after: 1_180, notLaterThan: 1_360 });
    expect(clockWindow({ start: -1, end: 0 }, times)).toEqual({ after: null, notLaterThan: 1_060 });
    expect(() => clockWindow({ start: 2, end: 9 }, times)).toThrow(SpcInputError);
  });
});
