/**
 * Rows → subgroups, in file order. Rows sharing a subgroup id and standing together form one subgroup
 * (without a subgroup column every row is one subgroup); each finished subgroup is checked with the
 * shared chart rules `subgroupProblems` (the rules `subgroupSchemaFor` applies for the HTTP API and manual
 * entry: sizes against the characteristic, counts within sizes), its tags must agree across its rows, and
 * its time must not go back before the previous accepted subgroup's. A subgroup with any bad row is
 * rejected as a whole. The rules are called directly rather than through the whole subgroup schema: every
 * field it would check again has already passed zod in the row reader (finite numbers, whole non-negative
 * counts, positive sizes and units, tag values; tag names and their number in the import options), and the
 * time is a parsed instant, so a second zod parse per subgroup would only repeat those checks at a cost
 * close to the row checks themselves.
 *
 * Source key (what makes a re-import add nothing): the subgroup's content itself, not a digest of it:
 * "csv:<time in epoch ms>:<numbers>:<occurrence>:<subgroup id>", where the numbers are the values
 * joined by commas, or "count/size/units", and the occurrence counts identical subgroups at the same time
 * earlier in the file (two equal readings in one minute stay two points). The first three fields cannot
 * hold ":", so the id, last, makes the key unambiguous; the key is exact (no collisions) and costs no
 * hashing (a SHA-256 per subgroup cost as much as a quarter of the bare insert). Numbers are keyed as
 * parsed, so the same readings exported again with another separator or decimal mark are recognised; tags
 * are not part of the key, so renaming a tag in a re-export does not duplicate measurements.
 */
import { VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import { subgroupProblems, ZTimestamp } from "@/shared/intake";
import type { CsvProblem } from "@/src/io/csv/errors";
import type { TRecorded } from "@/src/subgroups/summaries";
import type { TColumnMapping } from "./options";
import type { TParsedRow } from "./rows";

export interface TImportRow {
  readonly line: number;
  /** The subgroup id cell (trimmed), when a subgroup column is mapped. */
  readonly label?: string;
  readonly written: readonly string[];
  /** Undefined when the row failed its own checks (then `problems` says why). */
  readonly parsed?: TParsedRow;
  readonly problems: readonly CsvProblem[];
}

export interface TAssembledSubgroup {
  readonly firstLine: number;
  readonly rows: readonly TImportRow[];
  /** Milliseconds since the epoch. */
  readonly timestamp: number;
  readonly recorded: TRecorded;
  readonly tags: Readonly<Record<string, string>>;
  readonly sourceKey: string;
}

/** A rejected row with the reasons it was rejected. */
export interface TRejectedRow {
  readonly line: number;
  readonly written: readonly string[];
  readonly problems: readonly CsvProblem[];
}

export interface TAssemblerOutput {
  accepted(subgroup: TAssembledSubgroup): void;
  rejected(rows: readonly TRejectedRow[]): void;
}

/** The first and last milliseconds of the years 0000-9999. */
const FIRST_INSTANT = Date.parse("0000-01-01T00:00:00.000Z");
const LAST_INSTANT = Date.parse("9999-12-31T23:59:59.999Z");

export function createAssembler(mapping: TColumnMapping, chart: ChartType, subgroupSize: number, output: TAssemblerOutput) {
  const variables = VARIABLES_CHART_TYPES.includes(chart);
  const firstLineOf = new Map<string, number>();
  const fieldColumn: Partial<Record<string, string>> = {
    timestamp: mapping.timestamp,
    values: mapping.value,
    count: mapping.count,
    size: mapping.size,
    units: mapping.units,
  };
  let pending: TImportRow[] = [];
  let previousTime = -Infinity;
  // Identical subgroups accepted earlier at the same time, by "<numbers>:<subgroup id>"; built only when a
  // time repeats (from the previous subgroup's key), so a file of distinct times pays no map operations.
  let occurrences: Map<string, number> | undefined;
  let previousNumbers = "";
  let previousLabel = "";

  function reject(rows: readonly TImportRow[], problems: readonly CsvProblem[]): void {
    const byLine = new Map<number, CsvProblem[]>();
    for (const problem of problems) byLine.set(problem.line, [...(byLine.get(problem.line) ?? []), problem]);
    const label = rows[0]?.label;
    const badLines = [...byLine.keys()].sort((a, b) => a - b);
    output.rejected(
      rows.map((row) => ({
        line: row.line,
        written: row.written,
        problems: byLine.get(row.line) ?? [
          { line: row.line, message: `rejected with subgroup "${label ?? ""}", which has a problem on line ${badLines.join(", ")}` },
        ],
      })),
    );
  }

  /** A subgroup field's problem, reported on the subgroup's first line in the field's column. */
  function subgroupProblem(rows: readonly TImportRow[], field: string, message: string): CsvProblem {
    const first = rows[0] as TImportRow;
    const what = variables && field === "values" ? `subgroup "${first.label ?? ""}" (${rows.length} rows): values ` : `${field} `;
    return { line: first.line, column: fieldColumn[field] ?? mapping.subgroup, message: `${what}${message}` };
  }

  function finish(rows: TImportRow[]): void {
    const first = rows[0];
    if (first === undefined) return;
    if (rows.some((row) => row.problems.length > 0)) return reject(rows, rows.flatMap((row) => row.problems));
    const head = first.parsed as TParsedRow;
    const problems: CsvProblem[] = [];
    if (!variables && rows.length > 1) {
      for (const row of rows.slice(1)) {
        problems.push({ line: row.line, column: mapping.subgroup, message: `subgroup "${first.label ?? ""}" has ${rows.length} rows: a ${chart} chart takes one row per subgroup` });
      }
    }
    for (let index = 1; index < rows.length; index += 1) {
      const row = rows[index]?.parsed as TParsedRow;
      for (const tag of new Set([...Object.keys(head.tags), ...Object.keys(row.tags)])) {
        if (head.tags[tag] !== row.tags[tag]) {
          const column = mapping.tags.find((entry) => entry.tag === tag)?.column;
          problems.push({
            line: row.line,
            column,
            message: `tag "${tag}" is "${row.tags[tag] ?? ""}" here but "${head.tags[tag] ?? ""}" on line ${head.line}: the rows of one subgroup share their tags`,
          });
        }
      }
    }
    const recorded: TRecorded = variables
      ? { values: rows.length === 1 ? [head.value as number] : rows.map((row) => row.parsed?.value as number) }
      : { count: head.count, size: head.size, units: head.units };
    for (const { path, message } of subgroupProblems(chart, subgroupSize, recorded)) problems.push(subgroupProblem(rows, path, message));
    // ZTimestamp accepts every instant of the years 0000-9999 (as toISOString writes them); only a time
    // outside them (a year-0000 reading at an offset east of UTC) needs its check.
    if (head.timestamp < FIRST_INSTANT || head.timestamp > LAST_INSTANT) {
      const time = ZTimestamp.safeParse(new Date(head.timestamp).toISOString());
      if (!time.success) for (const issue of time.error.issues) problems.push(subgroupProblem(rows, "timestamp", issue.message));
    }
    if (head.timestamp < previousTime) {
      problems.push({
        line: first.line,
        column: mapping.timestamp,
        message: `${new Date(head.timestamp).toISOString()} is before the previous subgroup's ${new Date(previousTime).toISOString()}: rows must be in time order`,
      });
    }
    if (problems.length > 0) return reject(rows, problems);

    const numbers = variables ? (recorded.values ?? []).join(",") : `${recorded.count}/${recorded.size ?? ""}/${recorded.units ?? ""}`;
    const label = first.label ?? "";
    let occurrence = 0;
    if (head.timestamp === previousTime) {
      occurrences ??= new Map([[`${previousNumbers}:${previousLabel}`, 1]]);
      const key = `${numbers}:${label}`;
      occurrence = occurrences.get(key) ?? 0;
      occurrences.set(key, occurrence + 1);
    } else occurrences = undefined;
    previousTime = head.timestamp;
    previousNumbers = numbers;
    previousLabel = label;
    const sourceKey = `csv:${head.timestamp}:${numbers}:${occurrence}:${label}`;
    output.accepted({ firstLine: first.line, rows, timestamp: head.timestamp, recorded, tags: head.tags, sourceKey });
  }

  return {
    push(row: TImportRow): void {
      const current = pending[0];
      const together = mapping.subgroup !== undefined && current !== undefined && row.label === current.label;
      if (together) {
        pending.push(row);
        return;
      }
      finish(pending);
      pending = [row];
      if (mapping.subgroup === undefined || row.label === undefined || row.label === "") return;
      const earlier = firstLineOf.get(row.label);
      if (earlier !== undefined) {
        const problem = { line: row.line, column: mapping.subgroup, message: `subgroup "${row.label}" started on line ${earlier} and reappears after another subgroup: keep a subgroup's rows together` };
        pending = [{ ...row, problems: [...row.problems, problem] }];
      } else firstLineOf.set(row.label, row.line);
    },
    end(): void {
      finish(pending);
      pending = [];
    },
  };
}
