"use client";

import { useActionState } from "react";
import type { ChartType } from "@/shared/constants";
import { FormField, FormProblems } from "../../form-field";
import { enteredOr, type TFormState } from "../../setup-fields";

/** The recorded fields an attributes chart can have corrected, as the form names them. */
function attributesFields(chartType: ChartType): { value: string; label: string }[] {
  switch (chartType) {
    case "p":
    case "np":
      return [
        { value: "count", label: "Defective items" },
        { value: "size", label: "Items inspected" },
      ];
    case "u":
      return [
        { value: "count", label: "Defects counted" },
        { value: "units", label: "Inspection units" },
      ];
    default:
      return [{ value: "count", label: "Defects counted" }];
  }
}

export function CorrectionForm({
  action: serverAction,
  chartType,
  variables,
  subgroupSize,
  unit,
  lastSequence,
}: {
  action: (previous: TFormState, form: FormData) => Promise<TFormState>;
  chartType: ChartType;
  /** A chart of measured values (else of counts). */
  variables: boolean;
  subgroupSize: number;
  unit: string;
  lastSequence: number | null;
}) {
  const [state, action, pending] = useActionState(serverAction, { ok: null } as TFormState);
  const issues = state.ok === false ? state.issues : [];
  return (
    <>
      {state.ok === true && (
        <div className="outcome outcome-ok" role="status">
          <p>{state.message}</p>
        </div>
      )}
      <form action={action} className="entry-form" noValidate>
        <FormProblems issues={issues} />
        <FormField
          name="sequence"
          label="Subgroup"
          hint={lastSequence === null ? "No subgroups stored yet" : `Its number on the chart, 0 to ${lastSequence}`}
          issues={issues}
        >
          {(attributes) => <input {...attributes} inputMode="numeric" autoComplete="off" defaultValue={enteredOr(state, "sequence", "")} />}
        </FormField>
        {variables && subgroupSize > 1 && (
          <FormField name="position" label="Value in the subgroup" hint={`1 to ${subgroupSize}, in the order recorded`} issues={issues}>
            {(attributes) => <input {...attributes} inputMode="numeric" autoComplete="off" defaultValue={enteredOr(state, "position", "")} />}
          </FormField>
        )}
        {!variables && (
          <FormField name="field" label="Recorded field" issues={issues}>
            {(attributes) => (
              <select {...attributes} defaultValue={enteredOr(state, "field", "count")}>
                {attributesFields(chartType).map((option) => (
                  <option key={option.value} value={option.value}>
                    {option.label}
                  </option>
                ))}
              </select>
            )}
          </FormField>
        )}
        <FormField name="newValue" label={variables ? `Corrected value (${unit})` : "Corrected value"} issues={issues}>
          {(attributes) => <input {...attributes} inputMode="decimal" autoComplete="off" defaultValue={enteredOr(state, "newValue", "")} />}
        </FormField>
        <FormField name="reason" label="Reason for the correction" issues={issues}>
          {(attributes) => <input {...attributes} defaultValue={enteredOr(state, "reason", "")} />}
        </FormField>
        <FormField name="correctedBy" label="Corrected by" issues={issues}>
          {(attributes) => <input {...attributes} autoComplete="name" defaultValue={enteredOr(state, "correctedBy", "")} />}
        </FormField>
        <button type="submit" disabled={pending}>
          {pending ? "Correcting…" : "Correct and re-evaluate"}
        </button>
      </form>
    </>
  );
}
