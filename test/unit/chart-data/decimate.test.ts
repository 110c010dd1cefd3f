// Decimation for drawing: examples worked by hand, then properties over random series (fast-check,
// seeded so a failure reproduces; invented data, as property tests need).
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { decimate } from "@/src/chart-data/decimate";

const SEED = 20261202;

describe("decimate: examples", () => {
  test("a series within the budget is kept whole", () => {
    expect(decimate([3, 1, 2], { maxPoints: 4 })).toEqual({ indices: [0, 1, 2], buckets: [] });
  });

  test("each bucket keeps its lowest and highest point, plus first and last", () => {
    // 10 points, budget 6: 2 buckets over the inner points 1..8 -> [1, 5) and [5, 9).
    const values = [5, 4, 9, 0, 6, 7, 1, 8, 3, 5];
    const { indices, buckets } = decimate(values, { maxPoints: 6 });
    expect(buckets).toEqual([
      { start: 1, end: 5, minIndex: 3, maxIndex: 2 },
      { start: 5, end: 9, minIndex: 6, maxIndex: 7 },
    ]);
    expect(indices).toEqual([0, 2, 3, 6, 7, 9]);
  });

  test("indices to keep survive even when they are not extremes", () => {
    const values = [5, 4, 9, 0, 6, 7, 1, 8, 3, 5];
    expect(decimate(values, { maxPoints: 6, keep: [4, 8] }).indices).toEqual([0, 2, 3, 4, 6, 7, 8, 9]);
  });

  test("NaN is never an extreme; a bucket of NaN keeps nothing", () => {
    const values = [1, NaN, NaN, NaN, NaN, 2, 3, 0, 4, 1];
    const { indices, buckets } = decimate(values, { maxPoints: 6 });
    expect(buckets[0]).toEqual({ start: 1, end: 5, minIndex: -1, maxIndex: -1 });
    expect(indices).toEqual([0, 7, 8, 9]);
  });

  test.each([
    ["a budget below 4", { maxPoints: 3 }, /at least 4/],
    ["a fractional budget", { maxPoints: 10.5 }, /whole number/],
    ["a kept index past the end", { maxPoints: 10, keep: [10] }, /kept index 10 lies outside the series of 10 points/],
    ["a negative kept index", { maxPoints: 10, keep: [-1] }, /kept index -1/],
  ])("refuses %s", (_, options, message) => {
    expect(() => decimate(new Float64Array(10), options)).toThrow(message);
  });
});

describe("decimate: properties", () => {
  const series = fc.array(fc.oneof(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.constant(Number.NaN)), {
    minLength: 1,
    maxLength: 3000,
  });
  const budget = fc.integer({ min: 4, max: 400 });

  test("never drops a kept (signal) point, and never exceeds the budget by more than the kept points", () => {
    fc.assert(
      fc.property(series, budget, fc.array(fc.nat()), (values, maxPoints, wanted) => {
        const keep = [...new Set(wanted.map((index) => index % values.length))];
        const { indices } = decimate(values, { maxPoints, keep });
        for (const index of keep) expect(indices).toContain(index);
        expect(indices.length).toBeLessThanOrEqual(maxPoints + keep.length);
        // Ascending, no repeats, inside the series.
        indices.forEach((index, position) => {
          expect(index).toBeGreaterThanOrEqual(0);
          expect(index).toBeLessThan(values.length);
          if (position > 0) expect(index).toBeGreaterThan(indices[position - 1]!);
        });
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  test("keeps the global minimum and maximum, and the first and last points", () => {
    fc.assert(
      fc.property(series, budget, (values, maxPoints) => {
        const { indices } = decimate(values, { maxPoints });
        const present = values.filter((value) => !Number.isNaN(value));
        const keptValues = indices.map((index) => values[index]!);
        if (present.length > 0) {
          expect(keptValues).toContain(Math.min(...present));
          expect(keptValues).toContain(Math.max(...present));
        }
        expect(indices[0]).toBe(0);
        expect(indices.at(-1)).toBe(values.length - 1);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  test("every bucket's extremes are kept, so no excursion inside a bucket is lost", () => {
    fc.assert(
      fc.property(series, budget, (values, maxPoints) => {
        const { indices, buckets } = decimate(values, { maxPoints });
        for (const bucket of buckets) {
          const inside = values.slice(bucket.start, bucket.end).filter((value) => !Number.isNaN(value));
          if (inside.length === 0) continue;
          expect(values[bucket.minIndex]).toBe(Math.min(...inside));
          expect(values[bucket.maxIndex]).toBe(Math.max(...inside));
          expect(indices).toContain(bucket.minIndex);
          expect(indices).toContain(bucket.maxIndex);
        }
      }),
      { seed: SEED, numRuns: 300 },
    );
  });
});
