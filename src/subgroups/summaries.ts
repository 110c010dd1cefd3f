/**
 * The per-subgroup summaries cached on each Subgroup row (mean and spread for measured values; count and
 * size for counts), computed with the engine's own functions (src/spc/data.ts) so that a chart built from
 * them equals the engine's chart built from the measurements, to the last bit.
 */
import { VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import { assertSubgroupValues, meanOf, rangeOf, standardDeviationOf } from "@/src/spc/data";

export interface TRecorded {
  readonly values?: readonly number[];
  readonly count?: number;
  readonly size?: number;
  readonly units?: number;
}

export interface TSubgroupColumns {
  readonly mean: number | null;
  readonly spread: number | null;
  readonly count: number | null;
  /** Sample size (p, np), inspection units (u), 1 (c), null for measured values. */
  readonly size: number | null;
}

export function summarize(chart: ChartType, recorded: TRecorded): TSubgroupColumns {
  if (VARIABLES_CHART_TYPES.includes(chart)) {
    // The engine's per-subgroup formulas, called on the one subgroup directly: building chart data for it
    // allocated four typed arrays per subgroup, the largest allocation of a million-row import.
    const values = recorded.values ?? [];
    assertSubgroupValues(values, 0);
    const mean = meanOf(values, 0, values.length);
    const spread = chart === "xbar-r" ? rangeOf(values, 0, values.length) : chart === "xbar-s" ? standardDeviationOf(values, 0, values.length, mean) : null;
    return { mean, spread, count: null, size: null };
  }
  const size = chart === "u" ? recorded.units : chart === "c" ? 1 : recorded.size;
  return { mean: null, spread: null, count: recorded.count ?? null, size: size ?? null };
}
