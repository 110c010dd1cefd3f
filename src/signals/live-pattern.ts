/**
 * The pattern of signals raised or extended live, read by the engine's `readPatterns` from a bounded
 * window: the last LIVE_PATTERN_WINDOW subgroups of the segment (their measurements, the chart evaluated
 * with the segment's frozen parameters, and the segment's stored signals inside the window). Only calls
 * that raise or extend a signal pay for it, and the cost does not grow with the history. Batch
 * re-evaluation reads patterns on the whole segment, which may name a longer episode differently.
 */
import type { ChartType } from "@/shared/constants";
import type { Prisma } from "@/src/db/generated/client";
import { chartParametersOf, type TLimitSetParameters } from "@/src/limits/parameters";
import { evaluateChart } from "@/src/spc/charts";
import { readPatterns } from "@/src/spc/patterns";
import { SpcInputError, type Signal } from "@/src/spc/types";
import { readChartData } from "@/src/subgroups/chart-data";
import { patternFor, type TSignalView } from "./rows";

/** Subgroups read for a live pattern: several episodes' worth (EPISODE_GAP is 10) with room for a change point. */
export const LIVE_PATTERN_WINDOW = 120;

/** A stored signal in window indices (window starting at sequence `from`), cut to the window. */
function inWindow(signal: TSignalView, from: number): Signal {
  const firing = signal.firing.filter((sequence) => sequence >= from).map((sequence) => sequence - from);
  return {
    rule: signal.rule,
    chart: signal.statistic,
    start: Math.max(0, signal.startSequence - from),
    end: signal.endSequence - from,
    firing,
    ...(signal.side === null ? {} : { side: signal.side }),
  };
}

/** `touched` with their pattern read and stored; `segmentSignals` are the segment's signals reaching the window. */
export async function readLivePatterns(
  transaction: Prisma.TransactionClient,
  characteristicId: number,
  chart: ChartType,
  limitSet: TLimitSetParameters & { id: number },
  segmentFrom: number,
  lastSequence: number,
  touched: readonly TSignalView[],
  segmentSignals: readonly TSignalView[],
): Promise<TSignalView[]> {
  if (touched.length === 0) return [];
  const from = Math.max(segmentFrom, lastSequence + 1 - LIVE_PATTERN_WINDOW);
  const stored = await readChartData(transaction, characteristicId, chart, from, lastSequence + 1);
  if (stored === undefined) return [...touched];
  const windowSignals = segmentSignals.filter((signal) => signal.endSequence >= from).map((signal) => inWindow(signal, from));
  let patterns: ReturnType<typeof readPatterns>;
  try {
    patterns = readPatterns(evaluateChart(stored.data, chartParametersOf(chart, limitSet)), windowSignals, stored.data);
  } catch (error) {
    // Data the pattern reader cannot use leave the signals without a pattern, as in batch re-evaluation.
    if (error instanceof SpcInputError) return [...touched];
    throw error;
  }
  const read: TSignalView[] = [];
  for (const signal of touched) {
    const pattern = patternFor(inWindow(signal, from), patterns);
    if (pattern !== signal.pattern) await transaction.signal.update({ where: { id: signal.id }, data: { pattern } });
    read.push({ ...signal, pattern });
  }
  return read;
}
