"use client";

import { useActionState } from "react";
import { FormProblems, problemOf } from "./characteristics/form-field";
import { enteredOr, type TFormState } from "./characteristics/setup-fields";
import { setZoneFromForm } from "./site-zone-actions";

/** One site's time zone, set on the overview. */
function SiteZone({ site, zones }: { site: { id: number; name: string; zone: string }; zones: readonly string[] }) {
  const [state, action, pending] = useActionState(setZoneFromForm, { ok: null } as TFormState);
  const issues = state.ok === false ? state.issues : [];
  const problem = problemOf(issues, "zone");
  // One form per site: ids carry the site's id so that each label finds its own field.
  const id = `site-${site.id}-zone`;
  return (
    <form action={action} className="settings-form" noValidate aria-label={`Plant time for ${site.name}`}>
      {state.ok === true && <p role="status">{state.message}</p>}
      <FormProblems issues={issues} />
      <input type="hidden" name="siteId" value={site.id} />
      <div className="field">
        <label htmlFor={id}>Time zone of {site.name}</label>
        <select
          id={id}
          name="zone"
          defaultValue={enteredOr(state, "zone", site.zone)}
          aria-invalid={problem !== ""}
          aria-describedby={[`${id}-hint`, problem !== "" ? `${id}-error` : ""].filter(Boolean).join(" ")}
        >
          {zones.map((zone) => (
            <option key={zone} value={zone}>
              {zone}
            </option>
          ))}
        </select>
        <span className="field-hint" id={`${id}-hint`}>
          Now {site.zone}. Display and entry only: stored times stay in UTC, and so do the API and CSV files.
        </span>
        {problem !== "" && (
          <p className="field-error" id={`${id}-error`}>
            Time zone {problem}
          </p>
        )}
      </div>
      <button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Save time zone"}
      </button>
    </form>
  );
}

/** The plant-time section of the overview: pages show, and forms take, times in each site's zone. */
export function SiteZoneForm({ sites, zones }: { sites: readonly { id: number; name: string; zone: string }[]; zones: readonly string[] }) {
  return (
    <section aria-labelledby="plant-time-heading">
      <h2 id="plant-time-heading">Plant time</h2>
      <p>
        Times on these pages are shown, and typed into the forms, as wall-clock time in the site&apos;s zone, with the zone&apos;s name
        (CET or CEST, say) so that the hours around a clock change are never mistaken.
      </p>
      {sites.map((site) => (
        <SiteZone key={site.id} site={site} zones={zones} />
      ))}
    </section>
  );
}
