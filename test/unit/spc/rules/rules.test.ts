/**
 * Each rule on hand-built sequences (centre 0, sigma 1, limits ±3), positive and negative.
 * Definitions: Western Electric (1956), Statistical Quality Control Handbook; Nelson, L.S. (1984), JQT
 * 16(4) 237–239; as tabulated in /work/shared/reference/published-values.md §3 (Wikipedia "Western
 * Electric rules" and "Nelson rules"; Montgomery & Runger, Applied Statistics and Probability for
 * Engineers, p. 606). Exact comparisons: the rules count points, no tolerance applies.
 */
import { describe, expect, test } from "vitest";
import type { RuleId } from "@/shared/constants";
import { evaluateRules, ruleFirings } from "@/src/spc/rules";
import { alternate, fixedSeries, repeat } from "./series";

/** The firings of one rule on the values: [index, windowStart, side?]. */
function firings(rule: RuleId, values: readonly number[]) {
  return ruleFirings(fixedSeries(values), [rule]).map((firing) =>
    firing.side === undefined ? [firing.index, firing.windowStart] : [firing.index, firing.windowStart, firing.side],
  );
}

const increasing = (count: number) => Array.from({ length: count }, (_, index) => -1 + index * 0.1);

describe.each([
  // rule, label, values, expected firings [index, window start, side]
  ["we-1", "a point above the UCL", [0, 3.5, 0], [[1, 1, "above"]]],
  ["nelson-1", "a point below the LCL", [0, -3.01], [[1, 1, "below"]]],
  ["we-2", "2 of 3 beyond +2σ, the middle point anywhere", [2.5, -2.9, 2.5], [[2, 0, "above"]]],
  ["nelson-5", "2 of 3 beyond −2σ", [0, -2.5, -2.1], [[2, 0, "below"]]],
  ["we-3", "4 of 5 beyond +1σ", [1.5, 1.5, 0, 1.5, 1.5], [[4, 0, "above"]]],
  ["nelson-6", "4 of 5 beyond −1σ", [0, -1.5, -1.5, -3.5, 0.2, -1.1], [[5, 1, "below"]]],
  ["we-4", "8 in a row above", repeat(0.5, 8), [[7, 0, "above"]]],
  ["nelson-2", "9 in a row below", repeat(-0.5, 9), [[8, 0, "below"]]],
  ["nelson-3", "6 points steadily increasing (5 increases)", increasing(6), [[5, 0]]],
  ["nelson-3", "6 points steadily decreasing", increasing(6).reverse(), [[5, 0]]],
  ["nelson-4", "14 points alternating", alternate(0.5, -0.5, 14), [[13, 0]]],
  ["nelson-7", "15 points within 1σ on both sides", alternate(0.5, -0.5, 15), [[14, 0]]],
  ["nelson-8", "8 points beyond 1σ on both sides", alternate(1.5, -1.5, 8), [[7, 0]]],
] as const)("%s fires: %s", (rule, _label, values, expected) => {
  test("at the point completing the pattern, with its window", () => {
    expect(firings(rule, values)).toEqual(expected);
  });
});

describe.each([
  ["we-1", "points exactly at the limits", [3, -3, 2.99]],
  ["we-2", "2 beyond 2σ but 4 points apart", [2.5, 0, 0, 2.5]],
  ["we-2", "2 of 3 beyond 2σ on opposite sides", [2.5, 0, -2.5]],
  ["nelson-5", "points exactly at 2σ", [2, 2, 2]],
  ["we-3", "3 of 5 beyond 1σ", [1.5, 1.5, 0, 0, 1.5, 1.5]],
  ["nelson-6", "4 of 5 beyond 1σ but not on the same side", [1.5, 1.5, -1.5, 1.5, 0]],
  ["we-3", "points exactly at 1σ", repeat(1, 6)],
  ["we-4", "7 in a row above", repeat(0.5, 7)],
  ["nelson-2", "8 in a row below", repeat(-0.5, 8)],
  ["nelson-3", "5 points increasing", increasing(5)],
  ["nelson-3", "a tie inside 7 increasing points", [-1, -0.9, -0.8, -0.8, -0.7, -0.6, -0.5]],
  ["nelson-4", "13 points alternating", alternate(0.5, -0.5, 13)],
  ["nelson-4", "a tie inside 15 alternating points", [...alternate(0.5, -0.5, 7), 0.5, ...alternate(-0.5, 0.5, 7)]],
  ["nelson-7", "14 points within 1σ", alternate(0.5, -0.5, 14)],
  ["nelson-7", "15 points within 1σ but all above", repeat(0.5, 15)],
  ["nelson-7", "a point beyond 1σ among 15", [...alternate(0.5, -0.5, 7), 1.5, ...alternate(0.5, -0.5, 7)]],
  ["nelson-8", "7 points beyond 1σ", alternate(1.5, -1.5, 7)],
  ["nelson-8", "8 points beyond 1σ all on one side", repeat(1.5, 8)],
  ["nelson-8", "a point exactly at 1σ among 8", [1.5, -1.5, 1.5, 1, 1.5, -1.5, 1.5, -1.5]],
] as const)("%s does not fire: %s", (rule, _label, values) => {
  test("no firing", () => {
    expect(firings(rule, values)).toEqual([]);
  });
});

describe("conventions", () => {
  test("a point exactly at ±kσ is not beyond it; the next representable value above is", () => {
    const justAbove = 2 + 2 ** -51; // the next double after 2
    expect(firings("nelson-5", [2, 2])).toEqual([]);
    expect(firings("nelson-5", [2, justAbove])).toEqual([]);
    expect(firings("nelson-5", [justAbove, justAbove])).toEqual([[1, 0, "above"]]);
    expect(firings("nelson-1", [3 + 2 ** -51])).toEqual([[0, 0, "above"]]);
  });

  test("a point exactly at 1σ counts as within 1σ (Nelson 7) and not beyond it (Nelson 8)", () => {
    expect(firings("nelson-7", alternate(1, -1, 15))).toEqual([[14, 0]]);
    expect(firings("nelson-8", alternate(1, -1, 8))).toEqual([]);
  });

  test("points on the centre line are on neither side and break same-side runs", () => {
    expect(firings("we-4", [...repeat(0.5, 4), 0, ...repeat(0.5, 4)])).toEqual([]);
    expect(firings("we-4", [0, ...repeat(0.5, 8)])).toEqual([[8, 1, "above"]]);
  });

  test("a centre-line point counts as within 1σ for Nelson 7 while both sides appear", () => {
    expect(firings("nelson-7", [...alternate(0.5, -0.5, 7), 0, ...alternate(0.5, -0.5, 7)])).toEqual([[14, 0]]);
  });

  test("early window: 2 of the first 2 beyond 2σ and 4 of the first 4 beyond 1σ fire (Champ & Woodall 1987)", () => {
    expect(firings("we-2", [2.5, 2.5])).toEqual([[1, 0, "above"]]);
    expect(firings("we-3", repeat(-1.5, 4))).toEqual([[3, 0, "below"]]);
  });

  test("a long run fires at every point from the n-th on", () => {
    expect(firings("we-4", repeat(0.5, 10)).map(([index]) => index)).toEqual([7, 8, 9]);
  });

  test("the k-of-m rules mark only points beyond the boundary (the point completing the pattern)", () => {
    // Points 0 and 1 beyond 2σ: the window ending at 2 also holds 2 of 3, but point 2 is not beyond.
    expect(firings("we-2", [2.5, 2.5, 0]).map(([index]) => index)).toEqual([1]);
  });

  test("NaN points are skipped and break runs and windows", () => {
    expect(firings("we-4", [...repeat(0.5, 4), Number.NaN, ...repeat(0.5, 4)])).toEqual([]);
    expect(firings("we-4", [Number.NaN, ...repeat(0.5, 8)])).toEqual([[8, 1, "above"]]);
    expect(firings("we-2", [2.5, Number.NaN, 2.5])).toEqual([]);
    expect(firings("we-2", [Number.NaN, 2.5, 2.5])).toEqual([[2, 1, "above"]]);
    expect(firings("nelson-3", [...increasing(3), Number.NaN, ...increasing(6).slice(3)])).toEqual([]);
    expect(firings("nelson-1", [Number.NaN, 4])).toEqual([[1, 1, "above"]]);
  });

  test("rule 1 uses the series' own per-point limits, not the zones", () => {
    const series = { ...fixedSeries([2.5, 2.5, 2.5]), ucl: Float64Array.from([3, 2, 3]) };
    expect(ruleFirings(series, ["we-1"]).map((firing) => firing.index)).toEqual([1]);
  });

  test("per-point sigma sets per-point zones", () => {
    const series = fixedSeries([1.5, 1.5], { sigma: [1, 0.5], ucl: 10, lcl: -10 });
    // Point 0 is 1.5σ (not beyond 2σ); point 1 is 3σ.
    expect(ruleFirings(series, ["we-2"])).toEqual([]);
    const both = fixedSeries([1.5, 1.5], { sigma: [0.5, 0.5], ucl: 10, lcl: -10 });
    expect(ruleFirings(both, ["we-2"]).map((firing) => firing.index)).toEqual([1]);
  });
});

describe("invalid input", () => {
  test("a non-finite point throws, naming its index", () => {
    expect(() => evaluateRules(fixedSeries([0, Number.POSITIVE_INFINITY]), ["we-1"])).toThrow(/point 1 is not finite/);
  });
  test("a negative sigma throws, naming its index", () => {
    expect(() => evaluateRules(fixedSeries([0, 0], { sigma: [1, -1] }), ["we-2"])).toThrow(/sigma at point 1/);
  });
  test("arrays of different lengths throw", () => {
    const series = { ...fixedSeries([0, 0]), ucl: new Float64Array(1) };
    expect(() => evaluateRules(series, ["we-1"])).toThrow(/ucl has 1 values for 2 points/);
  });
  test("uniformLimits set on limits that differ at the last point throws, naming that point", () => {
    const series = { ...fixedSeries([0, 0, 0], { sigma: [1, 1, 2] }), uniformLimits: true };
    expect(() => evaluateRules(series, ["we-2"])).toThrow(/uniformLimits is set but sigma is 1 at 0 and 2 at 2/);
  });
});
