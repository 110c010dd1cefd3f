/**
 * One plotted statistic of the chart view as the rows Recharts draws: value, limits (the point's own, else
 * its segment's; null where none apply, so the limit lines break instead of bridging versions), a marker value where a rule fired, and
 * the value as recorded where a point was corrected. Pure.
 */
import type { TChartPoint, TPointLimits, TStatisticView } from "@/src/chart-data/view";

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
  // A point carries its own limits only where they vary within its segment; elsewhere the segment's apply.
  const constantLimits = (sequence: number): TPointLimits | null =>
    statistic.segments.find((segment) => segment.fromSequence <= sequence && sequence <= segment.toSequence)?.constantLimits ?? null;
  return statistic.points.map((point) => {
    const limits = point.limits === undefined ? constantLimits(point.sequence) : point.limits;
    return {
      sequence: point.sequence,
      value: point.value,
      center: limits?.center ?? null,
      ucl: limits?.ucl ?? null,
      lcl: limits?.lcl ?? null,
      upperWarning: limits?.upperWarning ?? null,
      lowerWarning: limits?.lowerWarning ?? null,
      signal: (point.firedRules?.length ?? 0) > 0 ? point.value : null,
      original: (point.corrections?.length ?? 0) > 0 ? (point.originalValue ?? null) : null,
      point,
    };
  });
}
