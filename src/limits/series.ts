/**
 * Plotted statistics of one limit segment built from the subgroups' cached summaries (mean, spread,
 * count, size) instead of their measurements, for live detection (a bounded tail) and for drawing long
 * charts. The formulas are the engine's (src/spc/charts: individuals.ts, subgroups.ts, attributes.ts,
 * ewma.ts, cusum.ts, with their published sources), in the same floating-point order so the values are
 * identical to `evaluateChart` on the measurements; the limits come from the engine's own `limitSeries`.
 * The integration tests compare both on whole histories.
 *
 * A slice of a segment is described by `firstIndex` (position of rows[0] in its segment) and `previous`
 * (the row just before the slice, with its cached EWMA/CUSUM state), so a tail is evaluated without
 * reading what came before it.
 */
import type { ChartType } from "@/shared/constants";
import { DEFAULT_CUSUM_DESIGN, DEFAULT_EWMA_DESIGN } from "@/src/spc/charts";
import { constantSigma, limitSeries } from "@/src/spc/charts/series";
import { controlConstants } from "@/src/spc/constants";
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

function column(rows: readonly TSummary[], field: keyof TSummary, chart: ChartType): Float64Array {
  return Float64Array.from(rows, (row, position) => {
    const value = row[field];
    if (value === null) throw new Error(`${chart}: subgroup ${position} of the slice has no cached ${field}`);
    return value;
  });
}

function previousState(start: TSliceStart, field: "mean" | "ewma" | "cusumUpper" | "cusumLower", chart: ChartType): number | undefined {
  if (start.firstIndex === 0) return undefined;
  const value = start.previous?.[field];
  if (value === undefined || value === null) throw new Error(`${chart}: the slice starts inside a segment without the previous ${field}`);
  return value;
}

/**
 * The EWMA factor 1 − (1 − λ)^{2(i+1)} at segment index i, by the engine's repeated product (ewma.ts),
 * stopped once it no longer changes the result: at most a few hundred steps for any λ, whatever i.
 */
function ewmaFactor(carrySquared: number, index: number): number {
  let power = 1;
  for (let step = 0; step <= index; step++) {
    power *= carrySquared;
    if (1 - power === 1) break;
  }
  return 1 - power;
}

export function summarySeries(
  chart: ChartType,
  parameters: ChartParameters,
  rows: readonly TSummary[],
  start: TSliceStart = { firstIndex: 0 },
): StatisticSeries[] {
  const count = rows.length;
  const { center, sigma } = parameters;
  switch (chart) {
    case "imr": {
      const values = column(rows, "mean", chart);
      const { d2, d3 } = controlConstants(2);
      let before = previousState(start, "mean", chart) ?? Number.NaN;
      const movingRanges = values.map((value) => {
        const range = Math.abs(value - before);
        before = value;
        return range;
      });
      return [
        limitSeries({ key: "x", points: values, center, sigma: constantSigma(count, sigma), floor: -Infinity, zoneRulesByDefault: true }),
        limitSeries({ key: "mr", points: movingRanges, center: d2 * sigma, sigma: constantSigma(count, d3 * sigma), floor: 0, zoneRulesByDefault: false }),
      ];
    }
    case "xbar-r":
    case "xbar-s": {
      const size = parameters.subgroupSize;
      const { d2, d3, c4 } = controlConstants(size);
      const mean = limitSeries({
        key: "xbar",
        points: column(rows, "mean", chart),
        center,
        sigma: constantSigma(count, sigma / Math.sqrt(size)),
        floor: -Infinity,
        zoneRulesByDefault: true,
      });
      const spreads = column(rows, "spread", chart);
      const spread =
        chart === "xbar-r"
          ? limitSeries({ key: "r", points: spreads, center: d2 * sigma, sigma: constantSigma(count, d3 * sigma), floor: 0, zoneRulesByDefault: false })
          : limitSeries({ key: "s", points: spreads, center: c4 * sigma, sigma: constantSigma(count, Math.sqrt(1 - c4 * c4) * sigma), floor: 0, zoneRulesByDefault: false });
      return [mean, spread];
    }
    case "p":
    case "u": {
      const counts = column(rows, "count", chart);
      const sizes = column(rows, "size", chart);
      const variance = chart === "p" ? center * (1 - center) : center;
      const points = counts.map((defects, position) => defects / sizes[position]!);
      const deviations = sizes.map((size) => Math.sqrt(variance / size));
      return [limitSeries({ key: chart, points, center, sigma: deviations, floor: 0, ceiling: chart === "p" ? 1 : Infinity, zoneRulesByDefault: true })];
    }
    case "np": {
      const size = parameters.subgroupSize;
      return [
        limitSeries({
          key: "np",
          points: column(rows, "count", chart),
          center: size * center,
          sigma: constantSigma(count, Math.sqrt(size * center * (1 - center))),
          floor: 0,
          ceiling: size,
          zoneRulesByDefault: true,
        }),
      ];
    }
    case "c":
      return [limitSeries({ key: "c", points: column(rows, "count", chart), center, sigma: constantSigma(count, Math.sqrt(center)), floor: 0, zoneRulesByDefault: true })];
    case "ewma": {
      const { lambda, L } = parameters.ewma ?? DEFAULT_EWMA_DESIGN;
      const means = column(rows, "mean", chart);
      const meanSigma = sigma / Math.sqrt(parameters.subgroupSize);
      const carry = 1 - lambda;
      const asymptoticVariance = lambda / (2 - lambda);
      let smoothed = previousState(start, "ewma", chart) ?? center;
      const points = means.map((mean) => (smoothed = lambda * mean + carry * smoothed));
      const deviations = points.map((_, position) =>
        meanSigma * Math.sqrt(asymptoticVariance * ewmaFactor(carry * carry, start.firstIndex + position)),
      );
      return [limitSeries({ key: "ewma", points, center, sigma: deviations, floor: -Infinity, width: L, zoneRulesByDefault: false })];
    }
    case "cusum": {
      const { k, h } = parameters.cusum ?? DEFAULT_CUSUM_DESIGN;
      const means = column(rows, "mean", chart);
      const meanSigma = sigma / Math.sqrt(parameters.subgroupSize);
      const allowance = k * meanSigma;
      let upperSum = previousState(start, "cusumUpper", chart) ?? 0;
      let lowerSum = previousState(start, "cusumLower", chart) ?? 0;
      const upper = new Float64Array(count);
      const lower = new Float64Array(count);
      means.forEach((mean, position) => {
        const deviation = mean - center;
        upper[position] = upperSum = Math.max(0, deviation - allowance + upperSum);
        lower[position] = lowerSum = Math.max(0, -deviation - allowance + lowerSum);
      });
      const decisionInterval = constantSigma(count, h * meanSigma);
      const zeros = new Float64Array(count);
      const noZones = constantSigma(count, Number.NaN);
      return (["cusum-upper", "cusum-lower"] as const).map((key) => ({
        key,
        points: key === "cusum-upper" ? upper : lower,
        center: 0,
        ucl: decisionInterval,
        lcl: zeros,
        sigma: noZones,
        floor: 0,
        zoneRulesByDefault: false,
      }));
    }
  }
}
