import ttest2 from "@stdlib/stats-ttest2";
import { describe, expect, test } from "vitest";
import { oneSampleEquivalence, welchEquivalence } from "@/src/spc/verification/tost";
import { SpcInputError } from "@/src/spc/types";

// Student's sleep data (Cushny & Peebles 1905, as printed by Student 1908, Biometrika 6): extra hours of
// sleep under two drugs, 10 patients each, treated here as independent samples as in R's documentation
// example `t.test(extra ~ group, data = sleep)`.
const group1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const group2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe("welchEquivalence", () => {
  const result = welchEquivalence(group1, group2, 0.5);

  test("reproduces R's Welch test on the sleep data", () => {
    // R's printed output for that example (from memory): t = -1.8608, df = 17.776. TOST's statistics
    // are (d ± margin)/se with the same se, so the Welch t fixes them: d / se = -1.8608.
    expect(result.difference).toBeCloseTo(-1.58, 12);
    expect(result.difference / result.standardError).toBeCloseTo(-1.8608, 4);
    expect(result.degreesOfFreedom).toBeCloseTo(17.776, 3);
  });

  test("each one-sided test agrees with the reference library's shifted Welch test", () => {
    // @stdlib/stats-ttest2 with `difference` = ∓margin and a one-sided alternative is the same test.
    const lower = ttest2(group1, group2, { difference: -0.5, alternative: "greater" });
    const upper = ttest2(group1, group2, { difference: 0.5, alternative: "less" });
    // Tolerance 1e-10: both compute the same closed form in double precision.
    expect(result.lower.statistic).toBeCloseTo(lower.statistic, 10);
    expect(result.lower.pValue).toBeCloseTo(lower.pValue, 10);
    expect(result.upper.statistic).toBeCloseTo(upper.statistic, 10);
    expect(result.upper.pValue).toBeCloseTo(upper.pValue, 10);
  });

  test("the drugs are not shown equivalent within half an hour", () => {
    expect(result.equivalent).toBe(false);
    expect(result.pValue).toBe(Math.max(result.lower.pValue, result.upper.pValue));
    // The 90 % interval reaches outside ±0.5: the duality with the confidence interval.
    expect(result.interval.level).toBeCloseTo(0.9, 12);
    expect(result.interval.lower).toBeLessThan(-0.5);
  });
});

describe("oneSampleEquivalence", () => {
  test("a mean close to the reference with small scatter is equivalent; the interval lies inside the margin", () => {
    const values = [10.02, 9.97, 10.01, 9.99, 10.03, 9.98, 10.0, 10.01];
    const result = oneSampleEquivalence(values, 10, 0.1);
    expect(result.equivalent).toBe(true);
    expect(result.interval.lower).toBeGreaterThan(-0.1);
    expect(result.interval.upper).toBeLessThan(0.1);
    expect(result.degreesOfFreedom).toBe(7);
  });

  test("a mean off by more than the margin is not equivalent", () => {
    const values = [10.22, 10.17, 10.21, 10.19, 10.23, 10.18, 10.2, 10.21];
    expect(oneSampleEquivalence(values, 10, 0.1).equivalent).toBe(false);
  });

  test.each([
    { name: "one value", values: [1], margin: 1 },
    { name: "constant values", values: [1, 1, 1], margin: 1 },
    { name: "a zero margin", values: [1, 2, 3], margin: 0 },
    { name: "a NaN value", values: [1, Number.NaN, 3], margin: 1 },
  ])("refuses $name", ({ values, margin }) => {
    expect(() => oneSampleEquivalence(values, 2, margin)).toThrow(SpcInputError);
  });
});
