/**
 * Building and summarising chart data.
 *
 * Builders validate once, at the boundary, so the chart code can trust its arrays: every value finite,
 * every subgroup non-empty, counts non-negative, sizes positive. Invalid input throws SpcInputError
 * naming the 0-based subgroup index (and the position inside it where it applies).
 *
 * Per-subgroup statistics are single passes over the flat arrays:
 * - mean x̄ᵢ = Σx / nᵢ;
 * - range Rᵢ = max − min;
 * - sample standard deviation sᵢ = √(Σ(x − x̄ᵢ)² / (nᵢ − 1)) (two-pass, for accuracy), 0 when nᵢ = 1.
 */
import { SpcInputError, type AttributesData, type ChartData, type VariablesData } from "./types";

function assertFinite(value: number, description: string, index: number): void {
  if (!Number.isFinite(value)) {
    throw new SpcInputError(`${description} is not a finite number (${value})`, index);
  }
}

/** Throws SpcInputError unless the subgroup at `index` holds at least one value, all finite. */
export function assertSubgroupValues(subgroup: readonly number[], index: number): void {
  if (subgroup.length === 0) throw new SpcInputError(`subgroup ${index} is empty`, index);
  subgroup.forEach((value, position) => assertFinite(value, `subgroup ${index}, value ${position}`, index));
}

/** Subgroups of measured values, in time order. */
export function variablesData(subgroups: readonly (readonly number[])[]): VariablesData {
  if (subgroups.length === 0) throw new SpcInputError("no subgroups were given");
  const offsets = new Uint32Array(subgroups.length + 1);
  let total = 0;
  subgroups.forEach((subgroup, index) => {
    assertSubgroupValues(subgroup, index);
    total += subgroup.length;
    offsets[index + 1] = total;
  });
  const values = new Float64Array(total);
  subgroups.forEach((subgroup, index) => values.set(subgroup, offsets[index]!));
  return { kind: "variables", values, offsets };
}

/** Individual values, each its own subgroup of size 1. */
export function individualsData(values: ArrayLike<number>): VariablesData {
  if (values.length === 0) throw new SpcInputError("no values were given");
  const copy = new Float64Array(values.length);
  const offsets = new Uint32Array(values.length + 1);
  for (let index = 0; index < values.length; index++) {
    const value = values[index]!;
    assertFinite(value, `value ${index}`, index);
    copy[index] = value;
    offsets[index + 1] = index + 1;
  }
  return { kind: "variables", values: copy, offsets };
}

/**
 * Counts per subgroup (defectives for p/np, defects for c/u) with their sizes (sample size for p/np,
 * inspection units for u). Sizes default to 1 (c charts). Whether a count may exceed its size depends on
 * the chart: see `assertDefectivesWithinSizes`.
 */
export function attributesData(counts: ArrayLike<number>, sizes?: ArrayLike<number>): AttributesData {
  if (counts.length === 0) throw new SpcInputError("no counts were given");
  if (sizes !== undefined && sizes.length !== counts.length) {
    throw new SpcInputError(`${counts.length} counts but ${sizes.length} sizes were given`);
  }
  const countArray = new Float64Array(counts.length);
  const sizeArray = new Float64Array(counts.length).fill(1);
  for (let index = 0; index < counts.length; index++) {
    const count = counts[index]!;
    assertFinite(count, `count ${index}`, index);
    if (count < 0) throw new SpcInputError(`count ${index} is negative (${count})`, index);
    countArray[index] = count;
    if (sizes !== undefined) {
      const size = sizes[index]!;
      assertFinite(size, `size ${index}`, index);
      if (size <= 0) throw new SpcInputError(`size ${index} must be positive (${size})`, index);
      sizeArray[index] = size;
    }
  }
  return { kind: "attributes", counts: countArray, sizes: sizeArray };
}

/** p and np charts count defective items in a sample: a count above its sample size is impossible. */
export function assertDefectivesWithinSizes(counts: ArrayLike<number>, sizes: ArrayLike<number>): void {
  for (let index = 0; index < counts.length; index++) {
    if (counts[index]! > sizes[index]!) {
      throw new SpcInputError(
        `subgroup ${index}: ${counts[index]} defectives exceed the sample size ${sizes[index]}`,
        index,
      );
    }
  }
}

/** Number of subgroups in any chart data. */
export function subgroupCount(data: ChartData): number {
  return data.kind === "variables" ? data.offsets.length - 1 : data.counts.length;
}

/** Size of each subgroup. */
export function subgroupSizes(data: VariablesData): Uint32Array {
  const count = data.offsets.length - 1;
  const sizes = new Uint32Array(count);
  for (let index = 0; index < count; index++) sizes[index] = data.offsets[index + 1]! - data.offsets[index]!;
  return sizes;
}

/** Mean of values[start..end): Σx / n, summed in order. */
export function meanOf(values: ArrayLike<number>, start: number, end: number): number {
  let sum = 0;
  for (let position = start; position < end; position++) sum += values[position]!;
  return sum / (end - start);
}

/** Range (max − min) of values[start..end). */
export function rangeOf(values: ArrayLike<number>, start: number, end: number): number {
  let low = values[start]!;
  let high = low;
  for (let position = start + 1; position < end; position++) {
    const value = values[position]!;
    if (value < low) low = value;
    else if (value > high) high = value;
  }
  return high - low;
}

/** Sample standard deviation (divisor n − 1, two-pass about `mean`) of values[start..end); 0 for one value. */
export function standardDeviationOf(values: ArrayLike<number>, start: number, end: number, mean: number): number {
  if (end - start < 2) return 0;
  let sumOfSquares = 0;
  for (let position = start; position < end; position++) {
    const deviation = values[position]! - mean;
    sumOfSquares += deviation * deviation;
  }
  return Math.sqrt(sumOfSquares / (end - start - 1));
}

/** Mean of each subgroup. */
export function subgroupMeans(data: VariablesData): Float64Array {
  const { values, offsets } = data;
  const count = offsets.length - 1;
  const means = new Float64Array(count);
  for (let index = 0; index < count; index++) means[index] = meanOf(values, offsets[index]!, offsets[index + 1]!);
  return means;
}

/** Range (max − min) of each subgroup. */
export function subgroupRanges(data: VariablesData): Float64Array {
  const { values, offsets } = data;
  const count = offsets.length - 1;
  const ranges = new Float64Array(count);
  for (let index = 0; index < count; index++) ranges[index] = rangeOf(values, offsets[index]!, offsets[index + 1]!);
  return ranges;
}

/** Sample standard deviation (divisor n − 1) of each subgroup; 0 for a subgroup of one. */
export function subgroupStandardDeviations(data: VariablesData, means = subgroupMeans(data)): Float64Array {
  const { values, offsets } = data;
  const count = offsets.length - 1;
  const deviations = new Float64Array(count);
  for (let index = 0; index < count; index++) {
    deviations[index] = standardDeviationOf(values, offsets[index]!, offsets[index + 1]!, means[index]!);
  }
  return deviations;
}

/**
 * The common subgroup size, or a SpcInputError naming the first subgroup whose size differs from the
 * first one (or from `expected` when given).
 */
export function commonSubgroupSize(data: VariablesData, expected?: number): number {
  const size = expected ?? data.offsets[1]! - data.offsets[0]!;
  const count = data.offsets.length - 1;
  for (let index = 0; index < count; index++) {
    const actual = data.offsets[index + 1]! - data.offsets[index]!;
    if (actual !== size) {
      throw new SpcInputError(
        `subgroup ${index} has ${actual} values where ${size} are expected (this chart needs equal subgroup sizes)`,
        index,
      );
    }
  }
  return size;
}
