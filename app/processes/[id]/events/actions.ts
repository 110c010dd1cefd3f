"use server";
// Recording a process event: parse with the shared event schema, store it, report field problems.
import { revalidatePath } from "next/cache";
import { describeIssues, ZEventInput } from "@/shared/intake";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { recordEvent } from "@/src/events";

export type TEventFormState = { readonly ok: null } | { readonly ok: true; readonly id: number } | { readonly ok: false; readonly issues: readonly { path: string; message: string }[] };

function text(form: FormData, name: string): string | undefined {
  const value = String(form.get(name) ?? "").trim();
  return value === "" ? undefined : value;
}

export async function addEvent(processId: number, _previous: TEventFormState, form: FormData): Promise<TEventFormState> {
  const time = text(form, "occurredAt");
  const valueText = text(form, "value");
  const value = valueText === undefined ? undefined : Number(valueText.replace(/^(-?\d+),(\d+)$/, "$1.$2"));
  const parsed = ZEventInput.safeParse({
    occurredAt: time !== undefined && /^\d{4}-\d\d-\d\dT\d\d:\d\d$/.test(time) ? `${time}:00Z` : time,
    kind: text(form, "kind"),
    causeCategory: text(form, "causeCategory"),
    description: text(form, "description"),
    value: value !== undefined && Number.isNaN(value) ? valueText : value,
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
