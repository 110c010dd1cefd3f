/**
 * Property tests (fast-check, invented data): what must hold for every input, not just the worked
 * examples. Location/scale checks compare with a relative tolerance of 1e-9, far above the rounding of a
 * few dozen additions and far below any real error.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { attributesData, individualsData, variablesData } from "@/src/spc/data";
import { SpcInputError, type ChartResult } from "@/src/spc/types";

const finiteValue = fc.double({ min: -1e3, max: 1e3, noNaN: true, noDefaultInfinity: true });
const subgroupsOfFive = fc.array(fc.array(finiteValue, { minLength: 5, maxLength: 5 }), { minLength: 2, maxLength: 30 });
const individuals = fc.array(finiteValue, { minLength: 2, maxLength: 60 });
const shift = fc.double({ min: -1e3, max: 1e3, noNaN: true });
const scale = fc.double({ min: 0.01, max: 100, noNaN: true });

function close(actual: number, expected: number, magnitude: number): boolean {
  return Math.abs(actual - expected) <= 1e-9 * Math.max(1, Math.abs(magnitude));
}

function chartFor(chart: "imr" | "xbar-r" | "xbar-s" | "ewma", groups: number[][]): ChartResult {
  const data = chart === "imr" || chart === "ewma" ? individualsData(groups.flat()) : variablesData(groups);
  return evaluateChart(data, estimateParameters(chart, data));
}

describe("variables charts: limits follow location and scale (a·x + b)", () => {
  test.each(["imr", "xbar-r", "xbar-s", "ewma"] as const)("%s", (chart) => {
    fc.assert(
      fc.property(subgroupsOfFive, shift, scale, (groups, offset, factor) => {
        const base = chartFor(chart, groups);
        const moved = chartFor(chart, groups.map((group) => group.map((value) => factor * value + offset)));
        const magnitude = Math.abs(offset) + factor * 1e3;
        return base.statistics.every((series, which) => {
          const other = moved.statistics[which]!;
          // The location statistic moves with the shift; spread statistics (ranges, deviations) only scale.
          const isLocation = series.floor === -Infinity;
          const map = (value: number) => (isLocation ? factor * value + offset : factor * value);
          return series.ucl.every(
            (limit, index) =>
              close(other.ucl[index]!, map(limit), magnitude) &&
              close(other.lcl[index]!, Math.max(series.floor, map(series.lcl[index]!)), magnitude),
          ) && close(other.center, map(series.center), magnitude);
        });
      }),
      { numRuns: 60 },
    );
  });
});

describe("p chart limits stay inside [0, 1]", () => {
  test("any counts and sizes, including p-bar near 0 or 1 and tiny samples", () => {
    const subgroup = fc.integer({ min: 1, max: 500 }).chain((size) =>
      fc.record({ size: fc.constant(size), count: fc.integer({ min: 0, max: size }) }),
    );
    fc.assert(
      fc.property(fc.array(subgroup, { minLength: 2, maxLength: 40 }), (subgroups) => {
        const data = attributesData(
          subgroups.map((entry) => entry.count),
          subgroups.map((entry) => entry.size),
        );
        const [fraction] = evaluateChart(data, estimateParameters("p", data)).statistics;
        return fraction!.lcl.every((limit, index) => limit >= 0 && limit <= fraction!.ucl[index]! && fraction!.ucl[index]! <= 1);
      }),
      { numRuns: 200 },
    );
  });
});

describe("lower limits never go below the floor", () => {
  test("R, S and MR charts: LCL ≥ 0", () => {
    fc.assert(
      fc.property(subgroupsOfFive, (groups) =>
        (["imr", "xbar-r", "xbar-s"] as const).every((chart) =>
          chartFor(chart, groups).statistics.every((series) => series.lcl.every((limit) => limit >= series.floor)),
        ),
      ),
      { numRuns: 60 },
    );
  });
});

describe("non-finite input is refused with SpcInputError naming the index", () => {
  test("NaN in individuals", () => {
    fc.assert(
      fc.property(individuals, fc.nat(), (values, at) => {
        const index = at % values.length;
        values[index] = Number.NaN;
        try {
          individualsData(values);
          return false;
        } catch (error) {
          return error instanceof SpcInputError && error.index === index && error.message.includes(`value ${index}`);
        }
      }),
    );
  });

  test("Infinity in a subgroup names the subgroup", () => {
    expect(() => variablesData([[1, 2], [3, Number.POSITIVE_INFINITY]])).toThrow(/subgroup 1, value 1 is not a finite/);
    expect(() => variablesData([[1, 2], [Number.NEGATIVE_INFINITY, 3]])).toThrow(SpcInputError);
  });

  test("an empty subgroup and empty data are refused", () => {
    expect(() => variablesData([[1, 2], []])).toThrow(/subgroup 1 is empty/);
    expect(() => individualsData([])).toThrow(SpcInputError);
  });
});

describe("zero variance", () => {
  test("constant individuals: σ = 0, limits collapse onto the centre and no point lies beyond them", () => {
    const data = individualsData(new Array(20).fill(7.5));
    const parameters = estimateParameters("imr", data);
    expect(parameters.sigma).toBe(0);
    for (const series of evaluateChart(data, parameters).statistics) {
      series.points.forEach((point, index) => {
        if (Number.isNaN(point)) return;
        expect(point > series.ucl[index]! || point < series.lcl[index]!).toBe(false);
      });
    }
  });

  test("p-bar = 0: limits are 0 and 0, every point on them", () => {
    const data = attributesData([0, 0, 0], [50, 50, 50]);
    const [fraction] = evaluateChart(data, estimateParameters("p", data)).statistics;
    expect(Array.from(fraction!.ucl)).toEqual([0, 0, 0]);
    expect(Array.from(fraction!.lcl)).toEqual([0, 0, 0]);
  });
});
