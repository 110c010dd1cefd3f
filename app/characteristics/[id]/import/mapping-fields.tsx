"use client";
/** The column mapping as labelled selects: one per role the chart reads, then a tag row per other column. */
import type { ChartType } from "@/shared/constants";
import { COLUMN_ROLE_WORDS, measurementRolesFor, type TColumnMapping, type TColumnRole } from "@/src/imports/options";
import styles from "./import.module.css";
import { tagNameFor } from "./preview";

interface MappingFieldsProps {
  readonly header: readonly string[];
  readonly chart: ChartType;
  readonly subgroupSize: number;
  readonly mapping: TColumnMapping;
  readonly onChange: (mapping: TColumnMapping) => void;
}

const NOT_MAPPED = "";

export function MappingFields({ header, chart, subgroupSize, mapping, onChange }: MappingFieldsProps) {
  const roles: { role: TColumnRole; required: boolean }[] = [
    { role: "timestamp", required: true },
    ...measurementRolesFor(chart).map((role) => ({ role, required: true })),
    { role: "subgroup", required: subgroupSize > 1 },
  ];
  const setRole = (role: TColumnRole, column: string) => {
    const next: Record<string, unknown> = { ...mapping, tags: mapping.tags.filter((tag) => tag.column !== column) };
    if (column === NOT_MAPPED) delete next[role];
    else next[role] = column;
    onChange(next as TColumnMapping);
  };
  const roleOf = (column: string) => roles.find(({ role }) => mapping[role] === column)?.role;
  const setTag = (column: string, tag: string | undefined) => {
    const others = mapping.tags.filter((entry) => entry.column !== column);
    onChange({ ...mapping, tags: tag === undefined ? others : [...others, { column, tag }] });
  };

  return (
    <fieldset className={styles.fieldset}>
      <legend>Columns</legend>
      <div className={styles.grid}>
        {roles.map(({ role, required }) => (
          <label key={role} className={styles.field}>
            <span>
              {COLUMN_ROLE_WORDS[role]}
              {required ? " (required)" : " (optional)"}
            </span>
            <select value={mapping[role] ?? NOT_MAPPED} onChange={(event) => setRole(role, event.target.value)}>
              <option value={NOT_MAPPED}>Not in the file</option>
              {header.map((column) => (
                <option key={column} value={column}>
                  {column}
                </option>
              ))}
            </select>
          </label>
        ))}
      </div>
      <p className={styles.hint}>Other columns can be kept as tags (for example cavity, lot or operator); unticked columns are ignored.</p>
      <ul className={styles.tagList}>
        {header
          .filter((column) => roleOf(column) === undefined)
          .map((column) => {
            const entry = mapping.tags.find((tag) => tag.column === column);
            return (
              <li key={column}>
                <label>
                  <input type="checkbox" checked={entry !== undefined} onChange={(event) => setTag(column, event.target.checked ? tagNameFor(column) : undefined)} />{" "}
                  Keep &ldquo;{column}&rdquo; as a tag
                </label>
                {entry !== undefined && (
                  <label className={styles.inline}>
                    {" "}named{" "}
                    <input type="text" value={entry.tag} pattern="[a-z][a-z0-9-]*" maxLength={40} onChange={(event) => setTag(column, event.target.value)} />
                  </label>
                )}
              </li>
            );
          })}
      </ul>
    </fieldset>
  );
}
