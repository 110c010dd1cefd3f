"use server";
// Recording a process event: parse with the shared event schema, store it, report field problems.
import { revalidatePath } from "next/cache";
import { describeIssues, ZEventInput } from "@/shared/intake";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { recordEvent } from "@/src/events";
import { numberField, text, utcTimeField } from "../../../characteristics/setup-fields";

export type TEventFormState = { readonly ok: null } | { readonly ok: true; readonly id: number } | { readonly ok: false; readonly issues: readonly { path: string; message: string }[] };

export async function addEvent(processId: number, _previous: TEventFormState, form: FormData): Promise<TEventFormState> {
  const parsed = ZEventInput.safeParse({
    occurredAt: utcTimeField(form, "occurredAt"),
    kind: text(form, "kind"),
    causeCategory: text(form, "causeCategory"),
    description: text(form, "description"),
    value: numberField(form, "value"),
    unit: text(form, "unit"),
  });
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error) };
  try {
    const event = await recordEvent(prisma, processId, parsed.data, new Date());
    revalidatePath(`/processes/${processId}/events`);
    return { ok: true, id: event.id };
  } catch (error) {
    if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }] };
    throw error;
  }
}
