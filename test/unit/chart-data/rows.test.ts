// The rows the chart draws from the compact chart view (src/chart-data/view.ts): a point without limits of
// its own takes its segment's, a point with its own keeps them, and a point outside every segment has none.
// Invented values.
import { describe, expect, test } from "vitest";
import type { TStatisticView } from "@/src/chart-data/view";
import { chartRows } from "@/src/components/control-chart/rows";

const FIRST = { center: 10, ucl: 11.5, lcl: 8.5, upperWarning: 11, lowerWarning: 9 };
const OWN = { center: 20, ucl: 23, lcl: 17, upperWarning: 22, lowerWarning: 18 };

const statistic: TStatisticView = {
  key: "x",
  label: "Individual value",
  pointsInRange: 4,
  decimated: false,
  segments: [
    { version: 1, limitSetId: 1, fromSequence: 1, toSequence: 2, constantLimits: FIRST },
    { version: 2, limitSetId: 2, fromSequence: 3, toSequence: 3, constantLimits: null },
  ],
  points: [
    { sequence: 0, timestamp: "2026-03-01T00:00:00.000Z", value: 9, version: null },
    { sequence: 1, timestamp: "2026-03-01T01:00:00.000Z", value: 12, version: 1, firedRules: ["nelson-1"] },
    { sequence: 2, timestamp: "2026-03-01T02:00:00.000Z", value: 10, version: 1, originalValue: 1, corrections: [
      { field: "value", position: 0, recorded: 1, corrected: 10, reason: "decimal point", correctedBy: "Operator", correctedAt: "2026-03-02T00:00:00.000Z" },
    ] },
    { sequence: 3, timestamp: "2026-03-01T03:00:00.000Z", value: 21, version: 2, limits: OWN },
  ],
};

describe("chartRows", () => {
  test("limits come from the point where it has its own, else from its segment, else none", () => {
    const rows = chartRows(statistic);
    expect(rows.map((row) => row.ucl)).toEqual([null, FIRST.ucl, FIRST.ucl, OWN.ucl]);
    expect(rows.map((row) => row.lowerWarning)).toEqual([null, FIRST.lowerWarning, FIRST.lowerWarning, OWN.lowerWarning]);
    expect(rows.map((row) => row.center)).toEqual([null, FIRST.center, FIRST.center, OWN.center]);
  });

  test("absent rules and corrections mean no marker; present ones mark the point", () => {
    const rows = chartRows(statistic);
    expect(rows.map((row) => row.signal)).toEqual([null, 12, null, null]);
    expect(rows.map((row) => row.original)).toEqual([null, null, 1, null]);
  });
});
