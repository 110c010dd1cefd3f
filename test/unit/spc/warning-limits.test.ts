// Warning limits CL ± 2σ (Montgomery, Introduction to Statistical Quality Control, §5.3; Western Electric,
// Statistical Quality Control Handbook, 1956), the one rule the analyze report and the chart view share:
// a warning limit outside the statistic's range does not exist, and a series without σ has none.
import { describe, expect, test } from "vitest";
import { limitSeries, warningLimitsAt } from "@/src/spc/charts/series";

describe("warning limits", () => {
  test("lie at CL ± 2σ inside the action limits", () => {
    const series = limitSeries({ key: "x", points: new Float64Array([10]), center: 10, sigma: new Float64Array([0.5]), floor: -Infinity, zoneRulesByDefault: true });
    expect(warningLimitsAt(series, 0)).toEqual({ upper: 11, lower: 9 });
  });

  test("a p chart near 1 has no upper warning limit and one near 0 no lower one, rather than lines on the truncated limits", () => {
    // p̄ = 0.95, n = 20: σ = √(0.95·0.05/20) = 0.0487; CL + 2σ = 1.047 > 1 (the ceiling), CL − 2σ = 0.853.
    const high = limitSeries({ key: "p", points: new Float64Array([0.9]), center: 0.95, sigma: new Float64Array([Math.sqrt((0.95 * 0.05) / 20)]), floor: 0, ceiling: 1, zoneRulesByDefault: true });
    const highWarning = warningLimitsAt(high, 0);
    expect(highWarning.upper).toBeNaN();
    expect(highWarning.lower).toBeCloseTo(0.95 - 2 * Math.sqrt((0.95 * 0.05) / 20), 12);
    // p̄ = 0.02, n = 50: CL − 2σ = 0.02 − 0.0396 < 0 (the floor).
    const low = limitSeries({ key: "p", points: new Float64Array([0]), center: 0.02, sigma: new Float64Array([Math.sqrt((0.02 * 0.98) / 50)]), floor: 0, ceiling: 1, zoneRulesByDefault: true });
    expect(warningLimitsAt(low, 0).lower).toBeNaN();
    expect(warningLimitsAt(low, 0).upper).toBeCloseTo(0.02 + 2 * Math.sqrt((0.02 * 0.98) / 50), 12);
  });

  test("a series without σ (CUSUM) has none", () => {
    const series = limitSeries({ key: "cusum-upper", points: new Float64Array([0]), center: 0, sigma: new Float64Array([Number.NaN]), floor: 0, zoneRulesByDefault: false });
    const warning = warningLimitsAt(series, 0);
    expect(warning.upper).toBeNaN();
    expect(warning.lower).toBeNaN();
  });
});
