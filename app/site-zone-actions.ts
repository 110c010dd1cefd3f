"use server";
// Setting a site's time zone from the overview: the shared schema checks it, the service stores it, and
// every page shows its times in it from the next request on.
import { revalidatePath } from "next/cache";
import { describeIssues, ZSiteZoneInput } from "@/shared/intake";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { setSiteZone } from "@/src/sites/zone";
import { enteredValues, numberField, text, type TFormState } from "./characteristics/setup-fields";

export async function setZoneFromForm(_previous: TFormState, form: FormData): Promise<TFormState> {
  const parsed = ZSiteZoneInput.safeParse({ siteId: numberField(form, "siteId"), zone: text(form, "zone") ?? "" });
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error), entered: enteredValues(form) };
  try {
    const site = await setSiteZone(prisma, parsed.data);
    revalidatePath("/", "layout");
    return { ok: true, message: `Times of ${site.name} are now shown and entered in ${site.zone}.` };
  } catch (error) {
    if (isAppError(error)) return { ok: false, issues: error.issues.length > 0 ? [...error.issues] : [{ path: "", message: error.message }], entered: enteredValues(form) };
    throw error;
  }
}
