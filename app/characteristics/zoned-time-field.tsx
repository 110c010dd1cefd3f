// A time typed as wall-clock time in the site's zone, the zone named beside it; after a refusal for a time
// the clocks showed twice, the two readings to choose from (sent back as `<name>.offset`).
import type { TOffsetChoice } from "@/src/time/local-time";
import { problemOf } from "./form-field";
import type { TFormIssues } from "./setup-fields";

export function ZonedTimeField({
  name,
  zone,
  defaultValue,
  issues,
  choices,
}: {
  name: string;
  zone: string;
  /** "2026-03-01T06:00", wall-clock time in `zone`. */
  defaultValue: string;
  issues: TFormIssues;
  choices?: readonly TOffsetChoice[];
}) {
  const problem = problemOf(issues, name);
  const id = `field-${name}`;
  const describedBy = [`${id}-hint`, problem !== "" ? `${id}-error` : ""].filter(Boolean).join(" ");
  return (
    <div className="field">
      <label htmlFor={id}>Time ({zone})</label>
      <input id={id} name={name} type="datetime-local" defaultValue={defaultValue} required aria-invalid={problem !== ""} aria-describedby={describedBy} />
      <span className="field-hint" id={`${id}-hint`}>
        Wall-clock time in {zone}, the plant&apos;s time zone; stored in UTC.
      </span>
      {problem !== "" && (
        <p className="field-error" id={`${id}-error`}>
          Time {problem}
        </p>
      )}
      {choices !== undefined && (
        <fieldset className="time-choices">
          <legend>Which one?</legend>
          {choices.map((choice, index) => (
            <label key={choice.offset}>
              <input type="radio" name={`${name}.offset`} value={choice.offset} defaultChecked={index === 0} /> {choice.label}
            </label>
          ))}
        </fieldset>
      )}
    </div>
  );
}
