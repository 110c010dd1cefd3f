"use server";
// Manual entry of one subgroup: parse with the characteristic's subgroup schema, store it through live
// detection, answer with the verdict in words (or the field problems).
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { describeIssues, subgroupSchemaFor } from "@/shared/intake";
import { getCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { RULE_DEFINITIONS } from "@/src/spc/rules";
import { appendSubgroups } from "@/src/subgroups";

export type TEntryState =
  | { readonly ok: null }
  | { readonly ok: false; readonly issues: readonly { path: string; message: string }[] }
  | {
      readonly ok: true;
      readonly sequence: number;
      readonly judged: boolean;
      readonly firedRules: readonly { rule: string; text: string }[];
      readonly notes: readonly string[];
    };

/** A typed number: a decimal comma is read as a decimal point; anything else that is not a number stays text for zod to refuse. */
function numberField(form: FormData, name: string): number | string | undefined {
  const text = String(form.get(name) ?? "").trim();
  if (text === "") return undefined;
  const normalised = /^-?\d+,\d+$/.test(text) ? text.replace(",", ".") : text;
  const value = Number(normalised);
  return Number.isFinite(value) ? value : text;
}

/** The time field (a local date-time typed as UTC) as ISO 8601 with a zone. */
function timestampField(form: FormData): string {
  const text = String(form.get("timestamp") ?? "").trim();
  return /^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d)?$/.test(text) ? `${text.length === 16 ? `${text}:00` : text}Z` : text;
}

export async function enterSubgroup(characteristicId: number, _previous: TEntryState, form: FormData): Promise<TEntryState> {
  const characteristic = await getCharacteristic(prisma, characteristicId);
  const variables = VARIABLES_CHART_TYPES.includes(characteristic.chartType);
  const input = variables
    ? {
        timestamp: timestampField(form),
        values: Array.from({ length: characteristic.subgroupSize }, (_, position) => numberField(form, `values.${position}`)),
      }
    : {
        timestamp: timestampField(form),
        count: numberField(form, "count"),
        ...(characteristic.chartType === "u" ? { units: numberField(form, "units") } : {}),
        ...(characteristic.chartType === "p" || characteristic.chartType === "np" ? { size: numberField(form, "size") } : {}),
      };
  const parsed = subgroupSchemaFor(characteristic.chartType, characteristic.subgroupSize).safeParse(input);
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error) };
  try {
    const result = await appendSubgroups(prisma, characteristicId, [parsed.data], { source: "entry", now: new Date() });
    const stored = result.stored[0]!;
    return {
      ok: true,
      sequence: stored.sequence,
      judged: result.limits !== null,
      firedRules: stored.firedRules.map((rule) => ({ rule, text: RULE_DEFINITIONS[rule].summary })),
      notes: result.notes,
    };
  } catch (error) {
    if (isAppError(error) && error.code !== "forbidden") {
      const issues = error.issues.map((issue) => ({ path: issue.path.replace(/^subgroups\.\d+\.?/, ""), message: issue.message }));
      return { ok: false, issues: issues.length > 0 ? issues : [{ path: "", message: error.message }] };
    }
    throw error;
  }
}
