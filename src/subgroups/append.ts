/**
 * Appending subgroups to a characteristic (API, manual entry, CSV import), with live detection.
 *
 * 1. Every subgroup is checked with the characteristic's schema (`subgroupSchemaFor`); one invalid
 *    subgroup rejects the whole call, naming each bad subgroup and field. Timestamps must not go back in
 *    time (equal is allowed). Rows with a source key already stored are skipped (a re-import or a retried
 *    post adds nothing) and are not checked against time order: they are replays, not new points. A key
 *    already stored for a subgroup at another time is a conflict: the key was used for two readings.
 * 2. Sequences continue after the last stored one; subgroups, measurements, tags and the cached summaries
 *    are written in one transaction together with the signals they raise.
 * 3. Live detection: each new point is evaluated against the limit set in force with the rules'
 *    incremental form (`firingsAt`), over the cached summaries of at most RULE_TAIL_LENGTH + 1 earlier
 *    points of the segment and, for EWMA and CUSUM, the previous point's cached statistic, so the cost
 *    does not depend on the length of the history. Firings merge into the signals still open
 *    (`mergeFirings`): a firing that continues one extends it instead of creating another. With no limit
 *    set yet, subgroups are stored and nothing is raised (`limits: null` says so).
 * A signal raised or extended gets the pattern the engine reads from a bounded window of recent
 * subgroups (src/signals/live-pattern.ts).
 */
import type { RuleId } from "@/shared/constants";
import { subgroupSchemaFor, type TPostedSubgroup, type TSubgroupInput } from "@/shared/intake";
import { chartTypeOf } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import type { Prisma } from "@/src/db/generated/client";
import { AppError, type TIssue } from "@/src/errors";
import { chartParametersOf } from "@/src/limits/parameters";
import { limitSegments, type TSegment } from "@/src/limits/segments";
import { summarySeries, type TSummary } from "@/src/limits/series";
import { LIVE_PATTERN_WINDOW, readLivePatterns } from "@/src/signals/live-pattern";
import { SIGNAL_VIEW, toSignalView, type TSignalView } from "@/src/signals/rows";
import { firingsAt, mergeFirings, resolveRuleSet, RULE_TAIL_LENGTH, type Firing } from "@/src/spc/rules";
import type { Signal, StatisticSeries } from "@/src/spc/types";
import { summarize } from "./summaries";

export interface TAppendOptions {
  /** Where the subgroups come from; only an import may name an import batch. */
  readonly source: "api" | "entry" | "import";
  readonly now: Date;
  readonly importBatchId?: number;
  /**
   * One key per input (the file row's key, a caller's key; undefined for an input without one); inputs
   * whose key is already stored are skipped.
   */
  readonly sourceKeys?: readonly (string | undefined)[];
}

/** What became of one input: stored by this call, or skipped because its source key was already stored. */
export interface TAppendOutcome {
  readonly status: "stored" | "already-present";
  /** The stored subgroup: the new one, or the one stored earlier under the same key. */
  readonly id: number;
  readonly sequence: number;
}

export interface TStoredSubgroup {
  readonly id: number;
  readonly sequence: number;
  readonly timestamp: Date;
  readonly values: number[] | null;
  readonly count: number | null;
  readonly size: number | null;
  readonly tags: Record<string, string>;
  readonly mean: number | null;
  readonly spread: number | null;
  /** Rules that fired at this point (empty: in control as far as the rules can tell). */
  readonly firedRules: RuleId[];
}

export interface TAppendResult {
  readonly stored: TStoredSubgroup[];
  /** Signals created or extended by these subgroups. */
  readonly signals: TSignalView[];
  /** Inputs skipped because their source key was already stored. */
  readonly alreadyPresent: number;
  /** One per input, in input order. */
  readonly outcomes: TAppendOutcome[];
  /** The limit version the new points were judged against, or null with the reason. */
  readonly limits: { readonly limitSetId: number; readonly version: number } | null;
  readonly notes: string[];
}

/** The subgroup's issues, or the parsed subgroup. */
function check(schema: ReturnType<typeof subgroupSchemaFor>, input: unknown, index: number, issues: TIssue[]): TSubgroupInput | undefined {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  for (const issue of parsed.error.issues) {
    issues.push({ index, path: ["subgroups", index, ...issue.path].map(String).join("."), message: issue.message });
  }
  return undefined;
}

function rejectAll(message: string, issues: TIssue[]): never {
  throw new AppError("invalid-input", message, issues);
}

/** Longest an append's transaction may run or wait for the write lock. */
const APPEND_TIMEOUT_MS = 60_000;

/** One schema per chart type and size: building a zod schema costs more than checking one subgroup. */
const schemas = new Map<string, ReturnType<typeof subgroupSchemaFor>>();
function schemaFor(chart: ReturnType<typeof chartTypeOf>, subgroupSize: number): ReturnType<typeof subgroupSchemaFor> {
  const key = `${chart}/${subgroupSize}`;
  let schema = schemas.get(key);
  if (schema === undefined) schemas.set(key, (schema = subgroupSchemaFor(chart, subgroupSize)));
  return schema;
}

function validate(
  chart: ReturnType<typeof chartTypeOf>,
  subgroupSize: number,
  inputs: readonly unknown[],
  sourceKeys: readonly (string | undefined)[] | undefined,
): TSubgroupInput[] {
  if (inputs.length === 0) rejectAll("No subgroups were given", [{ path: "subgroups", message: "must hold at least one subgroup" }]);
  if (sourceKeys !== undefined && sourceKeys.length !== inputs.length) {
    throw new Error(`appendSubgroups: ${sourceKeys.length} source keys for ${inputs.length} subgroups`);
  }
  const schema = schemaFor(chart, subgroupSize);
  const issues: TIssue[] = [];
  const parsed = inputs.map((input, index) => check(schema, input, index, issues));
  const firstOf = new Map<string, number>();
  sourceKeys?.forEach((key, index) => {
    if (key === undefined) return;
    const first = firstOf.get(key);
    if (first === undefined) firstOf.set(key, index);
    else issues.push({ index, path: `subgroups.${index}`, message: `repeats the key "${key}" of subgroup ${first}` });
  });
  if (issues.length > 0) {
    const count = new Set(issues.map((issue) => issue.index)).size;
    rejectAll(`${count} of ${inputs.length} subgroups are not valid; nothing was stored`, issues);
  }
  return parsed as TSubgroupInput[];
}

/**
 * Refuses timestamps earlier than the one before them (the last stored subgroup, then each other), among
 * the inputs to be stored; `index` is each one's place in the call, which the issues name.
 */
function checkTimeOrder(inputs: readonly { input: TSubgroupInput; index: number }[], last: { sequence: number; timestamp: Date } | null): void {
  let previous = last === null ? null : { time: last.timestamp.getTime(), what: `the last stored subgroup (sequence ${last.sequence})` };
  const issues: TIssue[] = [];
  for (const { input, index } of inputs) {
    const time = new Date(input.timestamp).getTime();
    if (previous !== null && time < previous.time) {
      issues.push({
        index,
        path: `subgroups.${index}.timestamp`,
        message: `${input.timestamp} is earlier than ${previous.what} at ${new Date(previous.time).toISOString()}; subgroups must arrive in time order`,
      });
    }
    previous = { time, what: `subgroup ${index}` };
  }
  if (issues.length > 0) rejectAll(`Timestamps go backwards; nothing was stored`, issues);
}

const SUMMARY_SELECT = { sequence: true, mean: true, spread: true, count: true, size: true, ewma: true, cusumUpper: true, cusumLower: true } as const;

/** A view of positions from .. to (exclusive) of a series, without copying. */
function slice(series: StatisticSeries, from: number, to: number): StatisticSeries {
  return {
    ...series,
    points: series.points.subarray(from, to),
    ucl: series.ucl.subarray(from, to),
    lcl: series.lcl.subarray(from, to),
    sigma: series.sigma.subarray(from, to),
  };
}

interface TDetection {
  readonly statistics: StatisticSeries[];
  /** Position of the first new point in `statistics`. */
  readonly firstNew: number;
  readonly firings: Firing[];
}

/**
 * Evaluates the new points (summaries `fresh`, sequences from `firstSequence`) in their segment, from
 * `recent`: the last RULE_TAIL_LENGTH + 1 stored points, oldest first (the tail and the state before it).
 */
function detect(
  chart: ReturnType<typeof chartTypeOf>,
  segment: TSegment<{ id: number; version: number; appliesFrom: number } & Parameters<typeof chartParametersOf>[1]>,
  rules: readonly RuleId[],
  recent: readonly (TSummary & { sequence: number })[],
  fresh: readonly TSummary[],
  firstSequence: number,
): TDetection {
  const earlier = recent.filter((row) => row.sequence >= segment.from);
  const hasPrevious = earlier.length > 0 && earlier[0]!.sequence > segment.from;
  const tail = hasPrevious ? earlier.slice(1) : earlier;
  const firstIndex = (tail[0]?.sequence ?? firstSequence) - segment.from;
  const statistics = summarySeries(chart, chartParametersOf(chart, segment.limitSet), [...tail, ...fresh], {
    firstIndex,
    previous: hasPrevious ? earlier[0] : undefined,
  });
  const firings: Firing[] = [];
  for (let position = tail.length; position < tail.length + fresh.length; position++) {
    const from = Math.max(0, position - RULE_TAIL_LENGTH);
    for (const series of statistics) {
      firings.push(...firingsAt(slice(series, from, position + 1), firstIndex + from, rules));
    }
  }
  return { statistics, firstNew: tail.length, firings };
}

export async function appendSubgroups(
  db: PrismaClient,
  characteristicId: number,
  inputs: readonly unknown[],
  options: TAppendOptions,
): Promise<TAppendResult> {
  if (options.importBatchId !== undefined && options.source !== "import") {
    throw new Error(`appendSubgroups: an import batch was given for subgroups from the ${options.source}`);
  }
  return db.$transaction(
    async (transaction) => {
      // One read for everything the call needs: settings, limit versions, and the last stored points
      // (the time-order check and the tail of live detection).
      const characteristic = await transaction.characteristic.findUnique({
        where: { id: characteristicId },
        select: {
          chartType: true,
          subgroupSize: true,
          ruleSet: true,
          limitSets: true,
          subgroups: { orderBy: { sequence: "desc" }, take: RULE_TAIL_LENGTH + 1, select: { ...SUMMARY_SELECT, timestamp: true } },
        },
      });
      if (characteristic === null) throw new AppError("not-found", `Characteristic ${characteristicId} does not exist`);
      const chart = chartTypeOf(characteristic.chartType);
      const parsed = validate(chart, characteristic.subgroupSize, inputs, options.sourceKeys);
      const rules = resolveRuleSet(characteristic.ruleSet);
      const known = await storedKeys(transaction, characteristicId, options.sourceKeys ?? []);
      const keyed = parsed.map((input, index) => ({ input, index, key: options.sourceKeys?.[index] }));
      checkReplays(keyed, known);
      const chosen = keyed.filter(({ key }) => key === undefined || !known.has(key));
      const alreadyPresent = parsed.length - chosen.length;
      const recent = characteristic.subgroups.reverse();
      const last = recent.at(-1) ?? null;
      checkTimeOrder(chosen, last);
      const firstSequence = (last?.sequence ?? -1) + 1;
      const summaries = chosen.map(({ input }) => ({ ...summarize(chart, input), ewma: null, cusumUpper: null, cusumLower: null }));

      const segment = limitSegments(characteristic.limitSets).find((candidate) => candidate.from <= firstSequence && candidate.to === Infinity);
      const notes: string[] = [];
      let detection: TDetection | undefined;
      if (chosen.length === 0) notes.push("every subgroup was already stored; nothing was added");
      else if (segment === undefined) notes.push("no limits yet: the subgroups are stored and no rule was evaluated");
      else detection = detect(chart, segment, rules, recent, summaries, firstSequence);

      const state = (key: string, position: number) =>
        detection?.statistics.find((series) => series.key === key)?.points[detection.firstNew + position] ?? null;
      const created = await transaction.subgroup.createManyAndReturn({
        data: chosen.map(({ input, key }, position) => ({
          characteristicId,
          sequence: firstSequence + position,
          timestamp: new Date(input.timestamp),
          sourceKey: key ?? null,
          importBatchId: options.importBatchId ?? null,
          ...summaries[position]!,
          ewma: state("ewma", position),
          cusumUpper: state("cusum-upper", position),
          cusumLower: state("cusum-lower", position),
          createdAt: options.now,
        })),
        select: { id: true, sequence: true },
      });
      const idOf = new Map(created.map((row) => [row.sequence, row.id]));
      const measurements = chosen.flatMap(({ input }, position) =>
        (input.values ?? []).map((value, order) => ({ subgroupId: idOf.get(firstSequence + position)!, position: order, value })),
      );
      const tags = chosen.flatMap(({ input }, position) =>
        Object.entries(input.tags ?? {}).map(([key, value]) => ({ subgroupId: idOf.get(firstSequence + position)!, key, value })),
      );
      if (measurements.length > 0) await transaction.measurement.createMany({ data: measurements });
      if (tags.length > 0) await transaction.subgroupTag.createMany({ data: tags });

      const touched =
        detection === undefined || segment === undefined
          ? []
          : await storeFirings(transaction, characteristicId, segment.limitSet.id, segment.from, detection.firings, options.now);
      const lastSequence = firstSequence + chosen.length - 1;
      const signals =
        touched.length === 0 || segment === undefined
          ? touched
          : await readLivePatterns(
              transaction,
              characteristicId,
              chart,
              segment.limitSet,
              segment.from,
              lastSequence,
              touched,
              await segmentSignalsFrom(transaction, characteristicId, segment.limitSet.id, lastSequence + 1 - LIVE_PATTERN_WINDOW),
            );
      const firedAt = new Map<number, RuleId[]>();
      for (const firing of detection?.firings ?? []) {
        const sequence = segment!.from + firing.index;
        const rulesHere = firedAt.get(sequence) ?? [];
        if (!rulesHere.includes(firing.rule)) rulesHere.push(firing.rule);
        firedAt.set(sequence, rulesHere);
      }
      const stored = chosen.map(({ input }, position): TStoredSubgroup => {
        const sequence = firstSequence + position;
        return {
          id: idOf.get(sequence)!,
          sequence,
          timestamp: new Date(input.timestamp),
          values: input.values ?? null,
          count: summaries[position]!.count,
          size: summaries[position]!.size,
          tags: input.tags ?? {},
          mean: summaries[position]!.mean,
          spread: summaries[position]!.spread,
          firedRules: firedAt.get(sequence) ?? [],
        };
      });
      let position = 0;
      const outcomes = keyed.map(({ key }): TAppendOutcome => {
        const present = key === undefined ? undefined : known.get(key);
        if (present !== undefined) return { status: "already-present", id: present.id, sequence: present.sequence };
        const { id, sequence } = stored[position++]!;
        return { status: "stored", id, sequence };
      });
      return {
        stored,
        signals,
        alreadyPresent,
        outcomes,
        limits: segment === undefined ? null : { limitSetId: segment.limitSet.id, version: segment.limitSet.version },
        notes,
      };
    },
    // A thousand subgroups with their measurements take seconds on a loaded machine; Prisma's default is 5 s.
    { timeout: APPEND_TIMEOUT_MS, maxWait: APPEND_TIMEOUT_MS },
  );
}

/**
 * Callers' keys are stored as "api:<key>". Import keys all begin "csv:<time in epoch ms>", and the import
 * looks a key up only for a subgroup no later than the last stored one (createSubgroupWriter,
 * src/imports/write.ts): a caller's key equal to a later import key would pass that check and then break
 * the import on the unique (characteristicId, sourceKey) index. The prefix keeps the two sets of keys
 * apart, so whatever text a caller chooses cannot equal an import key.
 */
const CALLER_KEY_PREFIX = "api:";

/** What became of one posted subgroup, with the caller's key (null when it had none). */
export interface TPostedOutcome extends TAppendOutcome {
  readonly key: string | null;
}

/**
 * Appends subgroups posted through the API, each with an optional key of the caller's: a subgroup whose
 * key is already stored on the characteristic is not stored again (a retried post), and the outcome of
 * each posted subgroup says which happened. Subgroups without a key are always stored.
 */
export async function appendPostedSubgroups(
  db: PrismaClient,
  characteristicId: number,
  posted: readonly TPostedSubgroup[],
  now: Date,
): Promise<TAppendResult & { readonly outcomes: TPostedOutcome[] }> {
  const subgroups: TSubgroupInput[] = [];
  const sourceKeys: (string | undefined)[] = [];
  for (const { key, ...subgroup } of posted) {
    subgroups.push(subgroup);
    sourceKeys.push(key === undefined ? undefined : `${CALLER_KEY_PREFIX}${key}`);
  }
  const result = await appendSubgroups(db, characteristicId, subgroups, { source: "api", now, sourceKeys });
  return { ...result, outcomes: result.outcomes.map((outcome, index) => ({ ...outcome, key: posted[index]!.key ?? null })) };
}

/**
 * Merges firings (segment indices) into the signals of the limit set that could still continue, then
 * writes the extended and the new ones. A signal can continue only if its end touches a firing's
 * window, so only those are read.
 */
async function storeFirings(
  transaction: Prisma.TransactionClient,
  characteristicId: number,
  limitSetId: number,
  segmentFrom: number,
  firings: readonly Firing[],
  now: Date,
): Promise<TSignalView[]> {
  if (firings.length === 0) return [];
  const earliest = segmentFrom + Math.min(...firings.map((firing) => firing.windowStart)) - 1;
  const openRows = await transaction.signal.findMany({
    where: { characteristicId, limitSetId, endSequence: { gte: earliest } },
    select: { id: true, rule: true, statistic: true, startSequence: true, endSequence: true, firing: true, side: true },
  });
  const toIndex = (sequence: number) => sequence - segmentFrom;
  const open: Signal[] = openRows.map((row) => ({
    rule: row.rule as RuleId,
    chart: row.statistic as Signal["chart"],
    start: toIndex(row.startSequence),
    end: toIndex(row.endSequence),
    firing: (JSON.parse(row.firing) as number[]).map(toIndex),
    ...(row.side === "above" || row.side === "below" ? { side: row.side } : {}),
  }));
  const touched: number[] = [];
  for (const signal of mergeFirings(firings, open)) {
    const firing = JSON.stringify(signal.firing.map((index) => index + segmentFrom));
    const existing = openRows.find(
      (row) => row.rule === signal.rule && row.statistic === signal.chart && row.startSequence === signal.start + segmentFrom,
    );
    if (existing !== undefined) {
      if (existing.firing === firing) continue;
      await transaction.signal.update({ where: { id: existing.id }, data: { endSequence: signal.end + segmentFrom, firing, updatedAt: now } });
      touched.push(existing.id);
    } else {
      const row = await transaction.signal.create({
        data: {
          characteristicId,
          limitSetId,
          rule: signal.rule,
          statistic: signal.chart,
          startSequence: signal.start + segmentFrom,
          endSequence: signal.end + segmentFrom,
          firing,
          side: signal.side ?? null,
          pattern: null,
          detectedAt: now,
          updatedAt: now,
        },
        select: { id: true },
      });
      touched.push(row.id);
    }
  }
  const rows = await transaction.signal.findMany({ where: { id: { in: touched } }, orderBy: [{ startSequence: "asc" }, { id: "asc" }], select: SIGNAL_VIEW });
  return rows.map(toSignalView);
}

interface TKnownSubgroup {
  readonly id: number;
  readonly sequence: number;
  readonly timestamp: Date;
}

/**
 * Refuses an input whose key is already stored for a reading at another time: a key names one reading, so
 * the line system has used it twice (a counter reset, say), and skipping the input as a replay would lose
 * a reading without a word. Only the time is compared: a replay sends the reading as it was, while the
 * stored values may since have been corrected.
 */
function checkReplays(keyed: readonly { input: TSubgroupInput; index: number; key: string | undefined }[], known: ReadonlyMap<string, TKnownSubgroup>): void {
  const issues: TIssue[] = [];
  for (const { input, index, key } of keyed) {
    const stored = key === undefined ? undefined : known.get(key);
    if (stored === undefined || stored.timestamp.getTime() === new Date(input.timestamp).getTime()) continue;
    issues.push({
      index,
      path: `subgroups.${index}.key`,
      message: `is already the key of the subgroup at ${stored.timestamp.toISOString()} (sequence ${stored.sequence}), not of one at ${input.timestamp}; a key names one reading`,
    });
  }
  if (issues.length > 0) {
    throw new AppError("conflict", `${issues.length} of ${keyed.length} subgroups carry the key of another stored reading; nothing was stored`, issues);
  }
}

/** Keys bound per query: well under SQLite's limit on bound parameters. */
const KEYS_PER_QUERY = 500;

/** The subgroups already stored for the characteristic under any of `keys`, by key. */
async function storedKeys(
  transaction: Prisma.TransactionClient,
  characteristicId: number,
  sourceKeys: readonly (string | undefined)[],
): Promise<Map<string, TKnownSubgroup>> {
  const keys = sourceKeys.filter((key) => key !== undefined);
  const known = new Map<string, TKnownSubgroup>();
  for (let first = 0; first < keys.length; first += KEYS_PER_QUERY) {
    const rows = await transaction.subgroup.findMany({
      where: { characteristicId, sourceKey: { in: keys.slice(first, first + KEYS_PER_QUERY) } },
      select: { sourceKey: true, id: true, sequence: true, timestamp: true },
    });
    for (const { sourceKey, ...subgroup } of rows) known.set(sourceKey!, subgroup);
  }
  return known;
}

/** The signals of a limit set that end at or after `from`, for live pattern reading. */
async function segmentSignalsFrom(transaction: Prisma.TransactionClient, characteristicId: number, limitSetId: number, from: number) {
  const rows = await transaction.signal.findMany({
    where: { characteristicId, limitSetId, endSequence: { gte: from } },
    orderBy: [{ startSequence: "asc" }, { id: "asc" }],
    select: SIGNAL_VIEW,
  });
  return rows.map(toSignalView);
}
