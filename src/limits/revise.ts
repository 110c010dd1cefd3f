/**
 * A new limit version: Phase I parameters estimated with the engine (`estimateParameters`) from a
 * baseline window of stored subgroups, with excluded subgroups left out (each with its reason), then
 * frozen. Version numbers count up per characteristic; the new version applies from its baseline start
 * (see segments.ts), so the points from there on are judged against it and the stored signals are
 * re-evaluated in the same transaction, recorded with trigger "limit-revision".
 *
 * Centre: the baseline mean (Phase I practice, Montgomery §6.2), except on EWMA and CUSUM charts with a
 * target, which watch departures from that target (common practice). EWMA and CUSUM use the engine's
 * default designs (λ = 0.2, L = 3; k = 0.5, h = 5).
 */
import { ZLimitRevisionInput } from "@/shared/intake";
import type { z } from "zod";
import { chartTypeOf } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import { AppError, parseInput } from "@/src/errors";
import { reevaluateWithin, REEVALUATION_TIMEOUT_MS } from "@/src/signals/reevaluate";
import { DEFAULT_CUSUM_DESIGN, DEFAULT_EWMA_DESIGN, estimateParameters, MINIMUM_BASELINE_SUBGROUPS } from "@/src/spc/charts";
import { SpcInputError, type ChartParameters } from "@/src/spc/types";
import { readChartData } from "@/src/subgroups/chart-data";
import { limitSetColumnsOf } from "./parameters";
import { limitSetsFor } from "./query";

export type TLimitRevisionFields = z.input<typeof ZLimitRevisionInput>;

/** Why frozen parameters would make a useless chart, or null when they are usable. */
function unusable(parameters: ChartParameters): string | null {
  if (parameters.chart === "p" || parameters.chart === "np" || parameters.chart === "c" || parameters.chart === "u") {
    if (parameters.center === 0) return "the baseline counts nothing, so every later count would be a signal";
    if ((parameters.chart === "p" || parameters.chart === "np") && parameters.center === 1) {
      return "every item in the baseline is defective";
    }
    return null;
  }
  if (!(parameters.sigma > 0)) return "the baseline shows no variation, so limits would have no width";
  return null;
}

export async function reviseLimits(db: PrismaClient, characteristicId: number, input: TLimitRevisionFields, now: Date) {
  const revision = parseInput(ZLimitRevisionInput, input, "limit revision");
  const characteristic = await db.characteristic.findUnique({
    where: { id: characteristicId },
    select: { chartType: true, subgroupSize: true, target: true },
  });
  if (characteristic === null) throw new AppError("not-found", `Characteristic ${characteristicId} does not exist`);
  const chart = chartTypeOf(characteristic.chartType);
  const { baselineStart, baselineEnd, exclusions } = revision;

  const excluded = exclusions.map((exclusion) => exclusion.sequence);
  const repeated = excluded.findIndex((sequence, index) => excluded.indexOf(sequence) !== index);
  if (repeated >= 0) {
    throw new AppError("invalid-input", `Subgroup ${excluded[repeated]} is excluded twice`, [
      { path: `exclusions.${repeated}.sequence`, message: "is already excluded" },
    ]);
  }
  const stored = await readChartData(db, characteristicId, chart, baselineStart, baselineEnd);
  const found = stored?.sequences.length ?? 0;
  if (stored === undefined || found < baselineEnd - baselineStart) {
    throw new AppError(
      "refused",
      `The baseline ${baselineStart}–${baselineEnd - 1} needs ${baselineEnd - baselineStart} stored subgroups; ${found} are stored there`,
      [{ path: "baselineEnd", message: "is beyond the stored subgroups" }],
    );
  }
  const used = baselineEnd - baselineStart - excluded.length;
  if (used < MINIMUM_BASELINE_SUBGROUPS) {
    throw new AppError(
      "refused",
      `The baseline keeps ${used} subgroup(s) after exclusions; at least ${MINIMUM_BASELINE_SUBGROUPS} are needed to estimate limits`,
      [{ path: "exclusions", message: "leave too few subgroups" }],
    );
  }
  let parameters: ChartParameters;
  try {
    parameters = estimateParameters(chart, stored.data, {
      baseline: { exclude: excluded.map((sequence) => sequence - baselineStart) },
      subgroupSize: chart === "np" ? undefined : characteristic.subgroupSize,
      ewma: chart === "ewma" ? DEFAULT_EWMA_DESIGN : undefined,
      cusum: chart === "cusum" ? DEFAULT_CUSUM_DESIGN : undefined,
      target: (chart === "ewma" || chart === "cusum") && characteristic.target !== null ? characteristic.target : undefined,
    });
  } catch (error) {
    if (error instanceof SpcInputError) {
      throw new AppError("refused", `Limits cannot be estimated from this baseline: ${error.message}`);
    }
    throw error;
  }
  const problem = unusable(parameters);
  if (problem !== null) throw new AppError("refused", `Limits from this baseline would not work: ${problem}`);

  const created = await db.$transaction(
    async (transaction) => {
      const last = await transaction.limitSet.findFirst({ where: { characteristicId }, orderBy: { version: "desc" }, select: { version: true } });
      const limitSet = await transaction.limitSet.create({
      data: {
        characteristicId,
        version: (last?.version ?? 0) + 1,
        ...limitSetColumnsOf(parameters, baselineStart),
        appliesFrom: baselineStart,
        reason: revision.reason,
        approvedBy: revision.approvedBy,
        createdAt: now,
        exclusions: { create: exclusions.map(({ sequence, reason }) => ({ sequence, reason })) },
      },
      select: { id: true },
    });
      await reevaluateWithin(transaction, characteristicId, {
        trigger: "limit-revision",
        reason: revision.reason,
        requestedBy: revision.approvedBy,
        now,
      });
      return limitSet;
    },
    { timeout: REEVALUATION_TIMEOUT_MS, maxWait: REEVALUATION_TIMEOUT_MS },
  );
  const limitSets = await limitSetsFor(db, characteristicId);
  const limitSet = limitSets.find((candidate) => candidate.id === created.id);
  if (limitSet === undefined) throw new Error(`Limit set ${created.id} vanished after it was created`);
  return limitSet;
}
