/**
 * The incremental form used by live detection must say exactly what the batch evaluation says for the
 * same index, from a bounded tail (issue 5, item 6). Property tests with fast-check on invented series
 * whose values sit on a half-sigma grid, so that boundaries, ties and centre-line points are frequent.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { RULE_IDS, type RuleId } from "@/shared/constants";
import {
  RULE_TAIL_LENGTH,
  createRuleStream,
  evaluateRules,
  firingsAt,
  mergeFirings,
  ruleFirings,
  type Firing,
} from "@/src/spc/rules";
import type { StatisticSeries } from "@/src/spc/types";
import { fixedSeries, repeat } from "./series";

/** The points first .. last (inclusive) of a series, as a series of their own. */
function slice(series: StatisticSeries, first: number, last: number): StatisticSeries {
  return {
    ...series,
    points: series.points.slice(first, last + 1),
    ucl: series.ucl.slice(first, last + 1),
    lcl: series.lcl.slice(first, last + 1),
    sigma: series.sigma.slice(first, last + 1),
  };
}

const grid = (min: number, max: number) => fc.integer({ min, max }).map((halfSigmas) => halfSigmas / 2);
/** Segments that make each rule fire now and then: noise, quiet stretches, wild stretches, trends, zigzags, runs. */
const segment = fc.oneof(
  fc.array(grid(-8, 8), { minLength: 1, maxLength: 10 }),
  fc.array(grid(-2, 2), { minLength: 10, maxLength: 20 }),
  fc.array(fc.constantFrom(-3.5, -2.5, -2, -1.5, 1.5, 2, 2.5, 3.5), { minLength: 5, maxLength: 10 }),
  fc
    .record({ start: grid(-6, 6), step: fc.constantFrom(-0.5, 0.5, 0), length: fc.integer({ min: 4, max: 8 }) })
    .map(({ start, step, length }) => Array.from({ length }, (_, index) => start + step * index)),
  fc
    .record({ low: grid(-4, 0), high: grid(0, 4), length: fc.integer({ min: 10, max: 16 }) })
    .map(({ low, high, length }) => Array.from({ length }, (_, index) => (index % 2 === 0 ? low : high))),
  fc.record({ level: grid(-3, 3), length: fc.integer({ min: 5, max: 12 }) }).map(({ level, length }) => repeat(level, length)),
  fc.constant([Number.NaN]),
);
const seriesArbitrary = fc
  .record({
    values: fc.array(segment, { minLength: 1, maxLength: 8 }).map((segments) => segments.flat().slice(0, 90)),
    sigmas: fc.array(fc.constantFrom(1, 1, 1, 0.5, 2, Number.NaN), { minLength: 90, maxLength: 90 }),
    variableSigma: fc.boolean(),
    floor: fc.constantFrom(Number.NEGATIVE_INFINITY, -1.5, 0),
    zoneRulesByDefault: fc.boolean(),
  })
  .map(({ values, sigmas, variableSigma, floor, zoneRulesByDefault }) => {
    const series = fixedSeries(
      values.map((point) => Math.max(point, floor)),
      { sigma: variableSigma ? sigmas.slice(0, values.length) : 1, floor, zoneRulesByDefault },
    );
    return { ...series, lcl: series.lcl.map((limit) => Math.max(limit, floor)) };
  });
const rulesArbitrary = fc.subarray([...RULE_IDS], { minLength: 1 });

describe("incremental = batch", () => {
  test("the tail needed is 14 earlier points (the longest window, Nelson 7, has 15)", () => {
    expect(RULE_TAIL_LENGTH).toBe(14);
  });

  test("firingsAt on the last 15 points gives the batch firings at every index, and merging them gives the batch signals", () => {
    fc.assert(
      fc.property(seriesArbitrary, rulesArbitrary, fc.boolean(), (series, rules: RuleId[], force) => {
        const options = { forceZoneRules: force };
        const batch = ruleFirings(series, rules, options);
        const live: Firing[] = [];
        for (let index = 0; index < series.points.length; index++) {
          const first = Math.max(0, index - RULE_TAIL_LENGTH);
          const atIndex = firingsAt(slice(series, first, index), first, rules, options);
          expect(atIndex).toEqual(batch.filter((firing) => firing.index === index));
          live.push(...atIndex);
        }
        expect(mergeFirings(live)).toEqual(evaluateRules(series, rules, options).signals);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  test("a longer tail than needed gives the same answer (only the last 15 points are read)", () => {
    fc.assert(
      fc.property(seriesArbitrary, rulesArbitrary, (series, rules: RuleId[]) => {
        const last = series.points.length - 1;
        const short = firingsAt(slice(series, Math.max(0, last - RULE_TAIL_LENGTH), last), Math.max(0, last - 14), rules);
        expect(firingsAt(series, 0, rules)).toEqual(short);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  test("the stream form gives the batch firings", () => {
    fc.assert(
      fc.property(seriesArbitrary, rulesArbitrary, (series, rules: RuleId[]) => {
        const stream = createRuleStream(series, rules);
        const streamed: Firing[] = [];
        series.points.forEach((point, index) => {
          streamed.push(...stream.push(point, series.ucl[index]!, series.lcl[index]!, series.sigma[index]!));
        });
        expect(stream.nextIndex).toBe(series.points.length);
        expect(streamed).toEqual(ruleFirings(series, rules));
      }),
      { numRuns: 200, seed: 11 },
    );
  });

  test("a tail too short for a point past the start is refused", () => {
    expect(() => firingsAt(fixedSeries(repeat(0.5, 10)), 5, ["we-4"])).toThrow(/needs the 14 points before it/);
  });

  test("a firing found live extends the signal already stored", () => {
    const series = fixedSeries(repeat(0.5, 12));
    const stored = evaluateRules(slice(series, 0, 10), ["we-4"]).signals;
    const live = firingsAt(slice(series, 0, 11), 0, ["we-4"]);
    expect(mergeFirings(live, stored)).toEqual(evaluateRules(series, ["we-4"]).signals);
  });
});

describe("constant data", () => {
  test("constant data exactly on the centre line never fires any rule (issue 3 property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 1e3, noNaN: true }),
        fc.integer({ min: 1, max: 60 }),
        fc.boolean(),
        (center, sigma, length, zoneRulesByDefault) => {
          const series = fixedSeries(repeat(center, length), { center, sigma, zoneRulesByDefault });
          expect(evaluateRules(series, RULE_IDS, { forceZoneRules: true }).signals).toEqual([]);
        },
      ),
      { numRuns: 300, seed: 3 },
    );
  });
});
