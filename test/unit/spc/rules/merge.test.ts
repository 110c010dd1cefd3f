/**
 * Merging firings into signals (issue 3: "consecutive or overlapping firings of one rule merge into one
 * signal with the first point of the first window as start, the last firing point as end, and every
 * firing point listed"). Exact comparisons.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { RULE_IDS, type StatisticKey } from "@/shared/constants";
import { ruleOrder } from "@/src/spc/rules/definitions";
import { continuesSignal, evaluateRules, mergeFirings, type Firing } from "@/src/spc/rules";
import type { Signal } from "@/src/spc/types";
import { fixedSeries, repeat } from "./series";

describe("merging in the batch evaluation", () => {
  test("a long run is one signal from its first window to its last firing", () => {
    const { signals } = evaluateRules(fixedSeries(repeat(0.5, 10)), ["we-4"]);
    expect(signals).toEqual([{ rule: "we-4", chart: "x", start: 0, end: 9, firing: [7, 8, 9], side: "above" }]);
  });

  test("a window overlapping the previous firing point merges", () => {
    // we-2 fires at 1 (window 0–1) and at 3 (window 1–3): 1 ≤ 1 + 1.
    const { signals } = evaluateRules(fixedSeries([2.5, 2.5, 0, 2.5]), ["we-2"]);
    expect(signals).toEqual([{ rule: "we-2", chart: "x", start: 0, end: 3, firing: [1, 3], side: "above" }]);
  });

  test("a window starting right after the previous firing point merges (consecutive)", () => {
    // nelson-1 fires at 1 and 2: windows are single points, 2 ≤ 1 + 1.
    const { signals } = evaluateRules(fixedSeries([0, 4, 4, 0, 4]), ["nelson-1"]);
    expect(signals).toEqual([
      { rule: "nelson-1", chart: "x", start: 1, end: 2, firing: [1, 2], side: "above" },
      { rule: "nelson-1", chart: "x", start: 4, end: 4, firing: [4], side: "above" },
    ]);
  });

  test("a window starting two points after the previous firing does not merge", () => {
    // we-2 fires at 1 (window 0–1) and at 6 (window 4–6).
    const { signals } = evaluateRules(fixedSeries([2.5, 2.5, 0, 0, 0, 2.5, 2.5]), ["we-2"]);
    expect(signals.map(({ start, end }) => [start, end])).toEqual([
      [0, 1],
      [4, 6],
    ]);
  });

  test("a change of side starts a new signal", () => {
    const { signals } = evaluateRules(fixedSeries([2.5, 2.5, -2.5, -2.5]), ["we-2"]);
    expect(signals.map(({ start, end, side }) => [start, end, side])).toEqual([
      [0, 1, "above"],
      [1, 3, "below"],
    ]);
  });

  test("different rules never merge, and signals come ordered by start then rule", () => {
    const { signals } = evaluateRules(fixedSeries([0, -4, ...repeat(0.5, 8)]), ["we-1", "we-4", "nelson-1"]);
    expect(signals.map(({ rule, start }) => [rule, start])).toEqual([
      ["we-1", 1],
      ["nelson-1", 1],
      ["we-4", 2],
    ]);
  });
});

describe("mergeFirings with open signals (live detection)", () => {
  const open: Signal = { rule: "we-4", chart: "x", start: 0, end: 9, firing: [7, 8, 9], side: "above" };
  const next: Firing = { rule: "we-4", chart: "x", index: 10, windowStart: 3, side: "above" };

  test("a firing continuing an open signal extends it", () => {
    expect(continuesSignal(open, next)).toBe(true);
    expect(mergeFirings([next], [open])).toEqual([{ ...open, end: 10, firing: [7, 8, 9, 10] }]);
    expect(open.firing).toEqual([7, 8, 9]); // the input is not changed
  });

  test("a firing on the other side, another statistic or after a gap starts a new signal", () => {
    expect(continuesSignal(open, { ...next, side: "below" })).toBe(false);
    expect(continuesSignal(open, { ...next, chart: "mr" })).toBe(false);
    expect(continuesSignal(open, { ...next, index: 20, windowStart: 13 })).toBe(false);
    const result = mergeFirings([{ ...next, index: 20, windowStart: 13 }], [open]);
    expect(result.map(({ start, end }) => [start, end])).toEqual([
      [0, 9],
      [13, 20],
    ]);
  });
});

describe("order of the merged signals", () => {
  /** The stated order: start, then rule, then statistic; a stable sort keeps creation order among equals. */
  const byStartRuleStatistic = (a: Signal, b: Signal): number =>
    a.start - b.start || ruleOrder(a.rule) - ruleOrder(b.rule) || (a.chart < b.chart ? -1 : a.chart > b.chart ? 1 : 0);
  const charts: StatisticKey[] = ["x", "mr"];
  // Firings of two statistics and every rule in index order, windows up to 15 points, both sides;
  // open signals in any order (as live detection may pass them).
  const firingArbitrary = fc.record({
    rule: fc.constantFrom(...RULE_IDS),
    chart: fc.constantFrom(...charts),
    step: fc.integer({ min: 0, max: 3 }),
    length: fc.integer({ min: 1, max: 15 }),
    side: fc.constantFrom("above" as const, "below" as const, undefined),
  });

  test("every signal in order of start, then rule, then statistic; every firing kept once", () => {
    fc.assert(
      fc.property(fc.array(firingArbitrary, { maxLength: 60 }), fc.array(firingArbitrary, { maxLength: 40 }), (open, fed) => {
        let index = 20;
        const toFiring = ({ rule, chart, step, length, side }: (typeof open)[number]): Firing => {
          index += step;
          const windowStart = Math.max(0, index - length + 1);
          return side === undefined ? { rule, chart, index, windowStart } : { rule, chart, index, windowStart, side };
        };
        // Open signals: single firings at indices before the fed ones, shuffled by reversing.
        const openSignals = mergeFirings(open.map(toFiring)).reverse();
        const firings = fed.map(toFiring);
        const signals = mergeFirings(firings, openSignals);
        expect(signals).toEqual([...signals].sort(byStartRuleStatistic));
        const count = (list: readonly Signal[]) => list.reduce((total, signal) => total + signal.firing.length, 0);
        expect(count(signals)).toBe(count(openSignals) + firings.length);
      }),
      { numRuns: 300, seed: 3 },
    );
  });
});
