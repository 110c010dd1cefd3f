/**
 * CSV text → chart data for one chart type, with every problem named by line and column.
 *
 * Checks beyond single cells: required columns present; subgroup ids contiguous (a subgroup's rows
 * together, ids in order of appearance); equal subgroup sizes where the chart needs them (X-bar charts,
 * whose R and S limits use one n; np, whose limits use one sample size); X-bar subgroups of 2 to 25
 * values (the range of the tabulated constants); at least as many subgroups as the engine needs to
 * estimate limits (MINIMUM_BASELINE_SUBGROUPS: two, the least from which a moving range or a spread can
 * be formed; the analysis adds a note below 20, the common-practice minimum).
 */
import type { z } from "zod";
import type { ChartType } from "../../../shared/constants";
import type { ChartData } from "../../spc/types";
import { CsvInputError, plural, type CsvProblem } from "./errors";
import { MINIMUM_BASELINE_SUBGROUPS } from "../../spc/charts";
import { attributesData, individualsData, subgroupCount, variablesData } from "../../spc/data";
import { readCsvTable, type CsvRow, type CsvTable } from "./read-table";
import { CHART_INPUT_LAYOUT, LAYOUT_COLUMNS, rowSchemas, type InputLayout } from "./row-schemas";

/** Subgroup sizes the X-bar chart constants are defined for. */
export const SUBGROUP_SIZE_RANGE = { min: 2, max: 25 } as const;

export interface ChartCsvOptions {
  /** Expected rows per subgroup (X-bar charts); every subgroup must have exactly this many. */
  readonly subgroupSize?: number;
}

export interface ChartInput {
  readonly data: ChartData;
  /** One label per subgroup: the subgroup id, or the timestamp when the file has one; else undefined. */
  readonly labels?: readonly string[];
}

/** Parses CSV text for `chart`; throws CsvInputError listing every problem found. */
export function parseChartCsv(text: string, chart: ChartType, options: ChartCsvOptions = {}): ChartInput {
  const table = readCsvTable(text);
  const layout = CHART_INPUT_LAYOUT[chart];
  requireColumns(table, layout, chart);
  if (table.rows.length === 0) throw new CsvInputError([{ line: table.headerLine, message: "the file has a header but no data rows" }]);
  const input = buildInput(table, layout, chart, options);
  const count = subgroupCount(input.data);
  const minimum = MINIMUM_BASELINE_SUBGROUPS;
  if (count < minimum) {
    const unit = layout === "subgroups" ? "subgroup" : "row";
    throw new CsvInputError([
      { line: table.headerLine, message: `the ${chart} chart needs at least ${plural(minimum, unit)} of data; the file has ${count}` },
    ]);
  }
  return input;
}

function requireColumns(table: CsvTable, layout: InputLayout, chart: ChartType): void {
  const present = new Set(table.columns.map((name) => name.toLowerCase()));
  const missing = LAYOUT_COLUMNS[layout].required.filter((name) => !present.has(name));
  if (missing.length === 0) return;
  const expected = LAYOUT_COLUMNS[layout].required.join(table.separator);
  throw new CsvInputError(
    missing.map((name) => ({
      line: table.headerLine,
      column: name,
      message: `missing column: the ${chart} chart reads the columns ${expected} (the header has ${table.columns.join(table.separator)})`,
    })),
  );
}

/** Validates every row (collecting all problems) and returns the parsed rows. */
function validateRows<Row>(rows: readonly CsvRow[], schema: z.ZodType<Row>, problems: CsvProblem[]): { line: number; row: Row }[] {
  const parsed: { line: number; row: Row }[] = [];
  for (const { line, cells } of rows) {
    const result = schema.safeParse(cells);
    if (result.success) parsed.push({ line, row: result.data });
    else for (const issue of result.error.issues) problems.push({ line, column: String(issue.path[0]), message: issue.message });
  }
  return parsed;
}

function buildInput(table: CsvTable, layout: InputLayout, chart: ChartType, options: ChartCsvOptions): ChartInput {
  const schemas = rowSchemas(table.separator === ";");
  const problems: CsvProblem[] = [];
  // Chart data are built only from a file without problems (the builders reject empty data).
  const finish = (build: () => ChartInput): ChartInput => {
    if (problems.length > 0) throw new CsvInputError(problems);
    return build();
  };
  switch (layout) {
    case "values": {
      const rows = validateRows(table.rows, schemas.values, problems);
      const timestamps = rows.map(({ row }) => row.timestamp ?? "");
      const labels = timestamps.some((stamp) => stamp !== "") ? timestamps : undefined;
      return finish(() => ({ data: individualsData(rows.map(({ row }) => row.value)), labels }));
    }
    case "subgroups": {
      const rows = validateRows(table.rows, schemas.subgroups, problems);
      const groups = groupRows(rows, problems);
      checkSubgroupSizes(groups, chart, options.subgroupSize, problems);
      return finish(() => ({ data: variablesData(groups.map((group) => group.values)), labels: groups.map((group) => group.id) }));
    }
    case "defectives": {
      const rows = validateRows(table.rows, schemas.defectives, problems);
      if (chart === "np") checkEqualSizes(rows.map(({ line, row }) => ({ line, size: row.size })), problems);
      return finish(() => ({ data: attributesData(rows.map(({ row }) => row.defectives), rows.map(({ row }) => row.size)) }));
    }
    case "defects": {
      const rows = validateRows(table.rows, schemas.defects, problems);
      return finish(() => ({ data: attributesData(rows.map(({ row }) => row.count)) }));
    }
    case "defects-per-unit": {
      const rows = validateRows(table.rows, schemas["defects-per-unit"], problems);
      return finish(() => ({ data: attributesData(rows.map(({ row }) => row.count), rows.map(({ row }) => row.units)) }));
    }
  }
}

interface SubgroupRows {
  readonly id: string;
  readonly line: number;
  readonly values: number[];
}

/** Gathers consecutive rows with one id into a subgroup; an id that comes back after another is an error. */
function groupRows(rows: readonly { line: number; row: { subgroup: string; value: number } }[], problems: CsvProblem[]): SubgroupRows[] {
  const groups: SubgroupRows[] = [];
  const firstLine = new Map<string, number>();
  for (const { line, row } of rows) {
    const current = groups.at(-1);
    if (current !== undefined && current.id === row.subgroup) {
      current.values.push(row.value);
      continue;
    }
    const earlier = firstLine.get(row.subgroup);
    if (earlier !== undefined) {
      problems.push({
        line,
        column: "subgroup",
        message: `subgroup "${row.subgroup}" started on line ${earlier} and reappears after another subgroup: keep a subgroup's rows together`,
      });
      continue;
    }
    firstLine.set(row.subgroup, line);
    groups.push({ id: row.subgroup, line, values: [row.value] });
  }
  return groups;
}

function checkSubgroupSizes(groups: readonly SubgroupRows[], chart: ChartType, expected: number | undefined, problems: CsvProblem[]): void {
  const size = expected ?? groups[0]?.values.length;
  if (size === undefined) return;
  const { min, max } = SUBGROUP_SIZE_RANGE;
  if (expected === undefined && (size < min || size > max)) {
    problems.push({ line: groups[0]?.line ?? 1, column: "subgroup", message: `the ${chart} chart needs ${min} to ${max} values per subgroup; subgroup "${groups[0]?.id}" has ${size}` });
    return;
  }
  for (const group of groups) {
    if (group.values.length !== size) {
      const source = expected === undefined ? `the first subgroup has ${size}` : `--subgroup-size is ${size}`;
      problems.push({
        line: group.line,
        column: "subgroup",
        message: `subgroup "${group.id}" has ${plural(group.values.length, "value")}; the ${chart} chart needs equal subgroup sizes and ${source}`,
      });
    }
  }
}

function checkEqualSizes(rows: readonly { line: number; size: number }[], problems: CsvProblem[]): void {
  const first = rows[0];
  for (const { line, size } of rows) {
    if (first !== undefined && size !== first.size) {
      problems.push({ line, column: "size", message: `sample size ${size} differs from the first row's ${first.size}: the np chart needs one sample size (use the p chart for varying sizes)` });
    }
  }
}
