/**
 * Decimation of a long plotted series for drawing: at most about `maxPoints` points that still show every
 * excursion. The series is cut into equal buckets of consecutive points; each bucket keeps its lowest and
 * its highest point (so a spike is never averaged away, and the global extremes always survive), the
 * first and last points are kept so the drawn line spans the whole range, and every index in `keep`
 * (signal points, points where the limits step) is kept whatever its value. This is the min/max
 * ("envelope") decimation common in plotting long time series (common practice).
 *
 * Cost: one pass over the values, O(n), plus sorting the kept indices.
 * NaN values (no value by definition, e.g. a first moving range) are never a bucket extreme.
 */

export interface TDecimationOptions {
  /** Budget for the bucket extremes plus first and last; at least 4. */
  readonly maxPoints: number;
  /** Indices kept whatever their value (may exceed the budget by their number). */
  readonly keep?: Iterable<number>;
}

/** A bucket of consecutive indices [start, end) and the positions of its extremes. */
export interface TBucket {
  readonly start: number;
  readonly end: number;
  /** Index of the lowest value, or -1 when the bucket holds no value. */
  readonly minIndex: number;
  /** Index of the highest value, or -1 when the bucket holds no value. */
  readonly maxIndex: number;
}

export interface TDecimation {
  /** Kept indices, ascending, without repeats. */
  readonly indices: readonly number[];
  /** The buckets, in order; empty when nothing was dropped. */
  readonly buckets: readonly TBucket[];
}

export const MINIMUM_POINT_BUDGET = 4;

export function decimate(values: ArrayLike<number>, options: TDecimationOptions): TDecimation {
  const { maxPoints } = options;
  if (!Number.isInteger(maxPoints) || maxPoints < MINIMUM_POINT_BUDGET) {
    throw new RangeError(`maxPoints must be a whole number of at least ${MINIMUM_POINT_BUDGET}, got ${maxPoints}`);
  }
  const count = values.length;
  const kept = new Set<number>();
  for (const index of options.keep ?? []) {
    if (!Number.isInteger(index) || index < 0 || index >= count) {
      throw new RangeError(`kept index ${index} lies outside the series of ${count} points`);
    }
    kept.add(index);
  }
  if (count <= maxPoints) {
    return { indices: Array.from({ length: count }, (_, index) => index), buckets: [] };
  }
  kept.add(0);
  kept.add(count - 1);
  // Buckets cover the inner points 1 .. count - 2; each contributes at most two points.
  const inner = count - 2;
  const bucketCount = Math.floor((maxPoints - 2) / 2);
  const buckets: TBucket[] = [];
  for (let bucket = 0; bucket < bucketCount; bucket++) {
    const start = 1 + Math.floor((bucket * inner) / bucketCount);
    const end = 1 + Math.floor(((bucket + 1) * inner) / bucketCount);
    let minIndex = -1;
    let maxIndex = -1;
    for (let index = start; index < end; index++) {
      const value = values[index]!;
      if (Number.isNaN(value)) continue;
      if (minIndex < 0 || value < values[minIndex]!) minIndex = index;
      if (maxIndex < 0 || value > values[maxIndex]!) maxIndex = index;
    }
    if (minIndex >= 0) {
      kept.add(minIndex);
      kept.add(maxIndex);
    }
    buckets.push({ start, end, minIndex, maxIndex });
  }
  return { indices: [...kept].sort((first, second) => first - second), buckets };
}
