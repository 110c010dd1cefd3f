"use client";

import { useActionState } from "react";
import { CHART_TYPES, CHART_TYPE_LABELS, type ChartType } from "@/shared/constants";
import { FormField, FormProblems } from "./form-field";
import { enteredOr, type TFormState } from "./setup-fields";

export interface TSetupValues {
  readonly processId?: number;
  readonly name?: string;
  readonly unit?: string;
  readonly chartType?: ChartType;
  readonly subgroupSize?: number;
  readonly target?: number | null;
  readonly lowerSpecLimit?: number | null;
  readonly upperSpecLimit?: number | null;
  readonly ruleSet?: string;
  readonly safetyRelated?: boolean;
  readonly description?: string | null;
}

/** The characteristic setup form; `action` creates or updates. */
export function SetupForm({
  action: serverAction,
  processes,
  values,
  submitLabel,
}: {
  action: (previous: TFormState, form: FormData) => Promise<TFormState>;
  processes: readonly { id: number; name: string }[];
  values: TSetupValues;
  submitLabel: string;
}) {
  const [state, action, pending] = useActionState(serverAction, { ok: null } as TFormState);
  const issues = state.ok === false ? state.issues : [];
  const optional = (value: number | null | undefined) => (value === null || value === undefined ? "" : String(value));
  const shown = (name: string, fallback: string) => enteredOr(state, name, fallback);
  return (
    <form action={action} className="settings-form" noValidate>
      {state.ok === true && <p role="status">{state.message}</p>}
      <FormProblems issues={issues} />
      <FormField name="processId" label="Process" issues={issues}>
        {(attributes) => (
          <select {...attributes} defaultValue={shown("processId", optional(values.processId))}>
            {processes.map((process) => (
              <option key={process.id} value={process.id}>
                {process.name}
              </option>
            ))}
          </select>
        )}
      </FormField>
      <FormField name="name" label="Name" issues={issues}>
        {(attributes) => <input {...attributes} defaultValue={shown("name", values.name ?? "")} />}
      </FormField>
      <FormField name="unit" label="Unit" hint="e.g. g, mm, %" issues={issues}>
        {(attributes) => <input {...attributes} defaultValue={shown("unit", values.unit ?? "")} />}
      </FormField>
      <FormField name="chartType" label="Chart type" issues={issues}>
        {(attributes) => (
          <select {...attributes} defaultValue={shown("chartType", values.chartType ?? "imr")}>
            {CHART_TYPES.map((chartType) => (
              <option key={chartType} value={chartType}>
                {CHART_TYPE_LABELS[chartType]}
              </option>
            ))}
          </select>
        )}
      </FormField>
      <FormField name="subgroupSize" label="Subgroup size" hint="Values per subgroup (1 for individuals); the sample size on an np chart" issues={issues}>
        {(attributes) => <input {...attributes} inputMode="numeric" defaultValue={shown("subgroupSize", optional(values.subgroupSize ?? 1))} />}
      </FormField>
      <FormField name="target" label="Target (optional)" issues={issues}>
        {(attributes) => <input {...attributes} inputMode="decimal" defaultValue={shown("target", optional(values.target))} />}
      </FormField>
      <FormField name="lowerSpecLimit" label="Lower specification limit (optional)" issues={issues}>
        {(attributes) => <input {...attributes} inputMode="decimal" defaultValue={shown("lowerSpecLimit", optional(values.lowerSpecLimit))} />}
      </FormField>
      <FormField name="upperSpecLimit" label="Upper specification limit (optional)" issues={issues}>
        {(attributes) => <input {...attributes} inputMode="decimal" defaultValue={shown("upperSpecLimit", optional(values.upperSpecLimit))} />}
      </FormField>
      <FormField name="ruleSet" label="Run rules" hint='"nelson", "we", or a list such as we-1,we-2' issues={issues}>
        {(attributes) => <input {...attributes} defaultValue={shown("ruleSet", values.ruleSet ?? "nelson")} />}
      </FormField>
      <div className="field field-check">
        <label>
          <input type="checkbox" name="safetyRelated" defaultChecked={state.ok === false ? state.entered.safetyRelated === "on" : (values.safetyRelated ?? false)} /> Safety-related (food contact, medical,
          structural)
        </label>
      </div>
      <FormField name="description" label="Description (optional)" issues={issues}>
        {(attributes) => <textarea {...attributes} rows={3} defaultValue={shown("description", values.description ?? "")} />}
      </FormField>
      <button type="submit" disabled={pending}>
        {pending ? "Saving…" : submitLabel}
      </button>
    </form>
  );
}
