/**
 * The engine's one evaluation path (`evaluateSummaries`, src/spc/charts): for every chart type, on seeded
 * invented series, the statistics from per-subgroup summaries equal `evaluateChart` on the measurements,
 * and consecutive slices evaluated from the state the previous slice ended in equal the whole series.
 * Both comparisons are exact (Object.is on every value: the same bits, NaN where undefined by definition),
 * because live detection and chart drawing evaluate slices of cached summaries while the batch
 * re-evaluation reads the measurements, and the two must never disagree about a signal.
 */
import { describe, expect, test } from "vitest";
import type { ChartType } from "@/shared/constants";
import {
  estimateParameters,
  evaluateChart,
  evaluateSummaries,
  SUMMARY_FIELDS,
  type CarriedState,
  type EstimateOptions,
  type SubgroupSummaries,
} from "@/src/spc/charts";
import { attributesData, meanOf, rangeOf, standardDeviationOf, variablesData } from "@/src/spc/data";
import { createRng } from "@/src/spc/random";
import { SpcInputError, type ChartData, type ChartParameters, type ChartResult, type StatisticSeries } from "@/src/spc/types";

const LENGTH = 240;
const BASELINE_END = 60;
const SUBGROUP_SIZE: Record<ChartType, number> = { imr: 1, "xbar-r": 5, "xbar-s": 4, p: 1, np: 200, c: 1, u: 1, ewma: 3, cusum: 1 };

/** Invented data: in control, then from 60 % of the way a shift, so the CUSUM sums and the EWMA move. */
function seededData(chart: ChartType, length: number, seed: number): ChartData {
  const rng = createRng(seed);
  const shifted = (index: number) => index >= length * 0.6;
  const level = (index: number) => (shifted(index) ? 1.5 : 1);
  switch (chart) {
    case "p":
    case "np":
    case "u":
    case "c": {
      const sizes = Array.from({ length }, () =>
        chart === "p" ? 150 + Math.floor(rng.uniform() * 100) : chart === "np" ? 200 : chart === "u" ? 2 + Math.round(rng.uniform() * 30) / 10 : 1,
      );
      const rate = chart === "p" || chart === "np" ? 0.05 : chart === "u" ? 3 : 6;
      const counts = sizes.map((size, index) => Math.round(size * rate * level(index) * (0.5 + rng.uniform())));
      return attributesData(counts, sizes);
    }
    default:
      return variablesData(
        Array.from({ length }, (_, index) =>
          Array.from({ length: SUBGROUP_SIZE[chart] }, () => 10 + 0.2 * rng.normal() + (shifted(index) ? 0.3 : 0)),
        ),
      );
  }
}

/**
 * The summaries SUMMARY_FIELDS lists for the chart, computed one subgroup at a time with the scalar
 * formulas (as the intake caches them), not with evaluateChart's own summarising.
 */
function summariesFor(chart: ChartType, data: ChartData): SubgroupSummaries {
  const summaries: { -readonly [field in keyof SubgroupSummaries]: Float64Array } = {};
  for (const field of SUMMARY_FIELDS[chart]) {
    if (data.kind === "attributes") {
      summaries[field] = Float64Array.from(field === "counts" ? data.counts : data.sizes);
      continue;
    }
    const { values, offsets } = data;
    summaries[field] = Float64Array.from({ length: offsets.length - 1 }, (_, index) => {
      const [start, end] = [offsets[index]!, offsets[index + 1]!];
      const mean = meanOf(values, start, end);
      if (field === "means") return mean;
      return chart === "xbar-r" ? rangeOf(values, start, end) : standardDeviationOf(values, start, end, mean);
    });
  }
  return summaries;
}

function sliceOf(summaries: SubgroupSummaries, from: number, to: number): SubgroupSummaries {
  return Object.fromEntries(Object.entries(summaries).map(([field, array]) => [field, array.subarray(from, to)]));
}

/** What the last point of an evaluated slice hands to the next slice. */
function stateAfter(result: ChartResult, summaries: SubgroupSummaries): CarriedState {
  const lastOf = (array: Float64Array | undefined) => array?.[array.length - 1];
  const points = (key: string) => result.statistics.find((series) => series.key === key)?.points;
  return { mean: lastOf(summaries.means), ewma: lastOf(points("ewma")), cusumUpper: lastOf(points("cusum-upper")), cusumLower: lastOf(points("cusum-lower")) };
}

const FIELDS = ["points", "ucl", "lcl", "sigma"] as const;

/** The first position where two arrays differ in any bit (Object.is), described; undefined when equal. */
function difference(actual: ArrayLike<number>, expected: ArrayLike<number>): string | undefined {
  if (actual.length !== expected.length) return `lengths ${actual.length} and ${expected.length}`;
  for (let index = 0; index < actual.length; index++) {
    if (!Object.is(actual[index], expected[index])) return `index ${index}: ${actual[index]} instead of ${expected[index]}`;
  }
  return undefined;
}

function expectSameSeries(actual: readonly StatisticSeries[], expected: readonly StatisticSeries[]): void {
  expect(actual.map((series) => series.key)).toEqual(expected.map((series) => series.key));
  expected.forEach((series, which) => {
    const other = actual[which]!;
    expect([other.center, other.floor, other.zoneRulesByDefault, other.uniformLimits]).toEqual([series.center, series.floor, series.zoneRulesByDefault, series.uniformLimits]);
    for (const field of FIELDS) expect(difference(other[field], series[field]), `${series.key} ${field}`).toBeUndefined();
  });
}

interface Case {
  readonly name: string;
  readonly chart: ChartType;
  readonly length: number;
  readonly options: EstimateOptions;
  /** Slice boundaries: slices of one point, and EWMA slices far beyond where its limits stop widening. */
  readonly cuts: readonly number[];
}

const CUTS = [0, 1, 3, 17, 18, 90, 91, 200, LENGTH];
const CASES: readonly Case[] = [
  ...(["imr", "xbar-r", "xbar-s", "p", "np", "c", "u", "ewma", "cusum"] as const).map((chart) => ({
    name: chart,
    chart,
    length: LENGTH,
    options: { baseline: { end: BASELINE_END } },
    cuts: CUTS,
  })),
  // λ = 0.05: the exact limits keep widening for about 365 points (1 − (1 − λ)^{2i} reaches 1 in floating point).
  { name: "ewma, λ = 0.05", chart: "ewma", length: 1000, options: { baseline: { end: BASELINE_END }, ewma: { lambda: 0.05, L: 2.6 } }, cuts: [0, 364, 365, 366, 367, 900, 1000] },
  { name: "ewma, asymptotic limits", chart: "ewma", length: LENGTH, options: { baseline: { end: BASELINE_END }, ewma: { lambda: 0.1, L: 2.7, asymptoticLimits: true } }, cuts: CUTS },
  { name: "cusum, k = 0.25, h = 8", chart: "cusum", length: LENGTH, options: { baseline: { end: BASELINE_END }, cusum: { k: 0.25, h: 8 } }, cuts: CUTS },
];

function prepared(testCase: Case, seed: number) {
  const data = seededData(testCase.chart, testCase.length, seed);
  const parameters = estimateParameters(testCase.chart, data, testCase.options);
  return { data, parameters, summaries: summariesFor(testCase.chart, data) };
}

describe("evaluateSummaries: the one implementation of the chart formulas", () => {
  test.each(CASES.map((testCase, index) => [testCase.name, testCase, index] as const))(
    "%s: summaries of the measurements give evaluateChart's series, to the bit",
    (_name, testCase, index) => {
      const { data, parameters, summaries } = prepared(testCase, 7100 + index);
      expectSameSeries(evaluateSummaries(summaries, parameters).statistics, evaluateChart(data, parameters).statistics);
    },
  );

  test.each(CASES.map((testCase, index) => [testCase.name, testCase, index] as const))(
    "%s: consecutive slices, each from the state the one before ended in, give the whole series, to the bit",
    (_name, testCase, index) => {
      const { parameters, summaries } = prepared(testCase, 7100 + index);
      const whole = evaluateSummaries(summaries, parameters);
      const slices: ChartResult[] = [];
      let previous: CarriedState | undefined;
      for (let cut = 0; cut + 1 < testCase.cuts.length; cut++) {
        const [from, to] = [testCase.cuts[cut]!, testCase.cuts[cut + 1]!];
        const part = sliceOf(summaries, from, to);
        const result = evaluateSummaries(part, parameters, { firstIndex: from, previous });
        slices.push(result);
        previous = stateAfter(result, part);
      }
      whole.statistics.forEach((series, which) => {
        for (const field of FIELDS) {
          const joined = slices.flatMap((slice) => Array.from(slice.statistics[which]![field]));
          expect(difference(joined, series[field]), `${series.key} ${field}`).toBeUndefined();
        }
      });
    },
  );

  test("a slice at a segment's first point starts afresh, whatever previous state is given", () => {
    const { parameters, summaries } = prepared(CASES.find((testCase) => testCase.chart === "cusum")!, 7200);
    const fresh = evaluateSummaries(summaries, parameters);
    const given = evaluateSummaries(summaries, parameters, { firstIndex: 0, previous: { cusumUpper: 5, cusumLower: 5 } });
    expectSameSeries(given.statistics, fresh.statistics);
  });
});

describe("evaluateSummaries refuses what it cannot compute on", () => {
  const frozen = (chart: ChartType, extra: Partial<ChartParameters> = {}): ChartParameters => ({
    chart,
    center: 10,
    sigma: 1,
    subgroupSize: SUBGROUP_SIZE[chart],
    baseline: { start: 0, end: 4, excluded: [], used: 4 },
    ...extra,
  });
  const means = Float64Array.of(10, 11, 9, 10);

  test("a summary the chart reads is missing, or of another length", () => {
    expect(() => evaluateSummaries({ means }, frozen("xbar-r"))).toThrow(/the xbar-r chart needs the subgroup spreads/);
    expect(() => evaluateSummaries({ means, spreads: Float64Array.of(1, 2, 1) }, frozen("xbar-r"))).toThrow(/given 3 subgroup spreads for 4 subgroups/);
    expect(() => evaluateSummaries({ counts: Float64Array.of(3, 4) }, frozen("p", { center: 0.1, sigma: NaN }))).toThrow(/needs the subgroup sizes/);
  });

  test("a summary outside what it can be names the subgroup", () => {
    const error = (() => {
      try {
        evaluateSummaries({ means: Float64Array.of(10, 11, Number.NaN) }, frozen("imr"));
      } catch (thrown) {
        return thrown;
      }
    })();
    expect(error).toBeInstanceOf(SpcInputError);
    expect((error as SpcInputError).message).toMatch(/subgroup 2: the mean NaN is not a finite number/);
    expect((error as SpcInputError).index).toBe(2);
    const attributes = frozen("u", { center: 3, sigma: NaN });
    expect(() => evaluateSummaries({ counts: Float64Array.of(3, 4), sizes: Float64Array.of(2, 0) }, attributes)).toThrow(/subgroup 1: the size 0 is not a finite number > 0/);
    expect(() => evaluateSummaries({ counts: Float64Array.of(3, -1), sizes: Float64Array.of(2, 2) }, attributes)).toThrow(/subgroup 1: the count -1/);
    expect(() => evaluateSummaries({ means, spreads: Float64Array.of(1, -2, 1, 1) }, frozen("xbar-r"))).toThrow(/subgroup 1: the spread -2/);
  });

  test("p and np counts above their sample size, and an np sample size other than the frozen one", () => {
    const p = frozen("p", { center: 0.1, sigma: NaN, subgroupSize: 1 });
    expect(() => evaluateSummaries({ counts: Float64Array.of(3, 51), sizes: Float64Array.of(50, 50) }, p)).toThrow(/subgroup 1: 51 defectives exceed the sample size 50/);
    const np = frozen("np", { center: 0.1, sigma: NaN, subgroupSize: 50 });
    expect(() => evaluateSummaries({ counts: Float64Array.of(3, 4), sizes: Float64Array.of(50, 40) }, np)).toThrow(/subgroup 1 has sample size 40 where 50 is expected/);
  });

  test.each([
    ["imr", "mean"],
    ["ewma", "ewma"],
    ["cusum", "cusumUpper"],
  ] as const)("%s: a slice inside its segment needs the previous point's %s", (chart, field) => {
    expect(() => evaluateSummaries({ means }, frozen(chart), { firstIndex: 5 })).toThrow(new RegExp(`starts at position 5 of its segment but the previous point's ${field} is undefined`));
  });

  test("a slice start is a whole position of 0 or more", () => {
    expect(() => evaluateSummaries({ means }, frozen("imr"), { firstIndex: -1, previous: { mean: 10 } })).toThrow(/whole position of 0 or more in its segment, not -1/);
    expect(() => evaluateSummaries({ means, spreads: means }, frozen("xbar-r"), { firstIndex: 1.5 })).toThrow(SpcInputError);
  });
});
