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
import { numberField, utcTimeField } from "../../setup-fields";

export type TEntryState =
  | { readonly ok: null }
  | {
      readonly ok: false;
      readonly issues: readonly { path: string; message: string }[];
      /** What was typed, so the form shows it again beside its problems. */
      readonly entered: Readonly<Record<string, string>>;
    }
  | {
      readonly ok: true;
      readonly sequence: number;
      readonly judged: boolean;
      readonly firedRules: readonly { rule: string; text: string }[];
      readonly notes: readonly string[];
    };

export async function enterSubgroup(characteristicId: number, _previous: TEntryState, form: FormData): Promise<TEntryState> {
  const characteristic = await getCharacteristic(prisma, characteristicId);
  const variables = VARIABLES_CHART_TYPES.includes(characteristic.chartType);
  const input = variables
    ? {
        timestamp: utcTimeField(form, "timestamp"),
        values: Array.from({ length: characteristic.subgroupSize }, (_, position) => numberField(form, `values.${position}`)),
      }
    : {
        timestamp: utcTimeField(form, "timestamp"),
        count: numberField(form, "count"),
        ...(characteristic.chartType === "u" ? { units: numberField(form, "units") } : {}),
        ...(characteristic.chartType === "p" || characteristic.chartType === "np" ? { size: numberField(form, "size") } : {}),
      };
  const parsed = subgroupSchemaFor(characteristic.chartType, characteristic.subgroupSize).safeParse(input);
  const entered = Object.fromEntries([...form.entries()].map(([name, value]) => [name, String(value)]));
  if (!parsed.success) return { ok: false, issues: describeIssues(parsed.error), entered };
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
      return { ok: false, issues: issues.length > 0 ? issues : [{ path: "", message: error.message }], entered };
    }
    throw error;
  }
}
