/**
 * Episodes: the signals of one statistic grouped into runs that one pattern explains. A sustained shift,
 * a cycle or a mixture fires many rules, over and over; each firing is not a new pattern. Signals whose
 * spans overlap or lie at most `gap` subgroups apart join one episode (single linkage on the time axis,
 * common practice). Cost: O(S log S) for S signals.
 */
import type { Signal, StatisticKey } from "../types";

export interface Episode {
  readonly chart: StatisticKey;
  /** First point of the first window of any signal in the episode. */
  readonly start: number;
  /** Last firing point. */
  readonly end: number;
  readonly signals: readonly Signal[];
  /** Every firing point, sorted, without repeats. */
  readonly firing: readonly number[];
}

/** Default largest gap, in subgroups, between two signals of one episode. */
export const EPISODE_GAP = 10;

/** Group the signals of each statistic into episodes, in time order per statistic. */
export function groupIntoEpisodes(signals: readonly Signal[], gap: number = EPISODE_GAP): Episode[] {
  const byChart = new Map<StatisticKey, Signal[]>();
  for (const signal of signals) byChart.set(signal.chart, [...(byChart.get(signal.chart) ?? []), signal]);
  const episodes: Episode[] = [];
  for (const [chart, chartSignals] of byChart) {
    const sorted = [...chartSignals].sort((first, second) => first.start - second.start || first.end - second.end);
    let current: Signal[] = [];
    let currentEnd = -Infinity;
    const close = () => {
      if (current.length > 0) episodes.push(episodeOf(chart, current));
      current = [];
    };
    for (const signal of sorted) {
      if (signal.start > currentEnd + gap) close();
      current.push(signal);
      currentEnd = Math.max(currentEnd, signal.end);
    }
    close();
  }
  return episodes;
}

function episodeOf(chart: StatisticKey, signals: Signal[]): Episode {
  const firing = [...new Set(signals.flatMap((signal) => signal.firing))].sort((first, second) => first - second);
  return {
    chart,
    start: Math.min(...signals.map((signal) => signal.start)),
    end: Math.max(...signals.map((signal) => signal.end)),
    signals,
    firing,
  };
}
