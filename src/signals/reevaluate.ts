/**
 * Batch evaluation of a characteristic's whole history, replacing its stored signals in one transaction
 * and recording the re-evaluation (who, when, why, signal counts before and after).
 *
 * Each limit segment (src/limits/segments.ts) is evaluated as the `analyze` command would evaluate it:
 * the measurements read back as ChartData, `evaluateChart` with the frozen parameters, `evaluateRules`
 * with the characteristic's rule set on every plotted statistic, and `readPatterns` for the pattern of
 * each signal. A signal found again (same limit set, rule, statistic and start) keeps its detection time
 * and triage status. On EWMA and CUSUM charts the cached smoothed state of every subgroup is rewritten
 * (live detection continues from it).
 */
import type { Prisma } from "@/src/db/generated/client";
import type { PrismaClient } from "@/src/db/connect";
import { chartTypeOf } from "@/src/characteristics/setup";
import { AppError } from "@/src/errors";
import { chartParametersOf } from "@/src/limits/parameters";
import { limitSegments } from "@/src/limits/segments";
import { evaluateChart } from "@/src/spc/charts";
import { readPatterns } from "@/src/spc/patterns";
import { evaluateRules, resolveRuleSet } from "@/src/spc/rules";
import { SpcInputError, type Signal } from "@/src/spc/types";
import { readChartData } from "@/src/subgroups/chart-data";
import { writeSmoothedState, clearSmoothedState } from "@/src/subgroups/smoothed-state";
import { inSequences, patternFor } from "./rows";

export const SIGNAL_TRIGGERS = ["limit-revision", "correction", "request", "import"] as const;
export type TSignalTrigger = (typeof SIGNAL_TRIGGERS)[number];

export interface TReevaluationRequest {
  readonly trigger: TSignalTrigger;
  readonly reason: string;
  readonly requestedBy: string;
  readonly now: Date;
}

export interface TReevaluationOutcome {
  readonly evaluationId: number;
  readonly signalsBefore: number;
  readonly signalsAfter: number;
}

/** Long histories take seconds to read back; Prisma's 5 s default would cut them short. */
export const REEVALUATION_TIMEOUT_MS = 300_000;

export async function reevaluateSignals(
  db: PrismaClient,
  characteristicId: number,
  request: TReevaluationRequest,
): Promise<TReevaluationOutcome> {
  return db.$transaction((transaction) => reevaluateWithin(transaction, characteristicId, request), {
    timeout: REEVALUATION_TIMEOUT_MS,
    maxWait: REEVALUATION_TIMEOUT_MS,
  });
}

/** The same inside a caller's transaction (a limit revision or a correction and its re-evaluation commit together). */
export async function reevaluateWithin(
  transaction: Prisma.TransactionClient,
  characteristicId: number,
  request: TReevaluationRequest,
): Promise<TReevaluationOutcome> {
  const characteristic = await transaction.characteristic.findUnique({
    where: { id: characteristicId },
    select: { chartType: true, ruleSet: true, limitSets: { include: { exclusions: { select: { sequence: true } } } } },
  });
  if (characteristic === null) throw new AppError("not-found", `Characteristic ${characteristicId} does not exist`);
  const chart = chartTypeOf(characteristic.chartType);
  const rules = resolveRuleSet(characteristic.ruleSet);
  const segments = limitSegments(characteristic.limitSets);
  const previous = await transaction.signal.findMany({
    where: { characteristicId },
    select: { limitSetId: true, rule: true, statistic: true, startSequence: true, detectedAt: true, status: true },
  });
  const keyOf = (limitSetId: number, rule: string, statistic: string, start: number) => `${limitSetId}/${rule}/${statistic}/${start}`;
  const earlier = new Map(previous.map((row) => [keyOf(row.limitSetId, row.rule, row.statistic, row.startSequence), row]));

  const rows: Prisma.SignalCreateManyInput[] = [];
  const smoothed = chart === "ewma" || chart === "cusum";
  if (smoothed) await clearSmoothedState(transaction, characteristicId);
  for (const segment of segments) {
    const stored = await readChartData(transaction, characteristicId, chart, segment.from, segment.to);
    if (stored === undefined) continue;
    const parameters = chartParametersOf(chart, segment.limitSet, segment.limitSet.exclusions.map((exclusion) => exclusion.sequence));
    const result = evaluateChart(stored.data, parameters);
    const signals: Signal[] = result.statistics.flatMap((series) => evaluateRules(series, rules).signals);
    const patterns = readSegmentPatterns(() => readPatterns(result, signals, stored.data));
    for (const signal of signals) {
      const placed = inSequences(signal, segment.from);
      const before = earlier.get(keyOf(segment.limitSet.id, placed.rule, placed.chart, placed.start));
      rows.push({
        characteristicId,
        limitSetId: segment.limitSet.id,
        rule: placed.rule,
        statistic: placed.chart,
        startSequence: placed.start,
        endSequence: placed.end,
        firing: JSON.stringify(placed.firing),
        side: placed.side ?? null,
        pattern: patternFor(signal, patterns),
        status: before?.status ?? "new",
        detectedAt: before?.detectedAt ?? request.now,
        updatedAt: request.now,
      });
    }
    if (smoothed) await writeSmoothedState(transaction, characteristicId, segment.from, result.statistics);
  }
  await transaction.signal.deleteMany({ where: { characteristicId } });
  await transaction.signal.createMany({ data: rows });
  const inForce = segments.at(-1)?.limitSet.id ?? null;
  const evaluation = await transaction.signalEvaluation.create({
    data: {
      characteristicId,
      limitSetId: inForce,
      trigger: request.trigger,
      reason: request.reason,
      requestedBy: request.requestedBy,
      at: request.now,
      signalsBefore: previous.length,
      signalsAfter: rows.length,
    },
    select: { id: true },
  });
  return { evaluationId: evaluation.id, signalsBefore: previous.length, signalsAfter: rows.length };
}

/** Patterns are an aid to reading: data the pattern reader cannot use leave signals without one. */
function readSegmentPatterns(read: () => ReturnType<typeof readPatterns>): ReturnType<typeof readPatterns> {
  try {
    return read();
  } catch (error) {
    if (error instanceof SpcInputError) return [];
    throw error;
  }
}
