// Form fields of the characteristic setup form as the input ZCharacteristicInput parses; empty optional
// fields are left out, numbers that do not read as numbers stay text so the schema names them.
import { ZLocalDateTime } from "@/shared/intake";
import { resolveLocalTime, type TOffsetChoice } from "@/src/time/local-time";

export type TFormIssues = readonly { path: string; message: string }[];

/** Per time field, the two offsets of a wall-clock time the clocks showed twice, for the person to choose. */
export type TTimeChoices = Readonly<Record<string, readonly TOffsetChoice[]>>;

export type TFormState =
  | { readonly ok: null }
  | { readonly ok: true; readonly message: string }
  | {
      readonly ok: false;
      readonly issues: TFormIssues;
      /** What was typed, so the form (which React resets after an action) shows it again beside its problems. */
      readonly entered: Readonly<Record<string, string>>;
      readonly timeChoices?: TTimeChoices;
    };

export function enteredValues(form: FormData): Record<string, string> {
  return Object.fromEntries([...form.entries()].map(([name, value]) => [name, String(value)]));
}

/** The typed value of a field after a refused submission, else the field's own default. */
export function enteredOr(state: TFormState, name: string, fallback: string): string {
  return state.ok === false ? (state.entered[name] ?? "") : fallback;
}

export function text(form: FormData, name: string): string | undefined {
  const value = String(form.get(name) ?? "").trim();
  return value === "" ? undefined : value;
}

/** A typed number (a decimal comma read as a point), or the text itself for the schema to refuse. */
export function numberField(form: FormData, name: string): number | string | undefined {
  const value = text(form, name);
  if (value === undefined) return undefined;
  const number = Number(/^-?\d+,\d+$/.test(value) ? value.replace(",", ".") : value);
  return Number.isFinite(number) ? number : value;
}

/** A wall-clock time field read in the site's zone: the instant for the schema, or the field's problem. */
export type TZonedTime =
  | { readonly value: string | undefined; readonly issue?: undefined }
  | { readonly value?: undefined; readonly issue: { path: string; message: string }; readonly choices?: readonly TOffsetChoice[] };

/**
 * A datetime-local field ("2026-03-01T06:00") typed as wall-clock time in `zone`, as an ISO 8601 UTC instant.
 * An empty field gives undefined for the schema to name. Text that is no date and time, and a time the
 * clocks skipped, are the field's problem; a time the clocks showed twice is too, with both offsets to
 * choose from, until the choice comes back as the field `<name>.offset` (see resolveLocalTime).
 */
export function zonedTimeField(form: FormData, name: string, zone: string): TZonedTime {
  const typed = text(form, name);
  if (typed === undefined) return { value: undefined };
  const local = ZLocalDateTime.safeParse(typed);
  if (!local.success) return { issue: { path: name, message: local.error.issues[0]?.message ?? "is not valid" } };
  const resolved = resolveLocalTime(local.data, zone, text(form, `${name}.offset`));
  if (resolved.kind === "exact") return { value: resolved.instant.toISOString() };
  return { issue: { path: name, message: resolved.problem }, ...(resolved.kind === "repeated" ? { choices: resolved.choices } : {}) };
}

/**
 * The problems of a form with a zoned time field: the time's own problem, and the schema's issues on the
 * other fields (the schema saw no time where the field had a problem, and would only say it is missing).
 */
export function withTimeProblem(time: TZonedTime, issues: TFormIssues): { issues: TFormIssues; timeChoices?: TTimeChoices } {
  if (time.issue === undefined) return { issues };
  return {
    issues: [time.issue, ...issues.filter((issue) => issue.path !== time.issue.path)],
    ...(time.choices === undefined ? {} : { timeChoices: { [time.issue.path]: time.choices } }),
  };
}

/** The setup form as the input ZCharacteristicInput parses (unknown until parsed). */
export function characteristicInputOf(form: FormData): Record<string, unknown> {
  return {
    processId: numberField(form, "processId"),
    name: text(form, "name") ?? "",
    unit: text(form, "unit") ?? "",
    chartType: text(form, "chartType"),
    subgroupSize: numberField(form, "subgroupSize"),
    target: numberField(form, "target"),
    lowerSpecLimit: numberField(form, "lowerSpecLimit"),
    upperSpecLimit: numberField(form, "upperSpecLimit"),
    ruleSet: text(form, "ruleSet"),
    safetyRelated: form.get("safetyRelated") === "on",
    description: text(form, "description"),
  };
}
