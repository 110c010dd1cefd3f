/**
 * One plotted statistic of the chart view as the rows Recharts draws: value, limits (null where none
 * apply, so the limit lines break instead of bridging versions), a marker value where a rule fired, and
 * the value as recorded where a point was corrected. Pure.
 */
import type { TChartPoint, TStatisticView } from "@/src/chart-data/view";

export interface TChartRow {
  readonly sequence: number;
  readonly value: number | null;
  readonly center: number | null;
  readonly ucl: number | null;
  readonly lcl: number | null;
  readonly upperWarning: number | null;
  readonly lowerWarning: number | null;
  /** The value again where a rule fired here, else null: drawn as the signal marker. */
  readonly signal: number | null;
  /** The value as recorded where it was corrected, else null: drawn as a hollow marker. */
  readonly original: number | null;
  readonly point: TChartPoint;
}

export function chartRows(statistic: TStatisticView): TChartRow[] {
  return statistic.points.map((point) => ({
    sequence: point.sequence,
    value: point.value,
    center: point.limits?.center ?? null,
    ucl: point.limits?.ucl ?? null,
    lcl: point.limits?.lcl ?? null,
    upperWarning: point.limits?.upperWarning ?? null,
    lowerWarning: point.limits?.lowerWarning ?? null,
    signal: point.firedRules.length > 0 ? point.value : null,
    original: point.corrections.length > 0 ? (point.originalValue ?? null) : null,
    point,
  }));
}
