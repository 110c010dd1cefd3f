// The sentences above the chart and the rows Recharts draws, from hand-made chart views (invented data).
import { describe, expect, test } from "vitest";
import type { TChartPoint, TChartSignal, TChartView } from "@/src/chart-data/view";
import { chartRows } from "@/src/components/control-chart/rows";
import { summarizeChart } from "@/src/components/control-chart/summary";

const LIMITS = { center: 10, ucl: 11.5, lcl: 8.5, upperWarning: 11, lowerWarning: 9 };

function point(sequence: number, value: number, extra: Partial<TChartPoint> = {}): TChartPoint {
  return {
    sequence,
    timestamp: `2026-03-01T0${sequence}:00:00.000Z`,
    value,
    version: 1,
    limits: LIMITS,
    firedRules: [],
    bucket: null,
    originalValue: null,
    corrections: [],
    ...extra,
  };
}

function signal(id: number, endSequence: number, status = "new"): TChartSignal {
  return {
    id,
    rule: "nelson-1",
    ruleText: "1 point beyond the control limits",
    statistic: "x",
    startSequence: endSequence,
    endSequence,
    firingCount: 1,
    side: "above",
    pattern: null,
    status,
    limitSetVersion: 1,
    detectedAt: "2026-03-01T09:00:00.000Z",
    lastFiringAt: "2026-03-01T14:20:00.000Z",
  };
}

function view(signals: TChartSignal[], last = 9, withLimits = true): TChartView {
  const points = Array.from({ length: last + 1 }, (_, sequence) => point(sequence, 10));
  return {
    characteristicId: 1,
    chartType: "imr",
    unit: "g",
    history: { first: 0, last },
    range: { from: 0, to: last },
    maxPoints: 2000,
    statistics: [
      {
        key: "x",
        label: "Individual value",
        points,
        segments: withLimits ? [{ version: 1, limitSetId: 1, fromSequence: 0, toSequence: last, constantLimits: LIMITS }] : [],
        pointsInRange: last + 1,
        decimated: false,
      },
    ],
    signalCounts: { total: signals.length, open: signals.filter((signal) => signal.status === "new").length },
    // Latest first, as loadChartView lists them.
    signals: [...signals].sort((a, b) => b.endSequence - a.endSequence),
    events: [],
  };
}

describe("summarizeChart", () => {
  test("in control since the point after the latest signal, with the open count and the latest rule in words", () => {
    expect(summarizeChart(view([signal(1, 3), signal(2, 5, "closed"), signal(3, 6)]), "UTC")).toEqual({
      headline: "In control since subgroup 7",
      inControl: true,
      detail: "2 open signals, latest: 1 point beyond the control limits (nelson-1) at 1 Mar 2026, 14:20 UTC",
    });
  });

  test("the latest firing's time is written in the site's zone (1 March: CET, UTC+1, from memory)", () => {
    expect(summarizeChart(view([signal(3, 6)]), "Europe/Vienna").detail).toBe(
      "1 open signal, latest: 1 point beyond the control limits (nelson-1) at 1 Mar 2026, 15:20 CET",
    );
  });

  test("out of control when the latest point fired", () => {
    const summary = summarizeChart(view([signal(1, 9)]), "UTC");
    expect(summary.inControl).toBe(false);
    expect(summary.headline).toBe("Out of control at the latest subgroup (9)");
    expect(summary.detail).toMatch(/^1 open signal, latest/);
  });

  test("no signal, no limits, no data", () => {
    expect(summarizeChart(view([]), "UTC").headline).toBe("In control: no signal in subgroups 0–9");
    expect(summarizeChart(view([], 9, false), "UTC").headline).toMatch(/^No control limits yet/);
    expect(summarizeChart({ ...view([]), history: null }, "UTC").headline).toBe("No subgroups recorded yet");
  });
});

describe("chartRows", () => {
  test("limits flattened, the signal marker only where a rule fired, the recorded value only where corrected", () => {
    const correction = { field: "value", position: 0, recorded: 2.26, corrected: 2.62, reason: "digits swapped", correctedBy: "A. Operator", correctedAt: "2026-03-02T00:00:00.000Z" };
    const rows = chartRows({
      ...view([]).statistics[0]!,
      points: [
        point(0, 10),
        point(1, 12, { firedRules: ["nelson-1"] }),
        point(2, 2.62, { originalValue: 2.26, corrections: [correction] }),
        point(3, 9, { limits: null, version: null }),
      ],
    });
    expect(rows.map(({ sequence, value, ucl, signal, original }) => ({ sequence, value, ucl, signal, original }))).toEqual([
      { sequence: 0, value: 10, ucl: 11.5, signal: null, original: null },
      { sequence: 1, value: 12, ucl: 11.5, signal: 12, original: null },
      { sequence: 2, value: 2.62, ucl: 11.5, signal: null, original: 2.26 },
      { sequence: 3, value: 9, ucl: null, signal: null, original: null },
    ]);
  });
});
