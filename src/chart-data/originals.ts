/**
 * The plotted value of a corrected subgroup as it was recorded: the subgroup is rebuilt with each
 * corrected field at its first correction's original value (the value as recorded) and summarised with
 * the same function that caches the summaries (src/subgroups/summaries.ts), so the original point sits
 * exactly where it would have been drawn. Smoothed charts (EWMA, CUSUM) carry state from earlier points,
 * so their original plotted value is not a property of one subgroup: null there.
 */
import type { ChartType } from "@/shared/constants";
import { summarize } from "@/src/subgroups/summaries";

export interface TRecordedCorrection {
  readonly field: string;
  /** Position of the corrected measurement (field "value"), else null. */
  readonly position: number | null;
  readonly recorded: number;
}

export interface TCurrentSubgroup {
  /** Current measured values by position (variables charts), else empty. */
  readonly values: readonly number[];
  readonly count: number | null;
  readonly size: number | null;
}

/** The first recorded value of a field (corrections oldest first), or the current one when never corrected. */
function asRecorded(corrections: readonly TRecordedCorrection[], field: string, position: number | null, current: number): number {
  return corrections.find((correction) => correction.field === field && correction.position === position)?.recorded ?? current;
}

export function originalStatistic(
  chart: ChartType,
  current: TCurrentSubgroup,
  corrections: readonly TRecordedCorrection[],
): number | null {
  if (chart === "ewma" || chart === "cusum" || corrections.length === 0) return null;
  if (chart === "imr" || chart === "xbar-r" || chart === "xbar-s") {
    const values = current.values.map((value, position) => asRecorded(corrections, "value", position, value));
    return summarize(chart, { values }).mean;
  }
  if (current.count === null || current.size === null) return null;
  const count = asRecorded(corrections, "count", null, current.count);
  const sizeField = chart === "u" ? "units" : "size";
  const size = asRecorded(corrections, sizeField, null, current.size);
  const recorded = summarize(chart, { count, size, units: size });
  if (recorded.count === null || recorded.size === null) return null;
  return chart === "p" || chart === "u" ? recorded.count / recorded.size : recorded.count;
}
