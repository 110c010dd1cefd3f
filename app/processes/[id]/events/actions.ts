"use server";
// Recording a process event: the time is read as wall-clock time in the site's zone, the rest parsed with
// the shared event schema; the event is stored, or the field problems are reported.
import { revalidatePath } from "next/cache";
import { describeIssues, ZEventInput } from "@/shared/intake";
import { formatTime } from "@/src/components/format";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { recordEvent } from "@/src/events";
import { zoneOfProcess } from "@/src/sites/zone";
import { enteredValues, numberField, text, withTimeProblem, zonedTimeField, type TFormState } from "../../../characteristics/setup-fields";

export async function addEvent(processId: number, _previous: TFormState, form: FormData): Promise<TFormState> {
  try {
    const zone = await zoneOfProcess(prisma, processId);
    const time = zonedTimeField(form, "occurredAt", zone);
    const parsed = ZEventInput.safeParse({
      occurredAt: time.value,
      kind: text(form, "kind"),
      causeCategory: text(form, "causeCategory"),
      description: text(form, "description"),
      value: numberField(form, "value"),
      unit: text(form, "unit"),
    });
    const problems = withTimeProblem(time, parsed.success ? [] : describeIssues(parsed.error));
    if (!parsed.success || problems.issues.length > 0) return { ok: false, ...problems, entered: enteredValues(form) };
    const event = await recordEvent(prisma, processId, parsed.data, new Date());
    revalidatePath(`/processes/${processId}/events`);
    return { ok: true, message: `Event recorded (${event.kind}, ${formatTime(event.occurredAt.toISOString(), zone)}).` };
  } catch (error) {
    if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }], entered: enteredValues(form) };
    throw error;
  }
}
