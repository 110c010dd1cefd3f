// Plotted values per chart type follow the statistics' definitions in Montgomery, "Introduction to
// Statistical Quality Control", 7th ed.: X-bar = mean of the subgroup (sec. 6.2), individuals = the
// value itself (sec. 6.4), p = D / n (sec. 7.2), u = c / n (sec. 7.3). Data below are invented.
import { describe, expect, test } from "vitest";
import {
  groupByProcess,
  plottedValue,
  summarizeCharacteristic,
  type StoredCharacteristic,
  type StoredSubgroup,
} from "@/src/characteristics/summary";

const press = { id: 1, name: "Press 2", kind: "injection-moulding press" };

function subgroup(sequence: number, values: number[], count: number | null = null, size: number | null = null): StoredSubgroup {
  return {
    sequence,
    timestamp: new Date(Date.UTC(2026, 0, 1, sequence)),
    count,
    size,
    measurements: values.map((value) => ({ value })),
  };
}

function characteristic(overrides: Partial<StoredCharacteristic>): StoredCharacteristic {
  return {
    id: 7,
    name: "Weight",
    unit: "g",
    chartType: "xbar-r",
    subgroupSize: 5,
    safetyRelated: false,
    process: press,
    subgroups: [],
    ...overrides,
  };
}

describe("plottedValue", () => {
  test.each([
    { label: "X-bar: subgroup mean", chart: "xbar-r" as const, group: subgroup(0, [1, 2, 3, 4, 5]), expected: 3 },
    { label: "individuals: the value", chart: "imr" as const, group: subgroup(0, [2.5]), expected: 2.5 },
    { label: "p: defectives / sample size", chart: "p" as const, group: subgroup(0, [], 3, 200), expected: 0.015 },
    { label: "u: defects / inspection units", chart: "u" as const, group: subgroup(0, [], 9, 4.5), expected: 2 },
    { label: "c: count over a size of 1", chart: "c" as const, group: subgroup(0, [], 6, 1), expected: 6 },
  ])("$label", ({ chart, group, expected }) => {
    // Tolerance 5e-13 absolute (toBeCloseTo digits 12): the only rounding is one division or one mean.
    expect(plottedValue(group, chart)).toBeCloseTo(expected, 12);
  });

  test("no value when a variables subgroup has no measurements or an attributes subgroup no size", () => {
    expect(plottedValue(subgroup(0, []), "xbar-s")).toBeNull();
    expect(plottedValue(subgroup(0, [], 3, null), "p")).toBeNull();
    expect(plottedValue(subgroup(0, [], 3, 0), "u")).toBeNull();
  });
});

describe("summarizeCharacteristic", () => {
  test("orders the trend oldest first and takes the latest point from the end", () => {
    const summary = summarizeCharacteristic(
      characteristic({ subgroups: [subgroup(2, [3, 5]), subgroup(1, [1, 1]), subgroup(0, [2, 4])] }),
    );
    expect(summary.trend.map((point) => point.sequence)).toEqual([0, 1, 2]);
    expect(summary.latest).toEqual({ sequence: 2, time: "2026-01-01T02:00:00.000Z", value: 4 });
    expect(summary.chartTypeLabel).toBe("X-bar and R");
    expect(summary.statisticName).toBe("subgroup mean");
  });

  test("a characteristic without data has no latest value", () => {
    const summary = summarizeCharacteristic(characteristic({ chartType: "imr", subgroupSize: 1 }));
    expect(summary.latest).toBeNull();
    expect(summary.trend).toEqual([]);
    expect(summary.statisticName).toBe("individual value");
  });

  test("an unknown chart type names the characteristic", () => {
    expect(() => summarizeCharacteristic(characteristic({ chartType: "pie" }))).toThrow(/Characteristic 7 .*"pie"/);
  });
});

describe("groupByProcess", () => {
  test("groups by process in name order", () => {
    const filler = { id: 2, name: "Filler 1", kind: "filler" };
    const groups = groupByProcess([
      characteristic({ id: 1, name: "Weight" }),
      characteristic({ id: 2, name: "Height", chartType: "imr", subgroupSize: 1 }),
      characteristic({ id: 3, name: "Fill volume", process: filler }),
    ]);
    expect(groups.map((group) => group.name)).toEqual(["Filler 1", "Press 2"]);
    expect(groups[1]?.characteristics.map((item) => item.name)).toEqual(["Height", "Weight"]);
  });
});
