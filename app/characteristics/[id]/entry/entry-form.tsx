"use client";

import { useActionState } from "react";
import type { ChartType } from "@/shared/constants";
import { ZonedTimeField } from "../../zoned-time-field";
import { enterSubgroup, type TEntryState } from "./actions";

interface TField {
  readonly name: string;
  readonly label: string;
  readonly hint?: string;
}

/** The fields one subgroup needs on this chart. */
function fieldsFor(chartType: ChartType, subgroupSize: number, unit: string): TField[] {
  switch (chartType) {
    case "p":
    case "np":
      return [
        { name: "count", label: "Defective items" },
        { name: "size", label: "Items inspected", hint: chartType === "np" ? `Always ${subgroupSize} on this chart` : undefined },
      ];
    case "c":
      return [{ name: "count", label: "Defects counted" }];
    case "u":
      return [
        { name: "count", label: "Defects counted" },
        { name: "units", label: "Inspection units", hint: "May be fractional, e.g. 2.5" },
      ];
    default:
      return Array.from({ length: subgroupSize }, (_, position) => ({
        name: `values.${position}`,
        label: subgroupSize === 1 ? `Value (${unit})` : `Value ${position + 1} (${unit})`,
      }));
  }
}

function Outcome({ state }: { state: TEntryState }) {
  if (state.ok !== true) return null;
  if (!state.judged) {
    return (
      <div className="outcome outcome-ok" role="status">
        <p><strong>Stored as subgroup {state.sequence}.</strong> No verdict: this characteristic has no control limits yet.</p>
      </div>
    );
  }
  if (state.firedRules.length === 0) {
    return (
      <div className="outcome outcome-ok" role="status">
        <p><strong>✓ In control.</strong> Subgroup {state.sequence} stored; no rule fired.</p>
      </div>
    );
  }
  return (
    <div className="outcome outcome-signal" role="alert">
      <p><strong>▲ Out of control at subgroup {state.sequence}.</strong></p>
      {state.firedRules.map((fired) => (
        <p key={fired.rule}>
          Rule fired: {fired.text} ({fired.rule}).
        </p>
      ))}
    </div>
  );
}

export function EntryForm({
  characteristicId,
  chartType,
  subgroupSize,
  unit,
  zone,
  defaultTime,
}: {
  characteristicId: number;
  chartType: ChartType;
  subgroupSize: number;
  unit: string;
  /** The site's time zone: the time is typed as wall-clock time in it, and `defaultTime` is one. */
  zone: string;
  defaultTime: string;
}) {
  const [state, action, pending] = useActionState(enterSubgroup.bind(null, characteristicId), { ok: null } as TEntryState);
  const issues = state.ok === false ? state.issues : [];
  const entered = state.ok === false ? state.entered : {};
  const problemOf = (name: string) => issues.filter((issue) => issue.path === name).map((issue) => issue.message).join("; ");
  const general = issues.filter((issue) => issue.path === "" || issue.path === "values");
  const fields = fieldsFor(chartType, subgroupSize, unit);
  return (
    <>
      <Outcome state={state} />
      <form action={action} className="entry-form" noValidate>
        {general.map((issue, index) => (
          <p key={index} className="form-error" role="alert">
            {issue.path === "" ? issue.message : `Values ${issue.message}`}
          </p>
        ))}
        <ZonedTimeField
          name="timestamp"
          zone={zone}
          defaultValue={entered.timestamp ?? defaultTime}
          issues={issues}
          choices={state.ok === false ? state.timeChoices?.timestamp : undefined}
        />
        <div className={fields.length > 2 ? "values-grid" : undefined}>
          {fields.map((field, index) => {
            const problem = problemOf(field.name);
            const id = `field-${field.name.replace(".", "-")}`;
            return (
              <div className="field" key={field.name}>
                <label htmlFor={id}>{field.label}</label>
                <input
                  id={id}
                  name={field.name}
                  inputMode="decimal"
                  autoComplete="off"
                  defaultValue={entered[field.name] ?? ""}
                  autoFocus={index === 0}
                  aria-invalid={problem !== ""}
                  aria-describedby={[problem !== "" ? `${id}-error` : "", field.hint ? `${id}-hint` : ""].filter(Boolean).join(" ") || undefined}
                />
                {field.hint && <span className="field-hint" id={`${id}-hint`}>{field.hint}</span>}
                {problem !== "" && <p className="field-error" id={`${id}-error`}>{field.label} {problem}</p>}
              </div>
            );
          })}
        </div>
        <button type="submit" disabled={pending}>
          {pending ? "Checking…" : "Store and check"}
        </button>
      </form>
    </>
  );
}
