"use client";

import { useActionState } from "react";
import { CAUSE_CATEGORIES, EVENT_KINDS, EVENT_KIND_LABELS } from "@/shared/constants";
import { FormProblems, problemOf as fieldProblem } from "../../../characteristics/form-field";
import { enteredOr, type TFormState } from "../../../characteristics/setup-fields";
import { ZonedTimeField } from "../../../characteristics/zoned-time-field";
import { addEvent } from "./actions";

/** `zone`: the site's time zone, in which the time is typed; `defaultTime` is wall-clock time in it. */
export function EventForm({ processId, zone, defaultTime }: { processId: number; zone: string; defaultTime: string }) {
  const [state, action, pending] = useActionState(addEvent.bind(null, processId), { ok: null } as TFormState);
  const issues = state.ok === false ? state.issues : [];
  const problemOf = (name: string) => fieldProblem(issues, name);
  const described = (name: string) => (problemOf(name) !== "" ? { "aria-invalid": true, "aria-describedby": `${name}-error` } : {});
  const error = (name: string, label: string) =>
    problemOf(name) !== "" && (
      <p className="field-error" id={`${name}-error`}>
        {label} {problemOf(name)}
      </p>
    );
  return (
    <form action={action} className="settings-form" noValidate>
      {state.ok === true && <p role="status">{state.message}</p>}
      <FormProblems issues={issues} />
      <ZonedTimeField
        name="occurredAt"
        zone={zone}
        defaultValue={enteredOr(state, "occurredAt", defaultTime)}
        issues={issues}
        choices={state.ok === false ? state.timeChoices?.occurredAt : undefined}
      />
      <div className="field">
        <label htmlFor="kind">Kind</label>
        <select id="kind" name="kind" defaultValue={enteredOr(state, "kind", "lot-change")} {...described("kind")}>
          {EVENT_KINDS.map((kind) => (
            <option key={kind} value={kind}>
              {EVENT_KIND_LABELS[kind]}
            </option>
          ))}
        </select>
        {error("kind", "Kind")}
      </div>
      <div className="field">
        <label htmlFor="causeCategory">Cause category (optional)</label>
        <select id="causeCategory" name="causeCategory" defaultValue={enteredOr(state, "causeCategory", "")} {...described("causeCategory")}>
          <option value="">(none)</option>
          {CAUSE_CATEGORIES.map((category) => (
            <option key={category} value={category}>
              {category}
            </option>
          ))}
        </select>
        {error("causeCategory", "Cause category")}
      </div>
      <div className="field">
        <label htmlFor="description">What happened</label>
        <textarea id="description" name="description" rows={3} defaultValue={enteredOr(state, "description", "")} {...described("description")} />
        {error("description", "What happened")}
      </div>
      <div className="field">
        <label htmlFor="value">Reading (optional, e.g. a dew point)</label>
        <input id="value" name="value" inputMode="decimal" defaultValue={enteredOr(state, "value", "")} {...described("value")} />
        {error("value", "Reading")}
      </div>
      <div className="field">
        <label htmlFor="unit">Unit of the reading</label>
        <input id="unit" name="unit" defaultValue={enteredOr(state, "unit", "")} {...described("unit")} />
        {error("unit", "Unit")}
      </div>
      <button type="submit" disabled={pending}>
        {pending ? "Recording…" : "Record event"}
      </button>
    </form>
  );
}
