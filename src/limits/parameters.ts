/**
 * A stored limit set as the engine's frozen ChartParameters, and back. The row keeps exactly what
 * Phase II needs (centre, within sigma, subgroup size, EWMA/CUSUM design) and where the estimate came from.
 */
import type { ChartType } from "@/shared/constants";
import type { ChartParameters } from "@/src/spc/types";

/** The columns of a LimitSet row that define the chart. */
export interface TLimitSetParameters {
  readonly center: number;
  readonly sigma: number | null;
  readonly subgroupSize: number;
  readonly ewmaLambda: number | null;
  readonly ewmaWidth: number | null;
  readonly cusumK: number | null;
  readonly cusumH: number | null;
  readonly baselineStart: number;
  readonly baselineEnd: number;
  readonly baselineUsed: number;
}

export function chartParametersOf(
  chart: ChartType,
  limitSet: TLimitSetParameters,
  excluded: readonly number[] = [],
): ChartParameters {
  const { ewmaLambda, ewmaWidth, cusumK, cusumH } = limitSet;
  return {
    chart,
    center: limitSet.center,
    sigma: limitSet.sigma ?? Number.NaN,
    subgroupSize: limitSet.subgroupSize,
    ...(ewmaLambda !== null && ewmaWidth !== null ? { ewma: { lambda: ewmaLambda, L: ewmaWidth } } : {}),
    ...(cusumK !== null && cusumH !== null ? { cusum: { k: cusumK, h: cusumH } } : {}),
    baseline: {
      start: limitSet.baselineStart,
      end: limitSet.baselineEnd,
      excluded: [...excluded],
      used: limitSet.baselineUsed,
    },
  };
}

/** The LimitSet columns for engine parameters; the baseline is stated in sequences from `offset`. */
export function limitSetColumnsOf(parameters: ChartParameters, offset: number) {
  return {
    center: parameters.center,
    sigma: Number.isNaN(parameters.sigma) ? null : parameters.sigma,
    subgroupSize: parameters.subgroupSize,
    ewmaLambda: parameters.ewma?.lambda ?? null,
    ewmaWidth: parameters.ewma?.L ?? null,
    cusumK: parameters.cusum?.k ?? null,
    cusumH: parameters.cusum?.h ?? null,
    baselineStart: parameters.baseline.start + offset,
    baselineEnd: parameters.baseline.end + offset,
    baselineUsed: parameters.baseline.used,
  };
}
