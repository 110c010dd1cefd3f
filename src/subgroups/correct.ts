/**
 * Correcting a recording mistake. The measurement (or the subgroup's count, sample size or inspection
 * units) takes the corrected value; a Correction row keeps the value it replaced with who, when and why
 * (the first correction of a value keeps the value as recorded). The cached summaries are recomputed and
 * the characteristic's signals re-evaluated in the same transaction, recorded with trigger "correction".
 */
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { subgroupSchemaFor, ZCorrectionInput, type TSubgroupInput } from "@/shared/intake";
import type { z } from "zod";
import { chartTypeOf } from "@/src/characteristics/setup";
import type { PrismaClient } from "@/src/db/connect";
import { AppError, parseInput } from "@/src/errors";
import { reevaluateWithin, REEVALUATION_TIMEOUT_MS } from "@/src/signals/reevaluate";
import { summarize } from "./summaries";

export type TCorrectionFields = z.input<typeof ZCorrectionInput>;
export type TCorrectedField = "value" | "count" | "size" | "units";

export interface TCorrectionTarget {
  readonly subgroupId: number;
  /** Position of the measurement in its subgroup (field "value"). */
  readonly position?: number;
  readonly field: TCorrectedField;
}

function refuseField(message: string, path = "field"): never {
  throw new AppError("invalid-input", message, [{ path, message }]);
}

export async function correctValue(db: PrismaClient, target: TCorrectionTarget, input: TCorrectionFields, now: Date) {
  const correction = parseInput(ZCorrectionInput, input, "correction");
  const subgroup = await db.subgroup.findUnique({
    where: { id: target.subgroupId },
    select: {
      id: true,
      characteristicId: true,
      sequence: true,
      timestamp: true,
      count: true,
      size: true,
      characteristic: { select: { chartType: true, subgroupSize: true } },
      measurements: { orderBy: { position: "asc" }, select: { id: true, position: true, value: true } },
    },
  });
  if (subgroup === null) throw new AppError("not-found", `Subgroup ${target.subgroupId} does not exist`);
  const chart = chartTypeOf(subgroup.characteristic.chartType);
  const variables = VARIABLES_CHART_TYPES.includes(chart);

  // The subgroup as it would read after the correction, checked by the same schema as new subgroups.
  const current: TSubgroupInput = variables
    ? { timestamp: subgroup.timestamp.toISOString(), values: subgroup.measurements.map((measurement) => measurement.value) }
    : {
        timestamp: subgroup.timestamp.toISOString(),
        count: subgroup.count ?? undefined,
        ...(chart === "u" ? { units: subgroup.size ?? undefined } : chart === "c" ? {} : { size: subgroup.size ?? undefined }),
      };
  let original: number;
  let measurementId: number | null = null;
  let corrected: TSubgroupInput;
  if (target.field === "value") {
    if (!variables) refuseField(`A ${chart} chart has counts, not measured values: correct "count", "size" or "units"`);
    const measurement = subgroup.measurements.find((candidate) => candidate.position === target.position);
    if (measurement === undefined) {
      refuseField(`Subgroup ${subgroup.sequence} has no value at position ${target.position ?? "(none given)"}`, "position");
    }
    original = measurement.value;
    measurementId = measurement.id;
    corrected = { ...current, values: current.values!.map((value, position) => (position === target.position ? correction.newValue : value)) };
  } else {
    if (variables) refuseField(`A ${chart} chart has measured values: correct "value" at a position`);
    const allowed = chart === "u" ? ["count", "units"] : chart === "c" ? ["count"] : ["count", "size"];
    if (!allowed.includes(target.field)) refuseField(`A ${chart} chart records ${allowed.join(" and ")}, not ${target.field}`);
    original = (target.field === "count" ? subgroup.count : subgroup.size) ?? Number.NaN;
    corrected = { ...current, [target.field]: correction.newValue };
  }
  if (original === correction.newValue) {
    throw new AppError("refused", `The ${target.field} is already ${original}; there is nothing to correct`, [
      { path: "newValue", message: "equals the current value" },
    ]);
  }
  const checked = subgroupSchemaFor(chart, subgroup.characteristic.subgroupSize).safeParse(corrected);
  if (!checked.success) {
    const issues = checked.error.issues.map((issue) => ({ path: "newValue", message: `${issue.path.join(".")} ${issue.message}` }));
    throw new AppError("invalid-input", `The corrected subgroup is not valid: ${issues.map((issue) => issue.message).join("; ")}`, issues);
  }
  const summary = summarize(chart, checked.data);

  return db.$transaction(
    async (transaction) => {
      const row = await transaction.correction.create({
        data: {
          subgroupId: subgroup.id,
          measurementId,
          field: target.field,
          originalValue: original,
          correctedValue: correction.newValue,
          reason: correction.reason,
          correctedBy: correction.correctedBy,
          correctedAt: now,
        },
      });
      if (measurementId !== null) await transaction.measurement.update({ where: { id: measurementId }, data: { value: correction.newValue } });
      await transaction.subgroup.update({ where: { id: subgroup.id }, data: summary });
      const evaluation = await reevaluateWithin(transaction, subgroup.characteristicId, {
        trigger: "correction",
        reason: `subgroup ${subgroup.sequence}, ${target.field}${target.field === "value" ? ` ${target.position}` : ""}: ${original} → ${correction.newValue}: ${correction.reason}`,
        requestedBy: correction.correctedBy,
        now,
      });
      return { correction: row, sequence: subgroup.sequence, summary, evaluation };
    },
    { timeout: REEVALUATION_TIMEOUT_MS, maxWait: REEVALUATION_TIMEOUT_MS },
  );
}

/** Every correction of a characteristic, oldest first, with the subgroup's sequence (for the chart). */
export async function correctionsFor(db: PrismaClient, characteristicId: number) {
  const rows = await db.correction.findMany({
    where: { subgroup: { characteristicId } },
    orderBy: [{ correctedAt: "asc" }, { id: "asc" }],
    include: { subgroup: { select: { sequence: true } }, measurement: { select: { position: true } } },
  });
  return rows.map(({ subgroup, measurement, ...correction }) => ({
    ...correction,
    sequence: subgroup.sequence,
    position: measurement?.position ?? null,
  }));
}
