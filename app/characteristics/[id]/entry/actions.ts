"use server";
// Manual entry of one subgroup: the time read as wall-clock time in the site's zone, the rest parsed with the
// characteristic's subgroup schema; stored through live detection; the answer is the verdict in words (or
// the field problems).
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { describeIssues, subgroupSchemaFor } from "@/shared/intake";
import { getCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { RULE_DEFINITIONS } from "@/src/spc/rules";
import { zoneOfProcess } from "@/src/sites/zone";
import { appendSubgroups } from "@/src/subgroups";
import { numberField, withTimeProblem, zonedTimeField, type TTimeChoices } from "../../setup-fields";

export type TEntryState =
  | { readonly ok: null }
  | {
      readonly ok: false;
      readonly issues: readonly { path: string; message: string }[];
      /** What was typed, so the form shows it again beside its problems. */
      readonly entered: Readonly<Record<string, string>>;
      readonly timeChoices?: TTimeChoices;
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
  const time = zonedTimeField(form, "timestamp", await zoneOfProcess(prisma, characteristic.processId));
  const input = variables
    ? {
        timestamp: time.value,
        values: Array.from({ length: characteristic.subgroupSize }, (_, position) => numberField(form, `values.${position}`)),
      }
    : {
        timestamp: time.value,
        count: numberField(form, "count"),
        ...(characteristic.chartType === "u" ? { units: numberField(form, "units") } : {}),
        ...(characteristic.chartType === "p" || characteristic.chartType === "np" ? { size: numberField(form, "size") } : {}),
      };
  const parsed = subgroupSchemaFor(characteristic.chartType, characteristic.subgroupSize).safeParse(input);
  const entered = Object.fromEntries([...form.entries()].map(([name, value]) => [name, String(value)]));
  const problems = withTimeProblem(time, parsed.success ? [] : describeIssues(parsed.error));
  if (!parsed.success || problems.issues.length > 0) return { ok: false, ...problems, entered };
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
