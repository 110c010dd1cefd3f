// Form fields of the characteristic setup form as the input ZCharacteristicInput parses; empty optional
// fields are left out, numbers that do not read as numbers stay text so the schema names them.
export type TFormIssues = readonly { path: string; message: string }[];

export type TFormState =
  | { readonly ok: null }
  | { readonly ok: true; readonly message: string }
  | {
      readonly ok: false;
      readonly issues: TFormIssues;
      /** What was typed, so the form (which React resets after an action) shows it again beside its problems. */
      readonly entered: Readonly<Record<string, string>>;
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

/** A datetime-local field ("2026-03-01T06:00"), typed in UTC, as ISO 8601 with a zone; other text unchanged. */
export function utcTimeField(form: FormData, name: string): string | undefined {
  const value = text(form, name);
  if (value === undefined || !/^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d)?$/.test(value)) return value;
  return `${value.length === 16 ? `${value}:00` : value}Z`;
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
