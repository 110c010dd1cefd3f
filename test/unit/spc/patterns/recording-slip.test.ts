import { describe, expect, test } from "vitest";
import { recordingSlipCandidates } from "@/src/spc/patterns/recording-slip";
import { SpcInputError } from "@/src/spc/types";

// Invented readings (the function is pure string arithmetic; no published data set of slips exists).
describe("recordingSlipCandidates", () => {
  test.each([
    { case: "transposed pair after the point", printed: "2.26", level: 2.62, sigma: 0.02, slip: "transposed-digits", value: 2.62 },
    { case: "decimal point one place right", printed: "26.1", level: 2.6, sigma: 0.02, slip: "misplaced-decimal", value: 2.61 },
    { case: "decimal point one place left", printed: "0.261", level: 2.6, sigma: 0.02, slip: "misplaced-decimal", value: 2.61 },
    { case: "decimal point two places", printed: "261", level: 2.6, sigma: 0.02, slip: "misplaced-decimal", value: 2.61 },
    { case: "doubled digit", printed: "2.661", level: 2.61, sigma: 0.02, slip: "doubled-digit", value: 2.61 },
    { case: "dropped digit", printed: "2.1", level: 2.61, sigma: 0.02, slip: "dropped-digit", value: 2.61 },
    { case: "transposition across the point", printed: "6.2", level: 2.6, sigma: 0.05, slip: "transposed-digits", value: 2.6 },
    { case: "negative values keep their sign", printed: "-2.26", level: -2.62, sigma: 0.02, slip: "transposed-digits", value: -2.62 },
  ])("$case: $printed → $value", ({ printed, level, sigma, slip, value }) => {
    const [best] = recordingSlipCandidates(printed, { level, sigma });
    expect(best?.slip).toBe(slip);
    // Decimal strings parse exactly to the nearest double, so equality is exact here.
    expect(best?.value).toBe(value);
  });

  test("the corrected string is written without redundant zeros", () => {
    expect(recordingSlipCandidates("261", { level: 2.6, sigma: 0.02 })[0]?.text).toBe("2.61");
    expect(recordingSlipCandidates(".0261", { level: 0.26, sigma: 0.002 })[0]?.text).toBe("0.261");
  });

  test("an exact doubled-digit fix beats a transposition that lands 0.3 sigma away", () => {
    // "2.661": removing a 6 gives 2.61 exactly; swapping 6 and 1 gives 2.616.
    const candidates = recordingSlipCandidates("2.661", { level: 2.61, sigma: 0.02 });
    expect(candidates.slice(0, 2).map((candidate) => candidate.text)).toEqual(["2.61", "2.616"]);
  });

  test("a dropped digit needs to be half a sigma nearer than another slip to rank first", () => {
    // "2.626" (dropped 6) is also within 1.5 sigma of 2.62, but the exact transposition ranks first.
    const candidates = recordingSlipCandidates("2.26", { level: 2.62, sigma: 0.02 });
    expect(candidates.map((candidate) => candidate.slip)).toContain("dropped-digit");
    expect(candidates[0]?.slip).toBe("transposed-digits");
  });

  test("each candidate lies within the tolerance and reports its distance in sigma", () => {
    const candidates = recordingSlipCandidates("2.26", { level: 2.62, sigma: 0.02, tolerance: 1 });
    expect(candidates.length).toBeGreaterThan(0);
    for (const candidate of candidates) {
      expect(candidate.distance).toBeLessThanOrEqual(1);
      expect(candidate.distance).toBeCloseTo(Math.abs(candidate.value - 2.62) / 0.02, 12);
    }
  });

  test("no slip explains a value far from every one-keystroke variant", () => {
    expect(recordingSlipCandidates("3.91", { level: 2.62, sigma: 0.02 })).toEqual([]);
  });

  test("a reading that is not a plain decimal (exponent form) gives no candidates", () => {
    expect(recordingSlipCandidates("1e-7", { level: 1, sigma: 0.1 })).toEqual([]);
  });

  test("identical adjacent digits cannot be a transposition", () => {
    const candidates = recordingSlipCandidates("5.55", { level: 5.55, sigma: 1, tolerance: 100 });
    expect(candidates.filter((candidate) => candidate.slip === "transposed-digits")).toEqual([]);
  });

  test("values are unique: the same corrected value is listed once, under its simplest slip", () => {
    const candidates = recordingSlipCandidates("2.26", { level: 2.5, sigma: 1, tolerance: 10 });
    const values = candidates.map((candidate) => candidate.value);
    expect(new Set(values).size).toBe(values.length);
  });

  test.each([
    { name: "zero sigma", context: { level: 1, sigma: 0 } },
    { name: "NaN sigma", context: { level: 1, sigma: Number.NaN } },
    { name: "infinite level", context: { level: Number.POSITIVE_INFINITY, sigma: 1 } },
  ])("rejects $name", ({ context }) => {
    expect(() => recordingSlipCandidates("2.26", context)).toThrow(SpcInputError);
  });
});
