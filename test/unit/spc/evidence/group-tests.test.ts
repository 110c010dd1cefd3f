/**
 * Tests across the levels of a tag: one-way ANOVA, Kruskal–Wallis, Brown–Forsythe.
 */
import { describe, expect, test } from "vitest";
import { brownForsythe, brownForsytheBeforeAfter, kruskalWallis, oneWayAnova } from "@/src/spc/evidence";
import { SpcInputError } from "@/src/spc/types";

/**
 * Montgomery, Design and Analysis of Experiments (plasma etch rate vs RF power, Example 3.1, Table 3.1;
 * from memory): SS_treatments = 66870.55, SS_E = 5339.20, F0 = 66.80 on (3, 16), P < 0.01.
 */
const etch = {
  values: [575, 542, 530, 539, 570, 565, 593, 590, 579, 610, 600, 651, 610, 637, 629, 725, 700, 715, 685, 710],
  levels: ["160", "180", "200", "220"].flatMap((power) => Array<string>(5).fill(power)),
};

/** Independent one-way ANOVA F from the textbook sums of squares. */
function anovaF(groups: readonly number[][]): { f: number; between: number; within: number } {
  const all = groups.flat();
  const grand = all.reduce((sum, value) => sum + value, 0) / all.length;
  let between = 0;
  let within = 0;
  for (const group of groups) {
    const center = group.reduce((sum, value) => sum + value, 0) / group.length;
    between += group.length * (center - grand) ** 2;
    for (const value of group) within += (value - center) ** 2;
  }
  return { f: between / (groups.length - 1) / (within / (all.length - groups.length)), between, within };
}

describe("oneWayAnova", () => {
  test("Montgomery's plasma etch example: F = 66.80 on (3, 16) (2 decimals: tolerance 0.005)", () => {
    const result = oneWayAnova(etch.values, etch.levels, { variable: "etch rate", unit: "Å/min", tag: "power" });
    expect(result.df).toEqual([3, 16]);
    expect(Math.abs(result.statistic - 66.8)).toBeLessThan(0.005);
    expect(result.pValue).toBeLessThan(1e-8);
    expect(result.effect.largestGap).toEqual({ higher: "220", lower: "160", difference: 707 - 551.2 });
    expect(result.effect.etaSquared).toBeCloseTo(66870.55 / (66870.55 + 5339.2), 6);
    expect(result.sentence).toBe(
      "etch rate at power 220 runs 156 Å/min higher than at power 160; one-way ANOVA across 4 levels of power, F(3, 16) = 66.8, p < 0.001",
    );
  });

  test("the stdlib-js anova1 documented example: F = 0.3125, p = 0.81607947904798 (treatment df 3)", () => {
    // @stdlib/stats-anova1 README (its printed treatment df of 11 is a misprint: 4 groups give 3).
    const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
    const levels = ["A", "B", "C", "K", "A", "B", "C", "K", "A", "B", "C", "K"];
    const result = oneWayAnova(values, levels);
    expect(result.statistic).toBeCloseTo(0.3125, 12);
    expect(result.pValue).toBeCloseTo(0.81607947904798, 12);
    expect(result.statistic).toBeCloseTo(anovaF([[1, 5, 9], [2, 6, 10], [3, 7, 11], [4, 8, 12]]).f, 12);
  });

  test("refusals: one level, a level with one value, no variation within levels, NaN", () => {
    expect(() => oneWayAnova([1, 2, 3], ["a", "a", "a"])).toThrow(/at least 2 levels/);
    expect(() => oneWayAnova([1, 2, 3], ["a", "a", "b"])).toThrow(/level "b" has 1 values/);
    expect(() => oneWayAnova([1, 1, 2, 2], ["a", "a", "b", "b"])).toThrow(/no variation within/);
    expect(() => oneWayAnova([1, Number.NaN, 2, 3], ["a", "a", "b", "b"])).toThrow(SpcInputError);
  });
});

describe("kruskalWallis", () => {
  test("Hollander & Wolfe (1973) p. 116 data: H = 0.7714, df 2, p = 0.68", () => {
    // The example of the @stdlib/stats-kruskal-test README (H ~0.771, p ~0.68); the same data and
    // result appear in R's kruskal.test documentation (from memory). By hand: N = 14, no ties, rank
    // sums 36, 36, 33 over 5, 4, 5 values: H = 12/(14·15)·(36²/5 + 36²/4 + 33²/5) − 3·15 = 0.771429.
    const values = [2.9, 3.0, 2.5, 2.6, 3.2, 3.8, 2.7, 4.0, 2.4, 2.8, 3.4, 3.7, 2.2, 2.0];
    const levels = [...Array<string>(5).fill("x"), ...Array<string>(4).fill("y"), ...Array<string>(5).fill("z")];
    const result = kruskalWallis(values, levels);
    expect(result.statistic).toBeCloseTo((12 / (14 * 15)) * (36 ** 2 / 5 + 36 ** 2 / 4 + 33 ** 2 / 5) - 45, 10);
    expect(result.df).toBe(2);
    expect(result.pValue).toBeCloseTo(Math.exp(-result.statistic / 2), 12); // χ²₂ upper tail is e^(−H/2)
    expect(result.pValue).toBeCloseTo(0.68, 2);
    expect(result.effect.largestGap.higher).toBe("y"); // medians 2.9, 3.25, 2.8
  });

  test("refuses all-equal data", () => {
    expect(() => kruskalWallis([4, 4, 4, 4], ["a", "a", "b", "b"])).toThrow(/all values are equal/);
  });
});

describe("brownForsythe", () => {
  test("equals the ANOVA F of absolute deviations from group medians (independent computation)", () => {
    const groups = [
      [10.1, 9.8, 10.3, 10.0, 9.9, 10.2],
      [10.4, 9.1, 11.0, 9.6, 10.9, 8.8, 10.0],
      [10.0, 10.05, 9.95, 10.1, 9.9],
    ];
    const deviations = groups.map((group) => {
      const sorted = [...group].sort((a, b) => a - b);
      const middle = sorted.length >> 1;
      const center = sorted.length % 2 ? (sorted[middle] as number) : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
      return group.map((value) => Math.abs(value - center));
    });
    const result = brownForsythe(
      groups.flat(),
      groups.flatMap((group, index) => Array<string>(group.length).fill(String(index + 1))),
      { variable: "weight", tag: "head" },
    );
    expect(result.statistic).toBeCloseTo(anovaF(deviations).f, 10);
    expect(result.df).toEqual([2, 15]);
    expect(result.effect.widest).toBe("2");
    expect(result.effect.narrowest).toBe("3");
    expect(result.pValue).toBeLessThan(0.01);
    expect(result.sentence).toMatch(/^the spread of weight at head 2 is [\d.]+ times that at head 3/);
  });

  test("before/after form finds a doubled spread", () => {
    const before = [0.1, -0.2, 0.15, -0.05, 0.2, -0.1, 0.05, -0.15, 0.12, -0.08];
    const after = before.map((value) => 2 * value + 3);
    const result = brownForsytheBeforeAfter(before, after);
    expect(result.effect.sdRatio).toBeCloseTo(2, 12);
    expect(result.effect.widest).toBe("after");
  });

  test("refuses groups whose deviations do not vary", () => {
    expect(() => brownForsythe([1, 1, 2, 2], ["a", "a", "b", "b"])).toThrow(/do not vary/);
  });
});
