/**
 * Plotted statistics of one limit segment from the subgroups' cached summaries (mean, spread, count, size)
 * instead of their measurements, for live detection (a bounded tail) and for drawing long charts. The
 * engine computes them (`evaluateSummaries`, src/spc/charts): this module only turns the cached rows into
 * its typed arrays and slice start, so the values are those `evaluateChart` gives on the measurements.
 *
 * A slice of a segment is described by `firstIndex` (position of rows[0] in its segment) and `previous`
 * (the row just before the slice, with its cached EWMA/CUSUM state), so a tail is evaluated without
 * reading what came before it.
 */
import type { ChartType } from "@/shared/constants";
import { evaluateSummaries, SUMMARY_FIELDS, type SummaryField } from "@/src/spc/charts";
import type { ChartParameters, StatisticSeries } from "@/src/spc/types";

/** What a subgroup row caches for charting. */
export interface TSummary {
  readonly mean: number | null;
  readonly spread: number | null;
  readonly count: number | null;
  readonly size: number | null;
  readonly ewma: number | null;
  readonly cusumUpper: number | null;
  readonly cusumLower: number | null;
}

export interface TSliceStart {
  /** Position of the first row within its segment (0 = the segment's first point). */
  readonly firstIndex: number;
  /** The row before the first one, when firstIndex > 0: its mean and smoothed state. */
  readonly previous?: TSummary;
}

/** The cached column behind each engine summary. */
const COLUMN_OF: Readonly<Record<SummaryField, keyof TSummary>> = { means: "mean", spreads: "spread", counts: "count", sizes: "size" };

function column(rows: readonly TSummary[], field: keyof TSummary, chart: ChartType): Float64Array {
  return Float64Array.from(rows, (row, position) => {
    const value = row[field];
    if (value === null) throw new Error(`${chart}: subgroup ${position} of the slice has no cached ${field}`);
    return value;
  });
}

export function summarySeries(
  chart: ChartType,
  parameters: ChartParameters,
  rows: readonly TSummary[],
  start: TSliceStart = { firstIndex: 0 },
): StatisticSeries[] {
  if (parameters.chart !== chart) throw new Error(`summarySeries: ${parameters.chart} parameters were given for a ${chart} chart`);
  const summaries: { -readonly [field in SummaryField]?: Float64Array } = {};
  for (const field of SUMMARY_FIELDS[chart]) summaries[field] = column(rows, COLUMN_OF[field], chart);
  // A state the row does not hold is left out: the engine then names what the slice start lacks.
  const { previous } = start;
  const carried =
    previous === undefined
      ? undefined
      : {
          mean: previous.mean ?? undefined,
          ewma: previous.ewma ?? undefined,
          cusumUpper: previous.cusumUpper ?? undefined,
          cusumLower: previous.cusumLower ?? undefined,
        };
  return [...evaluateSummaries(summaries, parameters, { firstIndex: start.firstIndex, previous: carried }).statistics];
}
