/** Splitting values by the level of a tag, and the summaries the group tests report. */
import { SpcInputError } from "../types";
import { requireFiniteValues, requireSameLength } from "./input";

export interface Group {
  readonly level: string;
  readonly values: Float64Array;
}

/**
 * Groups values by level, in order of first appearance. Refuses (SpcInputError) non-finite values,
 * mismatched lengths, fewer than two levels, and levels with fewer than `minimumPerLevel` values.
 */
export function groupByLevel(values: ArrayLike<number>, levels: readonly string[], name: string, minimumPerLevel: number): Group[] {
  requireSameLength(values, levels, name);
  requireFiniteValues(values, name, 2);
  const buckets = new Map<string, number[]>();
  for (let index = 0; index < values.length; index++) {
    const level = levels[index] as string;
    const bucket = buckets.get(level) ?? [];
    bucket.push(values[index] as number);
    buckets.set(level, bucket);
  }
  if (buckets.size < 2) throw new SpcInputError(`${name}: needs at least 2 levels, got ${buckets.size}`);
  const groups = [...buckets].map(([level, bucket]) => ({ level, values: Float64Array.from(bucket) }));
  for (const group of groups) {
    if (group.values.length < minimumPerLevel) {
      throw new SpcInputError(`${name}: level "${group.level}" has ${group.values.length} values, needs at least ${minimumPerLevel}`);
    }
  }
  return groups;
}

/** Flattens two samples into values and "before"/"after" levels, for the k-group tests. */
export function beforeAfterGroups(before: ArrayLike<number>, after: ArrayLike<number>): { values: Float64Array; levels: string[] } {
  const values = new Float64Array(before.length + after.length);
  values.set(Array.from(before), 0);
  values.set(Array.from(after), before.length);
  const levels = [...Array<string>(before.length).fill("before"), ...Array<string>(after.length).fill("after")];
  return { values, levels };
}

export function mean(values: ArrayLike<number>): number {
  let sum = 0;
  for (let index = 0; index < values.length; index++) sum += values[index] as number;
  return sum / values.length;
}

export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const middle = sorted.length >> 1;
  return sorted.length % 2 === 1 ? (sorted[middle] as number) : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
}

/** Sample variance with divisor n − 1. */
export function sampleVariance(values: ArrayLike<number>): number {
  const center = mean(values);
  let sum = 0;
  for (let index = 0; index < values.length; index++) sum += ((values[index] as number) - center) ** 2;
  return sum / (values.length - 1);
}

export interface LevelSummary {
  readonly level: string;
  readonly count: number;
  /** The group's location: mean (ANOVA) or median (Kruskal–Wallis). */
  readonly location: number;
}

export interface LargestGap {
  readonly higher: string;
  readonly lower: string;
  readonly difference: number;
}

/** The pair of levels whose locations differ most: the highest against the lowest. */
export function largestGap(summaries: readonly LevelSummary[]): LargestGap {
  let highest = summaries[0] as LevelSummary;
  let lowest = highest;
  for (const summary of summaries) {
    if (summary.location > highest.location) highest = summary;
    if (summary.location < lowest.location) lowest = summary;
  }
  return { higher: highest.level, lower: lowest.level, difference: highest.location - lowest.location };
}
