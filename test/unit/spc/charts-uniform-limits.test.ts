/**
 * `StatisticSeries.uniformLimits` lets the batch run-rule scan use the first point's limits and sigma for
 * every point without reading the arrays, trusting the flag. These tests hold the charts module to it:
 * for every chart type, on data with one sample size and with varying sizes, the flag is set only where
 * ucl, lcl and sigma truly hold one value at every point, and it is set on the charts whose limits are
 * fixed by construction (so that the fast path is taken where it should be). Invented data; exact
 * comparisons (the flag promises equal doubles, not close ones).
 */
import { describe, expect, test } from "vitest";
import { CHART_TYPES, type ChartType } from "@/shared/constants";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { attributesData, individualsData, variablesData } from "@/src/spc/data";
import { createRng } from "@/src/spc/random";
import type { ChartData, StatisticSeries } from "@/src/spc/types";

const SUBGROUPS = 40;

const holdsOneValue = (values: Float64Array): boolean => values.every((value) => Object.is(value, values[0]));
const trulyUniform = (series: StatisticSeries): boolean =>
  holdsOneValue(series.ucl) && holdsOneValue(series.lcl) && holdsOneValue(series.sigma);

/** Data for `chart`, every subgroup of one size, or sizes varying from subgroup to subgroup. */
function chartData(chart: ChartType, sizes: "equal" | "varying"): ChartData {
  const rng = createRng(chart.length * 7919 + (sizes === "equal" ? 1 : 2));
  const sizeAt = (index: number) => (sizes === "equal" ? 5 : 3 + (index % 4));
  switch (chart) {
    case "imr":
    case "ewma":
    case "cusum":
      return individualsData(Array.from({ length: SUBGROUPS }, () => 10 + rng.normal()));
    case "xbar-r":
    case "xbar-s":
      return variablesData(
        Array.from({ length: SUBGROUPS }, (_, index) =>
          Array.from({ length: sizeAt(index) }, () => 10 + rng.normal()),
        ),
      );
    case "p":
    case "np": {
      const size = (index: number) => 10 * sizeAt(index);
      return attributesData(
        Array.from({ length: SUBGROUPS }, (_, index) => Math.floor(rng.uniform() * 0.3 * size(index))),
        Array.from({ length: SUBGROUPS }, (_, index) => size(index)),
      );
    }
    case "c":
      return attributesData(Array.from({ length: SUBGROUPS }, () => 2 + Math.floor(rng.uniform() * 10)));
    case "u":
      return attributesData(
        Array.from({ length: SUBGROUPS }, () => 2 + Math.floor(rng.uniform() * 10)),
        Array.from({ length: SUBGROUPS }, (_, index) => sizeAt(index)),
      );
  }
}

/** Charts that accept sizes varying from subgroup to subgroup (the others refuse them). */
const VARYING_SIZES: readonly ChartType[] = ["p", "u"];
/** Statistics whose limits are fixed by construction on data of one size (EWMA's exact limits vary; CUSUM has no sigma). */
const FIXED = new Set(["x", "mr", "xbar", "r", "s", "p", "np", "c", "u"]);

describe("uniformLimits is set only where ucl, lcl and sigma are constant", () => {
  const cases = [
    ...CHART_TYPES.map((chart) => [chart, "equal"] as const),
    ...VARYING_SIZES.map((chart) => [chart, "varying"] as const),
  ];
  test.each(cases)("%s chart, %s sizes", (chart, sizes) => {
    const data = chartData(chart, sizes);
    const result = evaluateChart(data, estimateParameters(chart, data));
    for (const series of result.statistics) {
      if (series.uniformLimits === true) expect(trulyUniform(series), series.key).toBe(true);
      expect(series.uniformLimits === true, series.key).toBe(sizes === "equal" && FIXED.has(series.key));
    }
  });

  test("EWMA with asymptotic limits: fixed from the first point, so uniform", () => {
    const data = chartData("ewma", "equal");
    const parameters = estimateParameters("ewma", data, { ewma: { lambda: 0.2, L: 3, asymptoticLimits: true } });
    const [series] = evaluateChart(data, parameters).statistics;
    expect(series?.uniformLimits).toBe(true);
    expect(series !== undefined && trulyUniform(series)).toBe(true);
  });
});
