/**
 * Loads what the chart draws for a range of a characteristic's history: per plotted statistic, at most
 * about `maxPoints` points (every signal point, every point where the limits step and every corrected
 * point kept; the rest reduced to each bucket's extremes by ./decimate.ts), each with the limit version
 * in force there; the limit segments, which state their limits once where those are the same at every
 * point (points then carry none, nor any empty field: a million-point history sends tens of thousands of
 * points); the signals and process events in the range.
 *
 * Speed: a history may hold a million points, so the full range is read as bare columns of the cached
 * per-subgroup summaries (mean, spread, count, size, EWMA and CUSUM state; no measurement is read) into
 * typed arrays (kept between requests: ./column-cache.ts) through a raw better-sqlite3 connection with
 * prepared statements; only the kept points' times are then read. The plotted values are the cached
 * columns themselves (the moving range, and count / size, by the engine's arithmetic); the limits come
 * from `summarySeries` (src/limits/series.ts), the engine's formulas on the cached summaries, once per
 * distinct case, so a drawn value and limit are those live detection judged (the integration test checks
 * them against `evaluateChart` on the measurements). All reads run in one read transaction: one
 * consistent snapshot even while subgroups arrive.
 */
import type Database from "better-sqlite3";
import { CHART_STATISTIC_KEYS, type ChartType, type RuleId, type StatisticKey } from "@/shared/constants";
import { chartTypeOf } from "@/src/characteristics/setup";
import { storedTimeOf } from "@/src/db/stored-time";
import { AppError } from "@/src/errors";
import { chartParametersOf, limitSegments, segmentAt, summarySeries, type TSegment, type TSummary } from "@/src/limits";
import type { TLimitSetParameters } from "@/src/limits/parameters";
import { movingRanges, rates, warningLimitsAt } from "@/src/spc/charts";
import { RULE_DEFINITIONS } from "@/src/spc/rules";
import type { StatisticSeries } from "@/src/spc/types";
import { cachedColumn, type TColumn } from "./column-cache";
import { decimate } from "./decimate";
import { originalStatistic } from "./originals";
import {
  DEFAULT_MAX_POINTS,
  LISTED_SIGNALS,
  STATISTIC_LABELS,
  type TChartEvent,
  type TChartPoint,
  type TChartSignal,
  type TChartView,
  type TLimitSegment,
  type TPointCorrection,
  type TPointLimits,
  type TStatisticView,
} from "./view";

export interface TChartViewOptions {
  readonly fromSequence?: number;
  readonly toSequence?: number;
  readonly maxPoints?: number;
}

interface TLimitSetRow extends TLimitSetParameters {
  readonly id: number;
  readonly version: number;
  readonly appliesFrom: number;
}

interface TSummaryRow extends TSummary {
  readonly sequence: number;
  readonly timestamp: string;
  readonly id: number;
}

const SQL = {
  characteristic: 'SELECT "id", "chartType", "unit", "processId" FROM "Characteristic" WHERE "id" = ?',
  // Two scalar subqueries: SQLite answers a lone MIN or MAX from the index in O(log n), but scans for both at once.
  history:
    'SELECT (SELECT MIN("sequence") FROM "Subgroup" WHERE "characteristicId" = ?) AS "first", ' +
    '(SELECT MAX("sequence") FROM "Subgroup" WHERE "characteristicId" = ?) AS "last"',
  limitSets:
    'SELECT "id", "version", "center", "sigma", "subgroupSize", "ewmaLambda", "ewmaWidth", "cusumK", "cusumH", ' +
    '"baselineStart", "baselineEnd", "baselineUsed", "appliesFrom" FROM "LimitSet" WHERE "characteristicId" = ? ORDER BY "version"',
  // The kept sequences go in as one JSON array: one statement, whatever their number.
  summaryAt:
    'SELECT "id", "sequence", "timestamp", "mean", "spread", "count", "size", "ewma", "cusumUpper", "cusumLower" FROM "Subgroup" ' +
    'WHERE "characteristicId" = ? AND "sequence" = ?',
  // A long history has tens of thousands of signals: their firings are read as bare rows of four columns,
  // and the whole signal only for the few listed.
  firings:
    'SELECT "statistic", "rule", "firing", "status" FROM "Signal" ' +
    'WHERE "characteristicId" = ? AND "endSequence" >= ? AND "startSequence" <= ? ORDER BY "startSequence", "id"',
  listedSignals:
    'SELECT s."id", s."rule", s."statistic", s."startSequence", s."endSequence", s."firing", s."side", s."pattern", ' +
    's."status", s."detectedAt", l."version" AS "limitSetVersion" FROM "Signal" s JOIN "LimitSet" l ON l."id" = s."limitSetId" ' +
    'WHERE s."characteristicId" = ? AND s."endSequence" >= ? AND s."startSequence" <= ? ' +
    `ORDER BY s."endSequence" DESC, s."id" DESC LIMIT ${LISTED_SIGNALS}`,
  timestampAt: 'SELECT "timestamp" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" = ?',
  // CROSS JOIN: the corrections are few, the subgroups of a range may be a million; walk the corrections.
  corrections:
    'SELECT s."sequence", c."field", m."position", c."originalValue", c."correctedValue", c."reason", c."correctedBy", c."correctedAt" ' +
    'FROM "Correction" c CROSS JOIN "Subgroup" s ON s."id" = c."subgroupId" LEFT JOIN "Measurement" m ON m."id" = c."measurementId" ' +
    'WHERE s."characteristicId" = ? AND s."sequence" BETWEEN ? AND ? ORDER BY c."id"',
  measurements: 'SELECT "value" FROM "Measurement" WHERE "subgroupId" = ? ORDER BY "position"',
  events:
    'SELECT "id", "occurredAt", "kind", "causeCategory", "description", "value", "unit" FROM "ProcessEvent" ' +
    'WHERE "processId" = ? AND "occurredAt" >= ? AND "occurredAt" <= ? ORDER BY "occurredAt", "id"',
  // Timestamps never go backwards along the sequence, so the first by time is the first by sequence.
  eventPosition: 'SELECT "sequence" FROM "Subgroup" WHERE "characteristicId" = ? AND "timestamp" >= ? ORDER BY "timestamp" LIMIT 1',
} as const;

const STORED_UTC = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}\+00:00$/;

/** Stored times (Prisma writes "…+00:00") as ISO 8601 with Z, the form every answer uses. */
function isoTime(stored: string | number): string {
  return typeof stored === "string" && STORED_UTC.test(stored) ? `${stored.slice(0, -6)}Z` : new Date(stored).toISOString();
}

/** The plotted values of every statistic over [from, to], from bare columns (no limits needed). */
function readStatistics(
  database: Database.Database,
  chart: ChartType,
  characteristicId: number,
  history: { first: number; last: number },
  range: { from: number; to: number },
  segmentStarts: ReadonlySet<number>,
): Float64Array[] {
  const { from } = range;
  const column = (name: TColumn) => cachedColumn(database, name, characteristicId, history, range);
  switch (chart) {
    case "imr": {
      // One point before the range gives the first moving range; a segment's first moving range is undefined.
      const before = from > history.first ? cachedColumn(database, "mean", characteristicId, history, { from: from - 1, to: from - 1 })[0]! : Number.NaN;
      const values = column("mean");
      const ranges = movingRanges(values, before);
      for (const start of segmentStarts) if (start >= from && start - from < ranges.length) ranges[start - from] = Number.NaN;
      return [values, ranges];
    }
    case "xbar-r":
    case "xbar-s":
      return [column("mean"), column("spread")];
    case "p":
    case "u": {
      return [rates(column("count"), column("size"))];
    }
    case "np":
    case "c":
      return [column("count")];
    case "ewma":
      return [column("ewma")];
    case "cusum":
      return [column("cusumUpper"), column("cusumLower")];
  }
}

function limitsAt(series: StatisticSeries): TPointLimits {
  const center = series.center;
  const ucl = series.ucl[0]!;
  const lcl = series.lcl[0]!;
  const warning = warningLimitsAt(series, 0);
  return {
    center,
    ucl,
    lcl,
    upperWarning: Number.isNaN(warning.upper) ? null : warning.upper,
    lowerWarning: Number.isNaN(warning.lower) ? null : warning.lower,
  };
}

function sameLimits(first: TPointLimits, second: TPointLimits): boolean {
  return (
    first.center === second.center &&
    first.ucl === second.ucl &&
    first.lcl === second.lcl &&
    first.upperWarning === second.upperWarning &&
    first.lowerWarning === second.lowerWarning
  );
}

/**
 * The limits of every statistic at one point, by the engine's formulas (summarySeries). Limits depend on
 * the version, on the point's sample size (p, u) and, for the EWMA, on its position in the segment, never
 * on earlier values; so they are computed once per distinct case, and the slice is started at the point
 * itself (its own row standing in for the previous state, which moves only the plotted value: that is
 * taken from the stored columns).
 */
function limitCalculator(chart: ChartType) {
  const known = new Map<string, TPointLimits[]>();
  return (segment: TSegment<TLimitSetRow>, sequence: number, rowAt: (sequence: number) => TSummaryRow): TPointLimits[] => {
    const firstIndex = sequence - segment.from;
    const key = `${segment.limitSet.id}|${chart === "p" || chart === "u" ? rowAt(sequence).size : ""}|${chart === "ewma" ? firstIndex : ""}`;
    let limits = known.get(key);
    if (limits === undefined) {
      const row = rowAt(sequence);
      const parameters = chartParametersOf(chart, segment.limitSet);
      limits = summarySeries(chart, parameters, [row], { firstIndex, previous: row }).map(limitsAt);
      known.set(key, limits);
    }
    return limits;
  };
}

interface TSignalRow {
  id: number;
  rule: RuleId;
  statistic: StatisticKey;
  startSequence: number;
  endSequence: number;
  firing: string;
  side: "above" | "below" | null;
  pattern: TChartSignal["pattern"];
  status: string;
  detectedAt: string | number;
  limitSetVersion: number;
}

interface TCorrectionRow {
  sequence: number;
  field: string;
  position: number | null;
  originalValue: number;
  correctedValue: number;
  reason: string;
  correctedBy: string;
  correctedAt: string | number;
}

export function loadChartView(database: Database.Database, characteristicId: number, options: TChartViewOptions = {}): TChartView {
  const maxPoints = options.maxPoints ?? DEFAULT_MAX_POINTS;
  return database.transaction(() => {
    const characteristic = database.prepare(SQL.characteristic).get(characteristicId) as
      | { id: number; chartType: string; unit: string; processId: number }
      | undefined;
    if (characteristic === undefined) throw new AppError("not-found", `Characteristic ${characteristicId} does not exist`);
    const chart = chartTypeOf(characteristic.chartType);
    const keys = CHART_STATISTIC_KEYS[chart];
    const empty: TChartView = {
      characteristicId,
      chartType: chart,
      unit: characteristic.unit,
      history: null,
      range: null,
      maxPoints,
      statistics: keys.map((key) => ({ key, label: STATISTIC_LABELS[key], points: [], segments: [], pointsInRange: 0, decimated: false })),
      signalCounts: { total: 0, open: 0 },
      signals: [],
      events: [],
    };
    const history = database.prepare(SQL.history).get(characteristicId, characteristicId) as { first: number | null; last: number | null };
    if (history.first === null || history.last === null) return empty;
    const { first, last } = history as { first: number; last: number };
    const from = Math.max(first, options.fromSequence ?? first);
    const to = Math.min(last, options.toSequence ?? last);
    if (from > to) return { ...empty, history: { first, last } };

    const limitSets = database.prepare(SQL.limitSets).all(characteristicId) as TLimitSetRow[];
    const segments = limitSegments(limitSets);
    const segmentStarts = new Set(segments.map((segment) => segment.from));

    const firingRows = database.prepare(SQL.firings).raw(true).all(characteristicId, from, to) as [StatisticKey, RuleId, string, string][];
    // Rules firing at each point, per statistic: a panel marks and keeps its own statistic's signal points.
    const firedAt = new Map<StatisticKey, Map<number, RuleId[]>>(keys.map((key) => [key, new Map()]));
    let openSignals = 0;
    for (const [statistic, rule, firing, status] of firingRows) {
      if (status === "new") openSignals++;
      const fired = firedAt.get(statistic);
      if (fired === undefined) continue;
      for (const sequence of JSON.parse(firing) as number[]) {
        if (sequence < from || sequence > to) continue;
        const rules = fired.get(sequence);
        if (rules === undefined) fired.set(sequence, [rule]);
        else rules.push(rule);
      }
    }
    const correctionRows = database.prepare(SQL.corrections).all(characteristicId, from, to) as TCorrectionRow[];
    const correctionsAt = new Map<number, TCorrectionRow[]>();
    for (const row of correctionRows) correctionsAt.set(row.sequence, [...(correctionsAt.get(row.sequence) ?? []), row]);

    // Points every panel keeps whatever their value: both sides of every limit step, and corrected points.
    const keepEverywhere = new Set<number>(correctionsAt.keys());
    for (const start of segmentStarts) {
      for (const sequence of [start - 1, start]) if (sequence >= from && sequence <= to) keepEverywhere.add(sequence);
    }
    const values = readStatistics(database, chart, characteristicId, { first, last }, { from, to }, segmentStarts);
    const decimations = keys.map((key, statisticIndex) =>
      decimate(values[statisticIndex]!, {
        maxPoints,
        keep: [...keepEverywhere, ...firedAt.get(key)!.keys()].map((sequence) => sequence - from),
      }),
    );
    const times = cachedColumn(database, "time", characteristicId, { first, last }, { from, to });
    const isoTimeAt = (sequence: number) => new Date(times[sequence - from]!).toISOString();
    // Whole rows only where needed: a new case of limits, a corrected point.
    const summaryStatement = database.prepare(SQL.summaryAt);
    const rowAt = (sequence: number) => summaryStatement.get(characteristicId, sequence) as TSummaryRow;
    const limitsOf = limitCalculator(chart);

    const statistics: TStatisticView[] = keys.map((key, statisticIndex) => {
      const decimation = decimations[statisticIndex]!;
      const plotted = values[statisticIndex]!;
      const bucketOf = new Map<number, { from: number; to: number; min: number; max: number }>();
      for (const bucket of decimation.buckets) {
        if (bucket.minIndex < 0) continue;
        const span = { from: bucket.start + from, to: bucket.end - 1 + from, min: plotted[bucket.minIndex]!, max: plotted[bucket.maxIndex]! };
        bucketOf.set(bucket.minIndex, span);
        bucketOf.set(bucket.maxIndex, span);
      }
      const sequences = decimation.indices.map((index) => index + from);
      const segmentOf = sequences.map((sequence) => segmentAt(segments, sequence));
      const limits = sequences.map((sequence, position) => {
        const segment = segmentOf[position];
        return segment === undefined ? null : limitsOf(segment, sequence, rowAt)[statisticIndex]!;
      });
      const limitSegmentsShown = segmentsIn(segments, sequences, limits, from, to);
      const constantIn = new Map(limitSegmentsShown.map((shown) => [shown.version, shown.constantLimits]));
      // Only what a point has is written (see ZChartPoint): a long history sends tens of thousands of them.
      const points = decimation.indices.map((index, position): TChartPoint => {
        const sequence = sequences[position]!;
        const segment = segmentOf[position];
        const value = plotted[index]!;
        const point: TChartPoint = {
          sequence,
          timestamp: isoTimeAt(sequence),
          value: Number.isNaN(value) ? null : value,
          version: segment?.limitSet.version ?? null,
        };
        if (segment !== undefined && constantIn.get(segment.limitSet.version) === null) point.limits = limits[position]!;
        const firedRules = firedAt.get(key)!.get(sequence);
        if (firedRules !== undefined) point.firedRules = firedRules;
        const bucket = bucketOf.get(index);
        if (bucket !== undefined) point.bucket = bucket;
        const corrections = correctionsAt.get(sequence);
        if (corrections !== undefined) {
          const originalValue = statisticIndex === 0 ? originalOf(database, chart, rowAt, sequence, corrections) : null;
          if (originalValue !== null) point.originalValue = originalValue;
          point.corrections = corrections.map(toPointCorrection);
        }
        return point;
      });
      return {
        key,
        label: STATISTIC_LABELS[key],
        points,
        segments: limitSegmentsShown,
        pointsInRange: to - from + 1,
        decimated: decimation.buckets.length > 0,
      };
    });

    const timestampOf = (sequence: number): string | null => {
      if (sequence >= from && sequence <= to) return isoTimeAt(sequence);
      const stored = database.prepare(SQL.timestampAt).pluck(true).get(characteristicId, sequence) as string | undefined;
      return stored === undefined ? null : isoTime(stored);
    };
    const latestRows = database.prepare(SQL.listedSignals).all(characteristicId, from, to) as TSignalRow[];
    const signals: TChartSignal[] = latestRows.map((row) => {
      const firing = JSON.parse(row.firing) as number[];
      const lastFiring = firing.at(-1);
      return {
        id: row.id,
        rule: row.rule,
        ruleText: RULE_DEFINITIONS[row.rule].summary,
        statistic: row.statistic,
        startSequence: row.startSequence,
        endSequence: row.endSequence,
        firingCount: firing.length,
        side: row.side,
        pattern: row.pattern,
        status: row.status,
        limitSetVersion: row.limitSetVersion,
        detectedAt: isoTime(row.detectedAt),
        lastFiringAt: lastFiring === undefined ? null : timestampOf(lastFiring),
      };
    });

    return {
      ...empty,
      history: { first, last },
      range: { from, to },
      statistics,
      signalCounts: { total: firingRows.length, open: openSignals },
      signals,
      events: eventsIn(database, characteristic, storedTimeOf(times[0]!), storedTimeOf(times[to - from]!)),
    };
  })();
}

function originalOf(
  database: Database.Database,
  chart: ChartType,
  rowAt: (sequence: number) => TSummaryRow,
  sequence: number,
  corrections: readonly TCorrectionRow[],
): number | null {
  const row = rowAt(sequence);
  const values = database.prepare(SQL.measurements).pluck(true).all(row.id) as number[];
  return originalStatistic(
    chart,
    { values, count: row.count, size: row.size },
    corrections.map((correction) => ({ field: correction.field, position: correction.position, recorded: correction.originalValue })),
  );
}

function toPointCorrection(row: TCorrectionRow): TPointCorrection {
  return {
    field: row.field,
    position: row.position,
    recorded: row.originalValue,
    corrected: row.correctedValue,
    reason: row.reason,
    correctedBy: row.correctedBy,
    correctedAt: isoTime(row.correctedAt),
  };
}

/**
 * Each limit version over the part of [from, to] it applies to; its limits stated once where every kept
 * point of it has the same (the kept points include each segment's first point in the range).
 */
function segmentsIn(
  segments: readonly TSegment<TLimitSetRow>[],
  sequences: readonly number[],
  limits: readonly (TPointLimits | null)[],
  from: number,
  to: number,
): TLimitSegment[] {
  return segments
    .filter((segment) => segment.from <= to && segment.to > from)
    .map((segment) => {
      const fromSequence = Math.max(segment.from, from);
      const toSequence = Math.min(segment.to - 1, to);
      const inside = limits.filter((pointLimits, position): pointLimits is TPointLimits => {
        const sequence = sequences[position]!;
        return sequence >= fromSequence && sequence <= toSequence && pointLimits !== null;
      });
      const firstLimits = inside[0] ?? null;
      const constant = firstLimits !== null && inside.every((pointLimits) => sameLimits(pointLimits, firstLimits));
      return {
        version: segment.limitSet.version,
        limitSetId: segment.limitSet.id,
        fromSequence,
        toSequence,
        constantLimits: constant ? firstLimits : null,
      };
    });
}

function eventsIn(
  database: Database.Database,
  characteristic: { id: number; processId: number },
  fromTimestamp: string,
  toTimestamp: string,
): TChartEvent[] {
  type TEventRow = Omit<TChartEvent, "occurredAt" | "position"> & { occurredAt: string | number };
  const rows = database.prepare(SQL.events).all(characteristic.processId, fromTimestamp, toTimestamp) as TEventRow[];
  const position = database.prepare(SQL.eventPosition).pluck(true);
  return rows.map((row) => ({
    ...row,
    occurredAt: isoTime(row.occurredAt),
    // The range's last point is at or after every event read, so a subgroup is always found.
    position: (position.get(characteristic.id, row.occurredAt) as number) - 0.5,
  }));
}
