"use server";
// Settings of one characteristic: its setup, and a new limit version from a baseline. Both parse with the
// shared schemas and report problems by field.
import { revalidatePath } from "next/cache";
import { describeIssues, ZCharacteristicInput, ZLimitRevisionInput } from "@/shared/intake";
import { updateCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { reviseLimits } from "@/src/limits";
import { characteristicInputOf, enteredValues, numberField, text, type TFormIssues, type TFormState } from "../../setup-fields";

function refused(error: unknown, form: FormData): TFormState {
  if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }], entered: enteredValues(form) };
  throw error;
}

export async function updateFromForm(characteristicId: number, _previous: TFormState, form: FormData): Promise<TFormState> {
  const parsed = ZCharacteristicInput.safeParse(characteristicInputOf(form));
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error), entered: enteredValues(form) };
  try {
    await updateCharacteristic(prisma, characteristicId, parsed.data, { now: new Date(), changedBy: "characteristic settings" });
  } catch (error) {
    return refused(error, form);
  }
  revalidatePath(`/characteristics/${characteristicId}`);
  return { ok: true, message: "Settings saved." };
}

/** Exclusion lines "sequence: reason", one per line; a line that does not read so is named. */
function exclusionsOf(form: FormData): { exclusions: { sequence: number | string; reason: string }[]; issues: TFormIssues } {
  const lines = String(form.get("exclusions") ?? "")
    .split(/\r?\n/)
    .map((line) => line.trim());
  const exclusions: { sequence: number | string; reason: string }[] = [];
  const issues: { path: string; message: string }[] = [];
  lines.forEach((line, index) => {
    if (line === "") return;
    const match = /^(\d+)\s*[:\-–]\s*(.*)$/.exec(line);
    if (match === null) issues.push({ path: "exclusions", message: `line ${index + 1} must read "subgroup: reason", e.g. "17: wrong mould inserted"` });
    else exclusions.push({ sequence: Number(match[1]), reason: match[2] ?? "" });
  });
  return { exclusions, issues };
}

export async function reviseFromForm(characteristicId: number, _previous: TFormState, form: FormData): Promise<TFormState> {
  const { exclusions, issues: lineIssues } = exclusionsOf(form);
  const parsed = ZLimitRevisionInput.safeParse({
    baselineStart: numberField(form, "baselineStart"),
    // The form asks for the last subgroup of the baseline; the schema's end is exclusive.
    baselineEnd: ((last) => (typeof last === "number" ? last + 1 : last))(numberField(form, "baselineLast")),
    exclusions,
    reason: text(form, "reason") ?? "",
    approvedBy: text(form, "approvedBy") ?? "",
  });
  const schemaIssues = parsed.success
    ? []
    : describeIssues(parsed.error).map((issue) => {
        const exclusion = /^exclusions\.(\d+)\.(\w+)$/.exec(issue.path);
        if (exclusion !== null) return { path: "exclusions", message: `entry ${Number(exclusion[1]) + 1}: ${exclusion[2]} ${issue.message}` };
        return issue.path === "baselineEnd" ? { ...issue, path: "baselineLast" } : issue;
      });
  if (!parsed.success || lineIssues.length > 0) return { ok: false, issues: [...lineIssues, ...schemaIssues], entered: enteredValues(form) };
  try {
    const limitSet = await reviseLimits(prisma, characteristicId, parsed.data, new Date());
    revalidatePath(`/characteristics/${characteristicId}`);
    return { ok: true, message: `Limit version ${limitSet.version} saved; signals re-evaluated.` };
  } catch (error) {
    return refused(error, form);
  }
}
