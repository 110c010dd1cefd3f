/**
 * Merging rule firings into signals.
 *
 * Firings of one rule on one statistic whose windows touch or overlap (the new window's first point is at
 * most the previous firing point + 1) and that see the same side of the centre line form one signal:
 * `start` is the first point of the first window, `end` the last firing point, `firing` every firing point.
 * A change of side starts a new signal, because the side is part of what a signal says (a run above
 * followed at once by a run below is two events, not one). Used by the batch evaluation and by live
 * detection, which passes the signals still open in the database so that a firing extends them.
 */
import type { Signal } from "../types";
import { ruleOrder } from "./definitions";
import type { Firing } from "./scanner";

/** Whether `firing` continues `signal` (same rule, statistic and side; window touching its end). */
export function continuesSignal(signal: Pick<Signal, "rule" | "chart" | "side" | "end">, firing: Firing): boolean {
  return (
    signal.rule === firing.rule &&
    signal.chart === firing.chart &&
    signal.side === firing.side &&
    firing.index > signal.end &&
    firing.windowStart <= signal.end + 1
  );
}

interface OpenSignal {
  rule: Signal["rule"];
  chart: Signal["chart"];
  start: number;
  end: number;
  firing: number[];
  side?: Signal["side"];
}

function toSignal(open: OpenSignal): Signal {
  const { rule, chart, start, end, firing, side } = open;
  return side === undefined ? { rule, chart, start, end, firing } : { rule, chart, start, end, firing, side };
}

/**
 * Merge firings (in index order) into signals. `open` are signals already recorded that the first
 * firings may continue; each one comes back (extended or not) among the result, which lists every
 * signal in order of start, then rule, then statistic.
 */
export function mergeFirings(firings: readonly Firing[], open: readonly Signal[] = []): Signal[] {
  // Open signal per statistic and rule; two-level so that no key is built per firing.
  const current = new Map<string, Map<string, OpenSignal>>();
  const closed: OpenSignal[] = [];
  const place = (signal: OpenSignal): void => {
    let byRule = current.get(signal.chart);
    if (byRule === undefined) current.set(signal.chart, (byRule = new Map()));
    const previous = byRule.get(signal.rule);
    if (previous !== undefined) closed.push(previous);
    byRule.set(signal.rule, signal);
  };
  for (const signal of open) place({ ...signal, firing: [...signal.firing] });
  for (const firing of firings) {
    const signal = current.get(firing.chart)?.get(firing.rule);
    if (signal !== undefined && continuesSignal(signal, firing)) {
      signal.end = firing.index;
      signal.firing.push(firing.index);
    } else {
      place({
        rule: firing.rule,
        chart: firing.chart,
        start: firing.windowStart,
        end: firing.index,
        firing: [firing.index],
        side: firing.side,
      });
    }
  }
  for (const byRule of current.values()) closed.push(...byRule.values());
  return closed
    .sort(
      (a, b) =>
        a.start - b.start ||
        ruleOrder(a.rule) - ruleOrder(b.rule) ||
        (a.chart < b.chart ? -1 : a.chart > b.chart ? 1 : 0),
    )
    .map(toSignal);
}
