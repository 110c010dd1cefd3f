import { describe, expect, test } from "vitest";
import { variablesData } from "@/src/spc/data";
import { subgroupsNeeded } from "@/src/spc/power";
import { createRng, type Rng } from "@/src/spc/random";
import { resolveRuleSet } from "@/src/spc/rules";
import { SpcInputError } from "@/src/spc/types";
import { verifyFix } from "@/src/spc/verification";

// Invented data: subgroups of 5 from N(level, 1).
function subgroups(rng: Rng, levels: number[]): number[][] {
  return levels.map((level) => Array.from({ length: 5 }, () => level + rng.normal()));
}

/** 40 in control at 10, 20 shifted by +2σ, then `after` subgroups at `afterLevel`; adjustment at 60. */
function story(seed: number, afterLevel: number, after: number) {
  const rng = createRng(seed);
  const levels = [...Array<number>(40).fill(10), ...Array<number>(20).fill(12), ...Array<number>(after).fill(afterLevel)];
  return variablesData(subgroups(rng, levels));
}

const rules = resolveRuleSet("we");
const common = { chart: "xbar-r" as const, adjustedAt: 60, rules, falseAlarmRuns: 2000 };

describe("verifyFix", () => {
  test("the window length is the power calculation's m*: 10 subgroups of 5 for δ = 1 at 90 %", () => {
    // 1 − β^m with β = Φ(3 − √5) − Φ(−3 − √5) = 0.7775 (published-values.md §7: n = 5, δ = 1 gives
    // P(≤10) = 0.9192, and P(≤9) = 1 − 0.7775⁹ = 0.896 < 0.9).
    expect(subgroupsNeeded({ delta: 1, n: 5, probability: 0.9 })).toBe(10);
  });

  test("a fix that brings the level back passes, with equivalence shown and no firing", () => {
    const result = verifyFix({ ...common, data: story(1, 10, 15), rng: createRng(2) });
    expect(result.verdict).toBe("passed");
    expect(result.reasons).toEqual([]);
    expect(result.subgroupsNeeded).toBe(10);
    expect(result.window).toEqual({ start: 60, end: 69 });
    // The default baseline ends where the first signal's window starts, at or after the true change (40).
    expect(result.parameters.baseline.end).toBeGreaterThanOrEqual(38);
    expect(result.parameters.baseline.end).toBeLessThanOrEqual(42);
    expect(result.tests.meanEquivalence?.equivalent).toBe(true);
    expect(result.tests.spreadF?.pValue).toBeGreaterThan(0.05);
    // Four Western Electric rules over 10 in-control subgroups fire by chance a few % of the time.
    expect(result.falseAlarmProbability.probability).toBeGreaterThan(0.01);
    expect(result.falseAlarmProbability.probability).toBeLessThan(0.15);
  });

  test("a fix that did not work fails, naming the rule that fired", () => {
    const result = verifyFix({ ...common, data: story(13, 12, 15), rng: createRng(4) });
    expect(result.verdict).toBe("failed");
    expect(result.signals.length).toBeGreaterThan(0);
    expect(result.signals.every((signal) => signal.end >= 60 && signal.end <= 69)).toBe(true);
    expect(result.reasons.some((reason) => reason.startsWith("rule we-"))).toBe(true);
    expect(result.reasons.some((reason) => reason.includes("not shown equivalent"))).toBe(true);
  });

  test("too few subgroups after the adjustment give insufficient data and the count still needed", () => {
    const result = verifyFix({ ...common, data: story(5, 10, 4), rng: createRng(6) });
    expect(result.verdict).toBe("insufficient-data");
    expect(result.subgroupsAfter).toBe(4);
    expect(result.subgroupsMissing).toBe(6);
    expect(result.reasons[0]).toContain("6 more needed");
  });

  test("a firing inside a short window already fails", () => {
    const result = verifyFix({ ...common, data: story(7, 14, 4), rng: createRng(8) });
    expect(result.verdict).toBe("failed");
  });

  test("specification limits add capability before and after with intervals", () => {
    const result = verifyFix({ ...common, windowLength: 25, data: story(9, 10, 25), lsl: 6, usl: 14, rng: createRng(10) });
    expect(result.verdict).toBe("passed");
    const { before, after } = result.capability!;
    expect(before.status).toBe("computed");
    expect(after.status).toBe("computed");
    if (after.status === "computed") {
      expect(after.cpk.lower).toBeLessThan(after.cpk.value);
      expect(after.valueCount).toBe(125);
    }
  });

  test("a spread that grew fails even when the mean is back", () => {
    const rng = createRng(11);
    const data = variablesData([
      ...subgroups(rng, Array<number>(60).fill(10)),
      ...Array.from({ length: 30 }, () => Array.from({ length: 5 }, () => 10 + 1.8 * rng.normal())),
    ]);
    const result = verifyFix({ ...common, windowLength: 30, rules: resolveRuleSet("we-1"), data, rng: createRng(12) });
    expect(result.verdict).toBe("failed");
    expect(result.reasons.some((reason) => reason.startsWith("the spread grew"))).toBe(true);
  });

  test.each([
    { name: "an adjustment at 0", adjustedAt: 0 },
    { name: "an adjustment past the data", adjustedAt: 75 },
  ])("refuses $name", ({ adjustedAt }) => {
    expect(() => verifyFix({ ...common, adjustedAt, data: story(1, 10, 15), rng: createRng(1) })).toThrow(SpcInputError);
  });
});
