/**
 * The sentences above the chart, for screen readers and for anyone who has a few seconds: is the process
 * in control now, since when, and what fired last. Pure: computed from the chart view.
 */
import { formatTime } from "../format";
import type { TChartView } from "@/src/chart-data/view";

export interface TChartSummary {
  /** "In control since subgroup 412", "Out of control at the latest subgroup", ... */
  readonly headline: string;
  readonly inControl: boolean;
  /** "3 open signals, latest: ...", or null when there is none. */
  readonly detail: string | null;
}

/** `zone`: the site's time zone, in which the latest firing's time is written. */
export function summarizeChart(view: TChartView, zone: string): TChartSummary {
  if (view.history === null) return { headline: "No subgroups recorded yet", inControl: true, detail: null };
  const hasLimits = view.statistics.some((statistic) => statistic.segments.length > 0);
  if (!hasLimits) {
    return { headline: "No control limits yet: points are shown without a verdict", inControl: true, detail: null };
  }
  const open = view.signalCounts.open;
  // The view lists the latest signals first.
  const latest = view.signals[0];
  if (latest === undefined) {
    return { headline: `In control: no signal in subgroups ${view.history.first}–${view.history.last}`, inControl: true, detail: null };
  }
  const inControl = latest.endSequence < view.history.last;
  const headline = inControl
    ? `In control since subgroup ${latest.endSequence + 1}`
    : `Out of control at the latest subgroup (${view.history.last})`;
  const when = latest.lastFiringAt === null ? `subgroup ${latest.endSequence}` : formatTime(latest.lastFiringAt, zone);
  const count = open === 1 ? "1 open signal" : `${open} open signals`;
  return { headline, inControl, detail: `${count}, latest: ${latest.ruleText} (${latest.rule}) at ${when}` };
}
