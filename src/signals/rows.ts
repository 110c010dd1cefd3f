/** Signals as stored rows and as plain objects for the API, the pages and the tests. */
import type { PatternKind } from "@/shared/patterns";
import type { RuleId, StatisticKey } from "@/shared/constants";
import type { Pattern } from "@/src/spc/patterns";
import type { Signal } from "@/src/spc/types";

export const SIGNAL_VIEW = {
  id: true,
  characteristicId: true,
  limitSetId: true,
  limitSet: { select: { version: true } },
  rule: true,
  statistic: true,
  startSequence: true,
  endSequence: true,
  firing: true,
  side: true,
  pattern: true,
  status: true,
  detectedAt: true,
  updatedAt: true,
} as const;

export interface TSignalView {
  readonly id: number;
  readonly characteristicId: number;
  readonly limitSetId: number;
  readonly limitSetVersion: number;
  readonly rule: RuleId;
  readonly statistic: StatisticKey;
  readonly startSequence: number;
  readonly endSequence: number;
  readonly firing: number[];
  readonly side: "above" | "below" | null;
  readonly pattern: PatternKind | null;
  readonly status: string;
  readonly detectedAt: Date;
  readonly updatedAt: Date;
}

interface TSignalRow {
  id: number;
  characteristicId: number;
  limitSetId: number;
  limitSet: { version: number };
  rule: string;
  statistic: string;
  startSequence: number;
  endSequence: number;
  firing: string;
  side: string | null;
  pattern: string | null;
  status: string;
  detectedAt: Date;
  updatedAt: Date;
}

export function toSignalView(row: TSignalRow): TSignalView {
  const { limitSet, firing, ...rest } = row;
  return {
    ...rest,
    limitSetVersion: limitSet.version,
    rule: row.rule as RuleId,
    statistic: row.statistic as StatisticKey,
    firing: JSON.parse(firing) as number[],
    side: row.side === "above" || row.side === "below" ? row.side : null,
    pattern: row.pattern as PatternKind | null,
  };
}

/** An engine signal (indices within a segment starting at `offset`) as an engine signal in sequences. */
export function inSequences(signal: Signal, offset: number): Signal {
  return {
    ...signal,
    start: signal.start + offset,
    end: signal.end + offset,
    firing: signal.firing.map((index) => index + offset),
  };
}

/**
 * The pattern the engine read for a signal: the first pattern on the same statistic whose span overlaps
 * the signal's, else the first overlapping pattern on another statistic (a level pattern explains the
 * range or moving-range signals it causes; read-patterns.ts).
 */
export function patternFor(signal: Signal, patterns: readonly Pattern[]): PatternKind | null {
  const overlapping = patterns.filter((pattern) => pattern.start <= signal.end && signal.start <= pattern.end);
  return (overlapping.find((pattern) => pattern.chart === signal.chart) ?? overlapping[0])?.kind ?? null;
}
