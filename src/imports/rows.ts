/**
 * One file row → typed fields, through the column mapping. The mapping is first checked against the
 * header and the characteristic's chart (which roles it needs and which it cannot use); each row is then
 * validated with zod using the command-line reader's cell schemas (numbers, counts, sizes; a decimal
 * comma only in semicolon-separated files) and the timestamp forms of ./timestamps.ts. Problems name the
 * file's line and the file's column.
 */
import { z } from "zod";
import { VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import { INTAKE_LIMITS } from "@/shared/intake";
import type { CsvProblem } from "@/src/io/csv/errors";
import type { CsvRow } from "@/src/io/csv/read-table";
import { countCell, numberCell, positiveCell } from "@/src/io/csv/row-schemas";
import { COLUMN_ROLE_WORDS, COLUMN_ROLES, measurementRolesFor, type TColumnMapping, type TColumnRole } from "./options";
import { readTimestamp, type TTimestampReading } from "./timestamps";

export interface TParsedRow {
  readonly line: number;
  readonly subgroup?: string;
  readonly timestamp: number;
  readonly value?: number;
  readonly count?: number;
  readonly size?: number;
  readonly units?: number;
  /** Tag name → value; empty cells give no tag. */
  readonly tags: Readonly<Record<string, string>>;
}

type TRowResult = { readonly ok: true; readonly row: TParsedRow } | { readonly ok: false; readonly problems: CsvProblem[] };


/** Problems of the mapping for this header and chart, reported on the header line. */
export function checkMapping(
  mapping: TColumnMapping,
  header: readonly string[],
  headerLine: number,
  chart: ChartType,
  subgroupSize: number,
): CsvProblem[] {
  const problems: CsvProblem[] = [];
  const present = new Set(header.map((name) => name.toLowerCase()));
  const mapped: [string, string][] = [
    ...COLUMN_ROLES.flatMap((role) => (mapping[role] === undefined ? [] : [[role, mapping[role]] as [string, string]])),
    ...mapping.tags.map(({ column, tag }) => [`tag "${tag}"`, column] as [string, string]),
  ];
  for (const [role, column] of mapped) {
    if (!present.has(column.toLowerCase())) {
      problems.push({ line: headerLine, column, message: `the ${role} column "${column}" is not in the header (${header.join(", ")})` });
    }
  }
  const needed: readonly TColumnRole[] = measurementRolesFor(chart);
  for (const role of ["value", "count", "size", "units"] as const) {
    if (needed.includes(role) && mapping[role] === undefined) {
      problems.push({ line: headerLine, message: `a ${chart} chart needs a ${COLUMN_ROLE_WORDS[role]} column: map one` });
    }
    if (!needed.includes(role) && mapping[role] !== undefined) {
      problems.push({ line: headerLine, column: mapping[role], message: `a ${chart} chart has no ${COLUMN_ROLE_WORDS[role]}: leave "${mapping[role]}" unmapped` });
    }
  }
  if (VARIABLES_CHART_TYPES.includes(chart) && subgroupSize > 1 && mapping.subgroup === undefined) {
    problems.push({
      line: headerLine,
      message: `subgroups of ${subgroupSize} values need a subgroup id column telling which rows belong together: map one`,
    });
  }
  return problems;
}

const NO_TAGS: Readonly<Record<string, string>> = Object.freeze({});

/** The row reader for one import: mapping, chart, decimal mark and timestamp reading fixed. */
export function createRowReader(mapping: TColumnMapping, decimalComma: boolean, reading: TTimestampReading): (row: CsvRow) => TRowResult {
  const timestampCell = z.string().transform((text, context) => {
    const result = readTimestamp(text, reading);
    if (result.ok) return result.milliseconds;
    context.addIssue(result.message);
    return z.NEVER;
  });
  const tagCell = z.string().max(INTAKE_LIMITS.tagValueLength, { error: `is longer than ${INTAKE_LIMITS.tagValueLength} characters` });
  const fullSchema = z.object({
    timestamp: timestampCell,
    subgroup: z.string().min(1, { error: "is empty: a subgroup id is required" }).optional(),
    value: numberCell(decimalComma).optional(),
    count: countCell(decimalComma).optional(),
    size: positiveCell(decimalComma, true).optional(),
    units: positiveCell(decimalComma, false).optional(),
    tags: z.record(z.string(), tagCell).optional(),
  });
  const roles = COLUMN_ROLES.flatMap((role) => (mapping[role] === undefined ? [] : [[role, mapping[role].toLowerCase(), mapping[role]] as const]));
  const tagColumns = mapping.tags.map(({ column, tag }) => [tag, column.toLowerCase(), column] as const);
  // Only the mapped fields are checked (a million rows pay for every absent optional field otherwise); tags
  // are left out of the input when no tag columns are mapped, most large files.
  const picked: Partial<Record<TColumnRole | "tags", true>> = Object.fromEntries([
    ...roles.map(([role]) => [role, true] as const),
    ...(tagColumns.length > 0 ? [["tags", true] as const] : []),
  ]);
  const schema = fullSchema.pick(picked) as unknown as typeof fullSchema;
  const roleColumn = new Map<unknown, string>(roles.map(([role, , column]) => [role, column]));
  const tagColumn = new Map<unknown, string>(tagColumns.map(([tag, , column]) => [tag, column]));
  const columnOf = (path: readonly PropertyKey[]) => (path[0] === "tags" ? tagColumn.get(path[1]) : roleColumn.get(path[0]));

  return (row) => {
    const input: Record<string, unknown> = {};
    for (const [role, key] of roles) input[role] = row.cells[key] ?? "";
    if (tagColumns.length > 0) {
      const tags: Record<string, string> = {};
      for (const [tag, key] of tagColumns) tags[tag] = row.cells[key] ?? "";
      input.tags = tags;
    }
    const parsed = schema.safeParse(input);
    if (!parsed.success) {
      return {
        ok: false,
        problems: parsed.error.issues.map((issue) => ({
          line: row.line,
          column: columnOf(issue.path),
          message: issue.message,
        })),
      };
    }
    // zod's output is a fresh object owned here: completing it in place saves two objects per row.
    const fields = parsed.data as { -readonly [Key in keyof TParsedRow]: TParsedRow[Key] };
    fields.line = row.line;
    fields.tags = fields.tags === undefined ? NO_TAGS : Object.fromEntries(Object.entries(fields.tags).filter(([, value]) => value !== ""));
    return { ok: true, row: fields };
  };
}
