/**
 * Merging rule firings into signals.
 *
 * Firings of one rule on one statistic whose windows touch or overlap (the new window's first point is at
 * most the previous firing point + 1) and that see the same side of the centre line form one signal:
 * `start` is the first point of the first window, `end` the last firing point, `firing` every firing point.
 * A change of side starts a new signal, because the side is part of what a signal says (a run above
 * followed at once by a run below is two events, not one). Used by the batch evaluation (fed straight
 * from the word-parallel scan, without a Firing object per firing) and by live detection, which passes
 * the signals still open in the database so that a firing extends them.
 * Cost: O(1) per firing (no key built, no allocation but the point pushed); each new signal is inserted
 * in result order, past the few signals started within the window before it, so no sort is needed.
 */
import type { RuleId, StatisticKey } from "../../../shared/constants";
import type { Signal } from "../types";
import { ruleOrder } from "./definitions";
import type { Firing } from "./scanner";

type Side = Signal["side"];

/** Whether a firing at `index` with its window from `windowStart` on `side` continues `signal` of its rule. */
const continues = (signal: Pick<Signal, "side" | "end">, index: number, windowStart: number, side: Side): boolean =>
  signal.side === side && index > signal.end && windowStart <= signal.end + 1;

/** Whether `firing` continues `signal` (same rule, statistic and side; window touching its end). */
export function continuesSignal(signal: Pick<Signal, "rule" | "chart" | "side" | "end">, firing: Firing): boolean {
  return (
    signal.rule === firing.rule &&
    signal.chart === firing.chart &&
    continues(signal, firing.index, firing.windowStart, firing.side)
  );
}

interface OpenSignal {
  readonly rule: RuleId;
  readonly chart: StatisticKey;
  readonly start: number;
  end: number;
  readonly firing: number[];
  readonly side?: Side;
}

/** Signals built from firings fed in index order (per statistic), after the signals given as open. */
export class SignalBuilder {
  /** Every signal, kept in result order (start, then rule, then statistic) as each is placed. */
  private readonly signals: OpenSignal[] = [];
  /** The rule position of each signal of `signals`, at the same index: the sort key after `start`. */
  private readonly orders: number[] = [];
  /** The latest signal of each rule (by rule position) per statistic. */
  private readonly latest = new Map<StatisticKey, (OpenSignal | undefined)[]>();
  /** The statistic of the last firing and its slots in `latest`: firings of one statistic come in a row. */
  private chart: StatisticKey | undefined;
  private latestOfChart: (OpenSignal | undefined)[] = [];

  constructor(open: readonly Signal[] = []) {
    for (const signal of open) this.place({ ...signal, firing: [...signal.firing] }, ruleOrder(signal.rule));
  }

  private slotsOf(chart: StatisticKey): (OpenSignal | undefined)[] {
    if (chart !== this.chart) {
      let slots = this.latest.get(chart);
      if (slots === undefined) this.latest.set(chart, (slots = []));
      this.chart = chart;
      this.latestOfChart = slots;
    }
    return this.latestOfChart;
  }

  /**
   * Records `signal` as the latest of its rule and inserts it in result order. A new signal starts at
   * most a window length (15 points) before the firing that makes it, and firings come in index order,
   * so it moves back past only the few signals started since: no sort at the end. (Open signals given
   * to the constructor may come in any order; they are few.)
   */
  private place(signal: OpenSignal, order: number): void {
    this.slotsOf(signal.chart)[order] = signal;
    const { signals, orders } = this;
    let position = signals.length;
    signals.push(signal);
    orders.push(order);
    while (position > 0 && precedes(signal, order, signals[position - 1]!, orders[position - 1]!)) {
      signals[position] = signals[position - 1]!;
      orders[position] = orders[position - 1]!;
      position--;
    }
    signals[position] = signal;
    orders[position] = order;
  }

  /** `order` is the rule's position, ruleOrder(rule) (the scan knows it and passes it). */
  add(rule: RuleId, chart: StatisticKey, index: number, windowStart: number, side: Side, order = ruleOrder(rule)): void {
    const signal = this.slotsOf(chart)[order];
    if (signal !== undefined && continues(signal, index, windowStart, side)) {
      signal.end = index;
      signal.firing.push(index);
    } else {
      const firing = [index];
      this.place(
        side === undefined
          ? { rule, chart, start: windowStart, end: index, firing }
          : { rule, chart, start: windowStart, end: index, firing, side },
        order,
      );
    }
  }

  /** Every signal in order of start, then rule, then statistic. */
  result(): Signal[] {
    return this.signals;
  }
}

/**
 * Whether signal `a` (of rule position `aOrder`) comes strictly before `b` in result order: start, then
 * rule, then statistic. Equal signals keep their order of creation.
 */
function precedes(a: OpenSignal, aOrder: number, b: OpenSignal, bOrder: number): boolean {
  return a.start !== b.start ? a.start < b.start : aOrder !== bOrder ? aOrder < bOrder : a.chart < b.chart;
}

/**
 * Merge firings (in index order) into signals. `open` are signals already recorded that the first
 * firings may continue; each one comes back (extended or not) among the result, which lists every
 * signal in order of start, then rule, then statistic.
 */
export function mergeFirings(firings: readonly Firing[], open: readonly Signal[] = []): Signal[] {
  const builder = new SignalBuilder(open);
  for (const { rule, chart, index, windowStart, side } of firings) builder.add(rule, chart, index, windowStart, side);
  return builder.result();
}
