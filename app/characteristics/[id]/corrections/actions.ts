"use server";
// Correcting one recorded value: the form names the point by its chart sequence and (for measured values)
// its 1-based position; the shared schema checks the new value, reason and name; the domain keeps the
// original on record and re-evaluates the signals. The answer is the result in words, or the field problems.
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { describeIssues, ZCorrectionInput } from "@/shared/intake";
import { getCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { correctValue, correctionsFor, type TCorrectedField } from "@/src/subgroups";
import { enteredValues, numberField, text, type TFormState } from "../../setup-fields";

const ZSequence = z.number({ error: "must be a whole number" }).int({ error: "must be a whole number" }).nonnegative({ error: "must not be negative" });
const ZPosition = z.number({ error: "must be a whole number" }).int({ error: "must be a whole number" }).positive({ error: "must be 1 or more" });
const ZAttributesField = z.enum(["count", "size", "units"], { error: "must be count, size or units" });

export async function correctFromForm(characteristicId: number, _previous: TFormState, form: FormData): Promise<TFormState> {
  const characteristic = await getCharacteristic(prisma, characteristicId);
  const variables = VARIABLES_CHART_TYPES.includes(characteristic.chartType);
  const sequence = ZSequence.safeParse(numberField(form, "sequence"));
  // Measured values are named 1-based in the form; the record counts positions from 0.
  const position = variables ? ZPosition.safeParse(numberField(form, "position") ?? (characteristic.subgroupSize === 1 ? 1 : undefined)) : null;
  const field = variables ? null : ZAttributesField.safeParse(text(form, "field"));
  const correction = ZCorrectionInput.safeParse({
    newValue: numberField(form, "newValue"),
    reason: text(form, "reason") ?? "",
    correctedBy: text(form, "correctedBy") ?? "",
  });
  const issues = [
    ...(sequence.success ? [] : [{ path: "sequence", message: sequence.error.issues[0]?.message ?? "is not valid" }]),
    ...(position === null || position.success ? [] : [{ path: "position", message: position.error.issues[0]?.message ?? "is not valid" }]),
    ...(field === null || field.success ? [] : [{ path: "field", message: field.error.issues[0]?.message ?? "is not valid" }]),
    ...(correction.success ? [] : describeIssues(correction.error)),
  ];
  const entered = enteredValues(form);
  if (!sequence.success || !correction.success || issues.length > 0) return { ok: false, issues, entered };

  const subgroup = await prisma.subgroup.findUnique({
    where: { characteristicId_sequence: { characteristicId, sequence: sequence.data } },
    select: { id: true },
  });
  if (subgroup === null) return { ok: false, issues: [{ path: "sequence", message: `${sequence.data} is not on this chart` }], entered };
  const target: { subgroupId: number; field: TCorrectedField; position?: number } =
    position?.success === true ? { subgroupId: subgroup.id, field: "value", position: position.data - 1 } : { subgroupId: subgroup.id, field: field?.data ?? "count" };
  try {
    const result = await correctValue(prisma, target, correction.data, new Date());
    // The chart and this page's list both show the corrected record.
    revalidatePath(`/characteristics/${characteristicId}`);
    revalidatePath(`/characteristics/${characteristicId}/corrections`);
    const { originalValue, correctedValue, subgroupId, measurementId } = result.correction;
    // The value as first recorded: what the earliest correction of the same value replaced.
    const recorded = (await correctionsFor(prisma, characteristicId)).find(
      (earlier) => earlier.subgroupId === subgroupId && earlier.field === target.field && earlier.measurementId === measurementId,
    )?.originalValue ?? originalValue;
    const what = target.field === "value" ? `value ${(target.position ?? 0) + 1}` : target.field;
    const { signalsBefore, signalsAfter } = result.evaluation;
    return {
      ok: true,
      message: `Subgroup ${result.sequence}, ${what}: ${originalValue} → ${correctedValue} (recorded ${recorded}). Signals re-evaluated: ${signalsBefore} before, ${signalsAfter} after.`,
    };
  } catch (error) {
    if (!isAppError(error)) throw error;
    // The domain names a measured value's position from 0; the form shows it from 1.
    const domainIssues = error.issues.map((issue) => ({
      path: issue.path,
      message: issue.path === "position" ? `${position?.data ?? ""} is not a position in subgroup ${sequence.data}` : issue.message,
    }));
    return { ok: false, issues: domainIssues.length > 0 ? domainIssues : [{ path: "", message: error.message }], entered };
  }
}
