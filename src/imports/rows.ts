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
import { createTimestampReader, type TTimestampReading } from "./timestamps";

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

/**
 * The row reader for one import: mapping, chart, decimal mark and timestamp reading fixed. Each mapped cell
 * is checked with its own zod schema; a million-row file pays for nothing it does not map (an object schema
 * over the row would build an input and an output object per row and check every absent optional field).
 */
export function createRowReader(mapping: TColumnMapping, decimalComma: boolean, reading: TTimestampReading): (row: CsvRow) => TRowResult {
  const readTimestamp = createTimestampReader(reading);
  const cellSchemas: Record<TColumnRole, z.ZodType<unknown, string>> = {
    timestamp: z.string().transform((text, context) => {
      const result = readTimestamp(text);
      if (result.ok) return result.milliseconds;
      context.addIssue(result.message);
      return z.NEVER;
    }),
    subgroup: z.string().min(1, { error: "is empty: a subgroup id is required" }),
    value: numberCell(decimalComma),
    count: countCell(decimalComma),
    size: positiveCell(decimalComma, true),
    units: positiveCell(decimalComma, false),
  };
  const tagCell = z.string().max(INTAKE_LIMITS.tagValueLength, { error: `is longer than ${INTAKE_LIMITS.tagValueLength} characters` });
  const fields = COLUMN_ROLES.flatMap((role) => {
    const column = mapping[role];
    return column === undefined ? [] : [{ role, key: column.toLowerCase(), column, schema: cellSchemas[role] }];
  });
  const tagColumns = mapping.tags.map(({ column, tag }) => ({ tag, key: column.toLowerCase(), column }));

  return (row) => {
    const fieldValues: Record<string, unknown> = { line: row.line, tags: NO_TAGS };
    let problems: CsvProblem[] | undefined;
    for (const { role, key, column, schema } of fields) {
      const result = schema.safeParse(row.cells[key] ?? "");
      if (result.success) fieldValues[role] = result.data;
      else problems = withIssues(problems, result.error.issues, row.line, column);
    }
    if (tagColumns.length > 0) {
      const tags: Record<string, string> = {};
      for (const { tag, key, column } of tagColumns) {
        const text = row.cells[key] ?? "";
        const result = tagCell.safeParse(text);
        if (!result.success) problems = withIssues(problems, result.error.issues, row.line, column);
        else if (text !== "") tags[tag] = text;
      }
      fieldValues.tags = tags;
    }
    if (problems !== undefined) return { ok: false, problems };
    return { ok: true, row: fieldValues as unknown as TParsedRow };
  };
}

/** `problems` (created on the first) with a cell's zod issues added, each naming the line and column. */
function withIssues(problems: CsvProblem[] | undefined, issues: readonly z.core.$ZodIssue[], line: number, column: string): CsvProblem[] {
  const found = problems ?? [];
  for (const issue of issues) found.push({ line, column, message: issue.message });
  return found;
}
