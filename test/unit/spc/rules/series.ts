/**
 * Test helper: a statistic series with fixed limits (centre 0, sigma 1, UCL 3, LCL −3 unless overridden),
 * so that hand-built values read directly in sigma units. Built here rather than through the charts
 * module so that the rule tests depend on nothing but the rules.
 */
import type { StatisticSeries } from "@/src/spc/types";

export interface SeriesOverrides {
  readonly key?: StatisticSeries["key"];
  readonly center?: number;
  /** One sigma for every point, or one per point. */
  readonly sigma?: number | readonly number[];
  readonly ucl?: number;
  readonly lcl?: number;
  readonly floor?: number;
  readonly zoneRulesByDefault?: boolean;
}

export function fixedSeries(values: readonly number[], overrides: SeriesOverrides = {}): StatisticSeries {
  const length = values.length;
  const center = overrides.center ?? 0;
  const sigma =
    typeof overrides.sigma === "object"
      ? Float64Array.from(overrides.sigma)
      : new Float64Array(length).fill(overrides.sigma ?? 1);
  return {
    key: overrides.key ?? "x",
    points: Float64Array.from(values),
    center,
    ucl: new Float64Array(length).fill(overrides.ucl ?? center + 3 * (sigma[0] ?? 1)),
    lcl: new Float64Array(length).fill(overrides.lcl ?? center - 3 * (sigma[0] ?? 1)),
    sigma,
    floor: overrides.floor ?? Number.NEGATIVE_INFINITY,
    zoneRulesByDefault: overrides.zoneRulesByDefault ?? true,
  };
}

/** `count` copies of `value`. */
export const repeat = (value: number, count: number): number[] => Array.from({ length: count }, () => value);

/** `count` values alternating between `first` and `second`, starting with `first`. */
export const alternate = (first: number, second: number, count: number): number[] =>
  Array.from({ length: count }, (_, index) => (index % 2 === 0 ? first : second));
