"use server";
// Recording a process event: parse with the shared event schema, store it, report field problems.
import { revalidatePath } from "next/cache";
import { describeIssues, ZEventInput } from "@/shared/intake";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { recordEvent } from "@/src/events";
import { enteredValues, numberField, text, utcTimeField, type TFormState } from "../../../characteristics/setup-fields";

export async function addEvent(processId: number, _previous: TFormState, form: FormData): Promise<TFormState> {
  const parsed = ZEventInput.safeParse({
    occurredAt: utcTimeField(form, "occurredAt"),
    kind: text(form, "kind"),
    causeCategory: text(form, "causeCategory"),
    description: text(form, "description"),
    value: numberField(form, "value"),
    unit: text(form, "unit"),
  });
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error), entered: enteredValues(form) };
  try {
    const event = await recordEvent(prisma, processId, parsed.data, new Date());
    revalidatePath(`/processes/${processId}/events`);
    return { ok: true, message: `Event recorded (${event.kind}, ${event.occurredAt.toISOString()}).` };
  } catch (error) {
    if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }], entered: enteredValues(form) };
    throw error;
  }
}
