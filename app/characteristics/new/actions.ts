"use server";
// Setting up a new characteristic: parse the form with the shared schema, create it, go to its page.
import { redirect } from "next/navigation";
import { describeIssues, ZCharacteristicInput } from "@/shared/intake";
import { createCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { characteristicInputOf, enteredValues, type TFormState } from "../setup-fields";

export async function createFromForm(_previous: TFormState, form: FormData): Promise<TFormState> {
  const parsed = ZCharacteristicInput.safeParse(characteristicInputOf(form));
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error), entered: enteredValues(form) };
  let id: number;
  try {
    id = (await createCharacteristic(prisma, parsed.data)).id;
  } catch (error) {
    if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }], entered: enteredValues(form) };
    throw error;
  }
  redirect(`/characteristics/${id}/settings`);
}
