/**
 * Before/after tests (Welch t, F), correlations (Pearson, Spearman), Mann–Kendall and Sen's slope,
 * and the p-value wording.
 */
import fQuantile from "@stdlib/stats-base-dists-f-quantile";
import { describe, expect, test } from "vitest";
import {
  averageRanks,
  formatPValue,
  mannKendall,
  mannKendallVariance,
  pearsonCorrelation,
  spearmanCorrelation,
  varianceRatioTest,
  welchTTest,
} from "@/src/spc/evidence";
import { SpcInputError } from "@/src/spc/types";

/** Student's sleep data (Cushny & Peebles 1905, as used by "Student" 1908): extra sleep, groups 1 and 2. */
const sleepGroupOne = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const sleepGroupTwo = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe("welchTTest", () => {
  test("Student's sleep data: t = 1.8608, df = 17.776, p = 0.07939, 95 % interval (−0.2055, 3.3655)", () => {
    // Published: R's t.test(extra ~ group, data = sleep) prints t = −1.8608, df = 17.776,
    // p-value = 0.07939, CI −3.3654832 to 0.2054832 (from memory); the @stdlib/stats-ttest2 README
    // gives ~−1.861, ~0.079, [~−3.365, ~0.205]. We test after − before, so the signs flip.
    // Tolerance: half a unit in the last printed digit.
    const result = welchTTest(sleepGroupOne, sleepGroupTwo, { variable: "extra sleep", unit: "h" });
    expect(Math.abs(result.statistic - 1.8608)).toBeLessThan(5e-5);
    expect(Math.abs((result.df as number) - 17.776)).toBeLessThan(5e-4);
    expect(Math.abs(result.pValue - 0.07939)).toBeLessThan(5e-6);
    expect(Math.abs((result.effect.confidenceInterval[0] as number) + 0.2054832)).toBeLessThan(5e-8);
    expect(Math.abs((result.effect.confidenceInterval[1] as number) - 3.3654832)).toBeLessThan(5e-8);
    expect(result.effect.difference).toBeCloseTo(1.58, 12);
    expect(result.sentence).toBe(
      "after the event extra sleep runs 1.58 h higher (95 % interval -0.205 h to 3.37 h); Welch t = 1.86, df = 17.8, p = 0.08",
    );
  });

  test("refusals: too few values, no variation on either side", () => {
    expect(() => welchTTest([1], [2, 3])).toThrow(/at least 2/);
    expect(() => welchTTest([1, 1], [2, 2])).toThrow(/no variation/);
  });
});

describe("varianceRatioTest", () => {
  test("F = s²_after/s²_before and p-values agree with the F quantile (independent inverse)", () => {
    // Sleep data: s² group 1 = 3.200556, group 2 = 4.009 (hand computation) → F = 1.252605.
    const result = varianceRatioTest(sleepGroupOne, sleepGroupTwo);
    expect(result.statistic).toBeCloseTo(4.009 / 3.2005556, 5);
    expect(result.df).toEqual([9, 9]);
    // At the 0.975 quantile of F(9, 9) the two-sided p is exactly 0.05, the one-sided 0.025.
    const critical = fQuantile(0.975, 9, 9);
    const scaled = sleepGroupOne.map((value) => value * Math.sqrt(critical));
    expect(varianceRatioTest(sleepGroupOne, scaled).pValue).toBeCloseTo(0.05, 10);
    expect(varianceRatioTest(sleepGroupOne, scaled, {}, "greater").pValue).toBeCloseTo(0.025, 10);
    expect(varianceRatioTest(scaled, sleepGroupOne, {}, "less").pValue).toBeCloseTo(0.025, 10);
  });

  test("sentence says how much wider or narrower", () => {
    const narrower = varianceRatioTest([1, 3, 5, 7], [2, 3, 4, 5], { variable: "weight" });
    expect(narrower.effect.sdRatio).toBeCloseTo(0.5, 12);
    expect(narrower.sentence).toMatch(/^after the event the spread of weight is 50 % narrower \(standard deviation × 0\.5\); F\(3, 3\) = 0\.25/);
  });

  test("refuses zero variance before", () => {
    expect(() => varianceRatioTest([2, 2, 2], [1, 2, 3])).toThrow(/no variation before/);
  });
});

describe("pearsonCorrelation", () => {
  test("the @stdlib/stats-pcorrtest documented example: r ~0.795, t ~3.709, p ~0.006", () => {
    const result = pearsonCorrelation(sleepGroupTwo, sleepGroupOne, { variable: "y", covariate: "x" });
    // Independent r by the textbook formula.
    const mean = (values: number[]) => values.reduce((sum, value) => sum + value, 0) / values.length;
    const [mx, my] = [mean(sleepGroupOne), mean(sleepGroupTwo)];
    let sxy = 0;
    let sxx = 0;
    let syy = 0;
    sleepGroupOne.forEach((x, index) => {
      const y = sleepGroupTwo[index] as number;
      sxy += (x - mx) * (y - my);
      sxx += (x - mx) ** 2;
      syy += (y - my) ** 2;
    });
    expect(result.effect.r).toBeCloseTo(sxy / Math.sqrt(sxx * syy), 12);
    expect(result.effect.r).toBeCloseTo(0.795, 3);
    expect(result.statistic).toBeCloseTo(3.709, 3);
    expect(result.pValue).toBeCloseTo(0.006, 3);
    expect(result.sentence).toBe("y rises with x (r = 0.8); Pearson t = 3.71, p = 0.006");
  });

  test("refusals: constant series, unequal lengths, fewer than 4 pairs", () => {
    expect(() => pearsonCorrelation([1, 2, 3, 4], [5, 5, 5, 5])).toThrow(/constant/);
    expect(() => pearsonCorrelation([1, 2, 3, 4], [1, 2, 3])).toThrow(SpcInputError);
    expect(() => pearsonCorrelation([1, 2, 3], [1, 2, 4])).toThrow(/at least 4/);
  });
});

describe("spearmanCorrelation", () => {
  test("IQ against hours of television: ρ = −29/165 = −0.1758, p = 0.627188 (t approximation)", () => {
    // Worked example of the Wikipedia article "Spearman's rank correlation coefficient" (from memory).
    const iq = [106, 86, 100, 101, 99, 103, 97, 113, 112, 110];
    const television = [7, 0, 27, 50, 28, 29, 20, 12, 6, 17];
    const result = spearmanCorrelation(iq, television);
    expect(result.effect.r).toBeCloseTo(-29 / 165, 12);
    expect(Math.abs(result.pValue - 0.627188)).toBeLessThan(5e-7);
    expect(result.sentence).toMatch(/^the value falls with the covariate \(ρ = -0\.18\)/);
  });

  test("ties get the average of their ranks", () => {
    expect(Array.from(averageRanks([10, 20, 20, 5, 20]))).toEqual([2, 4, 4, 1, 4]);
  });
});

describe("mannKendall", () => {
  /** Exact variance of S over all distinct orderings (permutations of the multiset), by enumeration. */
  function enumeratedVariance(values: number[]): number {
    const scores: number[] = [];
    const permute = (rest: number[], prefix: number[]) => {
      if (rest.length === 0) {
        let score = 0;
        for (let i = 0; i < prefix.length; i++) for (let j = i + 1; j < prefix.length; j++) score += Math.sign((prefix[j] as number) - (prefix[i] as number));
        scores.push(score);
        return;
      }
      rest.forEach((value, index) => permute([...rest.slice(0, index), ...rest.slice(index + 1)], [...prefix, value]));
    };
    permute(values, []);
    // Every permutation (with repeats for tied values) is equally likely under no trend.
    return scores.reduce((sum, score) => sum + score * score, 0) / scores.length;
  }

  test.each([
    { values: [1, 2, 3, 4, 5, 6, 7] },
    { values: [1, 1, 2, 3, 3, 3, 4] },
    { values: [2, 2, 2, 5, 5, 7] },
  ])("tie-corrected variance equals the exact permutation variance: $values", ({ values }) => {
    expect(mannKendallVariance(values)).toBeCloseTo(enumeratedVariance(values), 10);
  });

  test("a hand-computed series: S, Z, Sen's slope", () => {
    // x = 1, 3, 2, 5, 4, 6: pairs up 13, down 2 → S = 11; Var = 6·5·17/18 = 28.333;
    // Z = (11 − 1)/√28.333 = 1.8787; p = 2(1 − Φ(1.8787)) = 0.0603.
    // Slopes (x_j − x_i)/(j − i), 15 of them; median = 1.
    const result = mannKendall([1, 3, 2, 5, 4, 6], { variable: "weight", unit: "g" });
    expect(result.effect.score).toBe(11);
    expect(result.effect.variance).toBeCloseTo(28.3333333, 6);
    expect(result.statistic).toBeCloseTo(10 / Math.sqrt(85 / 3), 12);
    expect(result.pValue).toBeCloseTo(0.0603, 4);
    expect(result.effect.senSlope).toBe(1);
    expect(result.effect.kendallTau).toBeCloseTo(11 / 15, 12);
    expect(result.sentence).toBe("weight drifts higher by 1 g per subgroup (Sen's slope; Kendall τ = 0.73); Mann–Kendall Z = 1.88, p = 0.06");
  });

  test("Sen's slope ignores an outlier that bends least squares", () => {
    const values = Array.from({ length: 20 }, (_, index) => 0.5 * index);
    values[19] = 100;
    expect(mannKendall(values).effect.senSlope).toBeCloseTo(0.5, 12);
  });

  test("refuses constant data", () => {
    expect(() => mannKendall([3, 3, 3, 3, 3])).toThrow(/all values are equal/);
  });
});

describe("formatPValue", () => {
  test.each([
    { p: 0.0004, text: "p < 0.001" },
    { p: 0.00423, text: "p = 0.004" },
    { p: 0.0312, text: "p = 0.03" },
    { p: 0.4567, text: "p = 0.46" },
    { p: 0.999, text: "p > 0.99" },
  ])("$p → $text", ({ p, text }) => {
    expect(formatPValue(p)).toBe(text);
  });
});
