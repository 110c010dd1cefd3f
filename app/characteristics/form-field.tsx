// One labelled form field with its hint and its problem from the server (path → field), shared by the forms.
import type { ReactElement } from "react";
import type { TFormIssues } from "./setup-fields";

export function problemOf(issues: TFormIssues, path: string): string {
  return issues
    .filter((issue) => issue.path === path)
    .map((issue) => issue.message)
    .join("; ");
}

/** Problems that belong to no single field (path ""), shown above the form's fields. */
export function FormProblems({ issues }: { issues: TFormIssues }) {
  return (
    <>
      {issues
        .filter((issue) => issue.path === "")
        .map((issue, index) => (
          <p key={index} className="form-error" role="alert">
            {issue.message}
          </p>
        ))}
    </>
  );
}

export function FormField({
  name,
  label,
  hint,
  issues,
  children,
}: {
  name: string;
  label: string;
  hint?: string;
  issues: TFormIssues;
  /** The control; it receives id, name, aria-invalid and aria-describedby. */
  children: (attributes: { id: string; name: string; "aria-invalid": boolean; "aria-describedby"?: string }) => ReactElement;
}) {
  const problem = problemOf(issues, name);
  const id = `field-${name.replaceAll(".", "-")}`;
  const describedBy = [problem !== "" ? `${id}-error` : "", hint !== undefined ? `${id}-hint` : ""].filter(Boolean).join(" ");
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      {children({ id, name, "aria-invalid": problem !== "", ...(describedBy !== "" ? { "aria-describedby": describedBy } : {}) })}
      {hint !== undefined && (
        <span className="field-hint" id={`${id}-hint`}>
          {hint}
        </span>
      )}
      {problem !== "" && (
        <p className="field-error" id={`${id}-error`}>
          {label} {problem}
        </p>
      )}
    </div>
  );
}
