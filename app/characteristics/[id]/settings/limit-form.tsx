"use client";

import { useActionState } from "react";
import { FormField, FormProblems } from "../../form-field";
import { enteredOr, type TFormState } from "../../setup-fields";

export function LimitRevisionForm({
  action: serverAction,
  lastSequence,
}: {
  action: (previous: TFormState, form: FormData) => Promise<TFormState>;
  lastSequence: number | null;
}) {
  const [state, action, pending] = useActionState(serverAction, { ok: null } as TFormState);
  const issues = state.ok === false ? state.issues : [];
  return (
    <form action={action} className="settings-form" noValidate>
      {state.ok === true && <p role="status">{state.message}</p>}
      <FormProblems issues={issues} />
      <FormField name="baselineStart" label="Baseline: first subgroup" hint="The new version applies from this subgroup on" issues={issues}>
        {(attributes) => <input {...attributes} inputMode="numeric" defaultValue={enteredOr(state, "baselineStart", "0")} />}
      </FormField>
      <FormField
        name="baselineLast"
        label="Baseline: last subgroup"
        hint={lastSequence === null ? "No subgroups stored yet" : `Subgroups 0 to ${lastSequence} are stored`}
        issues={issues}
      >
        {(attributes) => <input {...attributes} inputMode="numeric" defaultValue={enteredOr(state, "baselineLast", lastSequence === null ? "" : String(Math.min(lastSequence, 99)))} />}
      </FormField>
      <FormField
        name="exclusions"
        label="Subgroups left out of the baseline (optional)"
        hint='One per line, "subgroup: reason", e.g. "17: wrong mould inserted"'
        issues={issues}
      >
        {(attributes) => <textarea {...attributes} rows={3} defaultValue={enteredOr(state, "exclusions", "")} />}
      </FormField>
      <FormField name="reason" label="Reason for the new version" issues={issues}>
        {(attributes) => <input {...attributes} defaultValue={enteredOr(state, "reason", "")} />}
      </FormField>
      <FormField name="approvedBy" label="Approved by" issues={issues}>
        {(attributes) => <input {...attributes} autoComplete="name" defaultValue={enteredOr(state, "approvedBy", "")} />}
      </FormField>
      <button type="submit" disabled={pending}>
        {pending ? "Computing…" : "Compute and freeze new limits"}
      </button>
    </form>
  );
}
