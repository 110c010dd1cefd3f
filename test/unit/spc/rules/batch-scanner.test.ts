/**
 * The word-parallel batch scan (batch-scanner.ts) exists only for speed (issue 3: eight Nelson tests on
 * 1,000,000 points within 10 times a bare summing pass); the point-by-point scanner (scanner.ts) is the
 * definition. These property tests hold the two equal, firing for firing and in the same order, on
 * invented series built to hit the cases where a word-parallel form could go wrong: runs crossing the
 * 32-point word boundaries, missing points (NaN) restarting windows, points exactly on the centre line and
 * on the ±1σ, ±2σ boundaries and the limits, ties between successive points, sigma varying from point to
 * point (and NaN or zero sigma), limits varying, floors above center − kσ, and every subset of rules;
 * series whose limits hold one value carry the `uniformLimits` flag, as the charts module sets it, so the
 * scan's path that trusts it (first point's limits and sigma for every point) is held equal too.
 * Most values sit on a quarter-sigma grid so that boundaries and ties are frequent; stretches of values
 * off the grid (some a few units in the last place from a boundary) reach the words the batch scan
 * decides by arithmetic. Exact comparisons.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { RULE_IDS, type RuleId } from "@/shared/constants";
import { scanWords } from "@/src/spc/rules/batch-scanner";
import { ruleOrder } from "@/src/spc/rules/definitions";
import { RuleScanner, ruleMask, type Firing } from "@/src/spc/rules/scanner";
import type { StatisticSeries } from "@/src/spc/types";

function scannerFirings(series: StatisticSeries, rules: number): Firing[] {
  const firings: Firing[] = [];
  new RuleScanner(series.key, rules, series.center, series.floor).scan(series, 0, series.points.length, 0, firings);
  return firings;
}

/** The word scan's firings, or undefined when it declines the series. */
function wordFirings(series: StatisticSeries, rules: number): Firing[] | undefined {
  const chart = series.key;
  const firings: Firing[] = [];
  const complete = scanWords(series, rules, series.center, series.floor, (rule, index, windowStart, side, order) => {
    // The rule's position comes with each firing, for the merging; it must be the rule's own.
    expect(order).toBe(ruleOrder(rule));
    firings.push(side === undefined ? { rule, chart, index, windowStart } : { rule, chart, index, windowStart, side });
  });
  return complete ? firings : undefined;
}

const holdsOneValue = (values: Float64Array): boolean => values.every((value) => value === values[0]);

const grid = (min: number, max: number) => fc.integer({ min, max }).map((quarterSigmas) => quarterSigmas / 4);
/** Off the grid, as measured data are: the words the batch scan decides by arithmetic rather than comparisons. */
const continuous = fc.double({ min: -4.5, max: 4.5, noNaN: true });
/** A boundary (or ±3σ, ±4σ) moved by a few units in the last place: where the arithmetic must defer to exact comparisons. */
const nearBoundary = fc
  .record({ sigmas: fc.integer({ min: -4, max: 4 }), ulps: fc.integer({ min: -3, max: 3 }) })
  .map(({ sigmas, ulps }) => sigmas + ulps * Number.EPSILON * Math.max(1, Math.abs(sigmas)) * 8);
/** Stretches that make each rule fire now and then (noise, quiet, wild, trends, zigzags, runs, gaps). */
const stretch = fc.oneof(
  fc.array(grid(-14, 14), { minLength: 1, maxLength: 40 }),
  fc.array(grid(-4, 4), { minLength: 10, maxLength: 40 }),
  fc.array(fc.constantFrom(-3.5, -3, -2.5, -2, -1.5, -1, 1, 1.5, 2, 2.5, 3, 3.5), { minLength: 3, maxLength: 20 }),
  fc
    .record({ start: grid(-12, 12), step: fc.constantFrom(-0.25, 0.25, 0.5, -0.5, 0), length: fc.integer({ min: 3, max: 10 }) })
    .map(({ start, step, length }) => Array.from({ length }, (_, index) => start + step * index)),
  fc
    .record({ low: grid(-8, 0), high: grid(0, 8), length: fc.integer({ min: 10, max: 20 }) })
    .map(({ low, high, length }) => Array.from({ length }, (_, index) => (index % 2 === 0 ? low : high))),
  fc.record({ level: grid(-6, 6), length: fc.integer({ min: 5, max: 20 }) }).map(({ level, length }) =>
    Array.from({ length }, () => level),
  ),
  fc.array(fc.constant(Number.NaN), { minLength: 1, maxLength: 3 }),
  fc.array(continuous, { minLength: 20, maxLength: 70 }),
  fc.array(fc.oneof({ arbitrary: continuous, weight: 30 }, { arbitrary: nearBoundary, weight: 1 }), {
    minLength: 20,
    maxLength: 70,
  }),
);

const seriesArbitrary = fc
  .record({
    values: fc.array(stretch, { minLength: 1, maxLength: 12 }).map((stretches) => stretches.flat().slice(0, 200)),
    center: fc.constantFrom(0, 0.5, 10, 10.1),
    sigmaKind: fc.constantFrom("constant", "varying", "nan", "zero", "mostly constant", "scaled"),
    // "scaled": one sigma that is not a power of 2, values in sigmas, so that the arithmetic of the batch
    // scan rounds where the boundaries (center ± k·σ) round too.
    scale: fc.constantFrom(0.3, 1 / 3, 0.7, 2.2),
    sigmas: fc.array(fc.constantFrom(1, 1, 1, 0.5, 2, 0, Number.NaN), { minLength: 200, maxLength: 200 }),
    limitKind: fc.constantFrom("3 sigma", "varying", "tight"),
    floor: fc.constantFrom(Number.NEGATIVE_INFINITY, -1.5, -0.5, 0, 0.5),
  })
  .map(({ values, center, sigmaKind, scale, sigmas, limitKind, floor }): StatisticSeries => {
    const length = values.length;
    const sigma = Float64Array.from({ length }, (_, index) => {
      switch (sigmaKind) {
        case "constant":
          return 1;
        case "nan":
          return Number.NaN;
        case "zero":
          return 0;
        case "mostly constant":
          return index % 37 === 36 ? sigmas[index]! : 1;
        case "scaled":
          return scale;
        default:
          return sigmas[index]!;
      }
    });
    const spread = (index: number): number =>
      limitKind === "tight" ? 1.5 : limitKind === "varying" ? 2 + (index % 3) : 3 * (sigma[index]! === sigma[index]! ? sigma[index]! : 1);
    const ucl = Float64Array.from({ length }, (_, index) => center + spread(index));
    const lcl = Float64Array.from({ length }, (_, index) => Math.max(center - spread(index), floor));
    return {
      key: "x",
      points: Float64Array.from(
        values,
        (value) => center + Math.max(sigmaKind === "scaled" ? value * scale : value, floor - center),
      ),
      center,
      ucl,
      lcl,
      sigma,
      floor,
      zoneRulesByDefault: true,
      // Set, as the charts module sets it, exactly where the arrays hold one value: the scan then trusts it.
      uniformLimits: holdsOneValue(ucl) && holdsOneValue(lcl) && holdsOneValue(sigma),
    };
  });
const rulesArbitrary = fc.subarray([...RULE_IDS], { minLength: 1 }).map((rules: RuleId[]) => ruleMask(rules));

/** A series centred on 0 with limits at ±3 and one sigma for every point. */
function fixedLimitSeries(values: readonly number[], sigma: number, uniformLimits: boolean): StatisticSeries {
  const length = values.length;
  return {
    key: "x",
    points: Float64Array.from(values),
    center: 0,
    ucl: new Float64Array(length).fill(3),
    lcl: new Float64Array(length).fill(-3),
    sigma: new Float64Array(length).fill(sigma),
    floor: Number.NEGATIVE_INFINITY,
    zoneRulesByDefault: true,
    uniformLimits,
  };
}

describe("word-parallel batch scan = point-by-point scanner", () => {
  test("same firings in the same order on random series, every rule subset", () => {
    fc.assert(
      fc.property(seriesArbitrary, rulesArbitrary, (series, rules) => {
        expect(wordFirings(series, rules)).toEqual(scannerFirings(series, rules));
      }),
      { numRuns: 1500, seed: 20261202 },
    );
  });

  test("long series: runs and windows across many word boundaries", () => {
    fc.assert(
      fc.property(
        fc.array(stretch, { minLength: 30, maxLength: 60 }).map((stretches) => stretches.flat()),
        // Constant limits, with and without the flag: the fast path and the per-word check of the limits.
        fc.boolean(),
        (values, uniformLimits) => {
          const series = fixedLimitSeries(values, 1, uniformLimits);
          const all = ruleMask(RULE_IDS);
          expect(wordFirings(series, all)).toEqual(scannerFirings(series, all));
        },
      ),
      { numRuns: 200, seed: 5 },
    );
  });

  test.each([
    ["an infinite point", [0, 1, Number.POSITIVE_INFINITY, 0], 1],
    ["a negative sigma", [0, 1, 2, 0], -1],
  ])("declines %s, which the scanner must refuse with its own error", (_, values, sigma) => {
    const series = fixedLimitSeries(values, sigma, false);
    expect(wordFirings(series, ruleMask(RULE_IDS))).toBeUndefined();
  });
});
