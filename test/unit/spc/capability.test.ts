/** Capability indices and their intervals against published worked examples. */
import { describe, expect, test } from "vitest";
import { estimateParameters } from "@/src/spc/charts";
import { bissellInterval, chiSquareInterval, computeCapability, MINIMUM_CAPABILITY_VALUES } from "@/src/spc/capability";
import { variablesData } from "@/src/spc/data";
import { SpcInputError } from "@/src/spc/types";
import { PISTON_RINGS } from "./fixtures/piston-rings";

/** N invented values with exactly the given mean and sample standard deviation. */
function valuesWith(count: number, mean: number, standardDeviation: number): Float64Array {
  const raw = Array.from({ length: count }, (_, index) => index - (count - 1) / 2);
  const rawSd = Math.sqrt(raw.reduce((sum, value) => sum + value * value, 0) / (count - 1));
  return Float64Array.from(raw, (value) => mean + (value / rawSd) * standardDeviation);
}

describe("Bissell interval for Cpk", () => {
  test("Quality Digest, May 2000, 'Last Word' (published): N = 45, Cpk 1.15 → 0.89 ≤ Cpk ≤ 1.41 at 95%", () => {
    const interval = bissellInterval(1.15, 45, 0.95);
    // Published to 2 decimals: tolerance 0.005. Recomputed 0.8907, 1.4093.
    expect(Math.abs(interval.lower - 0.89)).toBeLessThan(0.005);
    expect(Math.abs(interval.upper - 1.41)).toBeLessThan(0.005);
  });

  test("Montgomery (from memory): N = 20, Cpk 1.33 → 0.88 ≤ Cpk ≤ 1.78", () => {
    const interval = bissellInterval(1.33, 20, 0.95);
    expect(Math.abs(interval.lower - 0.88)).toBeLessThan(0.005);
    expect(Math.abs(interval.upper - 1.78)).toBeLessThan(0.005);
  });
});

describe("chi-square interval for Cp", () => {
  // Problem text published at wizedu.com (question 1595352): USL 62, LSL 38, n = 20, s = 1.75, 95%.
  // Recomputed with χ²(0.025, 19) = 8.9065 and χ²(0.975, 19) = 32.852: 1.5649 ≤ Cp ≤ 3.0056.
  test("USL 62, LSL 38, n = 20, s = 1.75 → 1.5649 ≤ Cp ≤ 3.0056", () => {
    const interval = chiSquareInterval(24 / (6 * 1.75), 19, 0.95);
    // Recomputed to 4 decimals: tolerance 1e-4.
    expect(interval.value).toBeCloseTo(2.2857, 4);
    expect(Math.abs(interval.lower - 1.5649)).toBeLessThan(1e-4);
    expect(Math.abs(interval.upper - 3.0056)).toBeLessThan(1e-4);
  });

  test("regression: the lower bound uses the 0.025 quantile, not 0.05 (a published solution got 1.671 that way)", () => {
    const interval = chiSquareInterval(24 / (6 * 1.75), 19, 0.95);
    expect(Math.abs(interval.lower - 1.671)).toBeGreaterThan(0.1);
  });

  test("computeCapability gives the same interval for Pp on values with s = 1.75 (ν = N − 1)", () => {
    const result = computeCapability({
      values: valuesWith(20, 50, 1.75),
      mean: 50,
      withinSigma: 1.75,
      lsl: 38,
      usl: 62,
      subgroupCount: 20,
      inControl: true,
    });
    if (result.status !== "computed") throw new Error(result.reason);
    expect(result.overallSigma).toBeCloseTo(1.75, 12);
    expect(Math.abs(result.pp!.lower - 1.5649)).toBeLessThan(1e-4);
    expect(Math.abs(result.pp!.upper - 3.0056)).toBeLessThan(1e-4);
    expect(result.cp!.value).toBeCloseTo(2.2857, 4);
  });
});

describe("piston rings, LSL 73.95, USL 74.05, sigma R-bar/d2 (third-party fixture citing Montgomery)", () => {
  test("Cp ≈ 1.70, Cpk ≈ 1.66 (recomputed 1.7032 and 1.6632 with exact d2)", () => {
    const parameters = estimateParameters("xbar-r", variablesData(PISTON_RINGS));
    const result = computeCapability({
      values: Float64Array.from(PISTON_RINGS.flat()),
      mean: parameters.center,
      withinSigma: parameters.sigma,
      lsl: 73.95,
      usl: 74.05,
      subgroupCount: 25,
      inControl: true,
    });
    if (result.status !== "computed") throw new Error(result.reason);
    // Published to 2 decimals: tolerance 0.005; recomputed values to 1e-4.
    expect(Math.abs(result.cp!.value - 1.7)).toBeLessThan(0.005);
    expect(Math.abs(result.cpk.value - 1.66)).toBeLessThan(0.005);
    expect(Math.abs(result.cp!.value - 1.7032)).toBeLessThan(1e-4);
    expect(Math.abs(result.cpk.value - 1.6632)).toBeLessThan(1e-4);
    expect(result.withinDegreesOfFreedom).toBe(100); // k(n − 1) = 25·4
    expect(result.cpk.lower).toBeLessThan(result.cpk.value);
    expect(result.sides).toBe("two-sided");
  });
});

describe("one-sided and refusals", () => {
  const values = valuesWith(30, 10, 1);
  const base = { values, mean: 10, withinSigma: 1, subgroupCount: 30, inControl: true };

  test("only USL: Cpk is Cpu, Cp and Pp are null", () => {
    const result = computeCapability({ ...base, usl: 13 });
    if (result.status !== "computed") throw new Error(result.reason);
    expect(result.sides).toBe("upper-only");
    expect(result.cp).toBeNull();
    expect(result.pp).toBeNull();
    expect(result.cpl).toBeNull();
    expect(result.cpk.value).toBeCloseTo(1, 14);
    expect(result.cpu).toBeCloseTo(1, 14);
  });

  test("only LSL: Cpk is Cpl", () => {
    const result = computeCapability({ ...base, lsl: 4 });
    if (result.status !== "computed") throw new Error(result.reason);
    expect(result.sides).toBe("lower-only");
    expect(result.cpk.value).toBeCloseTo(2, 14);
  });

  test("not in control, too few values, no limits, no variation: refusals as values", () => {
    expect(computeCapability({ ...base, usl: 13, inControl: false })).toMatchObject({ status: "refused", code: "not-in-control" });
    expect(
      computeCapability({ ...base, values: valuesWith(MINIMUM_CAPABILITY_VALUES - 1, 10, 1), usl: 13 }),
    ).toMatchObject({ status: "refused", code: "too-few-values" });
    expect(computeCapability(base)).toMatchObject({ status: "refused", code: "no-specification" });
    expect(computeCapability({ ...base, values: new Float64Array(30).fill(10), withinSigma: 0, usl: 13 })).toMatchObject({
      status: "refused",
      code: "no-variation",
    });
  });

  test("invalid input throws: NaN value (named), LSL above USL, infinite sigma", () => {
    const withNaN = Float64Array.from(values);
    withNaN[7] = Number.NaN;
    expect(() => computeCapability({ ...base, values: withNaN, usl: 13 })).toThrow(/value 7/);
    expect(() => computeCapability({ ...base, lsl: 14, usl: 13 })).toThrow(SpcInputError);
    expect(() => computeCapability({ ...base, usl: 13, withinSigma: Number.POSITIVE_INFINITY })).toThrow(SpcInputError);
  });
});
