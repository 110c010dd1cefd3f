// The plotted value as recorded, before corrections, per chart family (invented numbers, worked by hand).
import { describe, expect, test } from "vitest";
import { originalStatistic } from "@/src/chart-data/originals";

describe("originalStatistic", () => {
  test("individuals: the first correction's original is the value as recorded", () => {
    const corrections = [
      { field: "value", position: 0, recorded: 2.26 },
      { field: "value", position: 0, recorded: 2.6 },
    ];
    expect(originalStatistic("imr", { values: [2.62], count: null, size: null }, corrections)).toBe(2.26);
  });

  test("X-bar: the subgroup mean with the corrected value put back as recorded", () => {
    // Current values 1, 2, 3 (mean 2); position 2 was recorded as 6: mean as recorded (1 + 2 + 6) / 3 = 3.
    expect(originalStatistic("xbar-r", { values: [1, 2, 3], count: null, size: null }, [{ field: "value", position: 2, recorded: 6 }])).toBe(3);
  });

  test("p: count and sample size each as recorded; u: units as recorded; c: the count", () => {
    expect(originalStatistic("p", { values: [], count: 5, size: 500 }, [{ field: "count", position: null, recorded: 50 }])).toBe(0.1);
    expect(originalStatistic("u", { values: [], count: 8, size: 4 }, [{ field: "units", position: null, recorded: 2 }])).toBe(4);
    expect(originalStatistic("c", { values: [], count: 3, size: 1 }, [{ field: "count", position: null, recorded: 30 }])).toBe(30);
  });

  test("no correction, or a smoothed chart whose plotted value depends on earlier points: null", () => {
    expect(originalStatistic("imr", { values: [2.62], count: null, size: null }, [])).toBeNull();
    expect(originalStatistic("ewma", { values: [2.62], count: null, size: null }, [{ field: "value", position: 0, recorded: 2.26 }])).toBeNull();
  });
});
