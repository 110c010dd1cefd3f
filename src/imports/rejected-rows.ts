/**
 * The rejected-rows file of a "valid rows only" import: the rejected rows as they were written, in the
 * file's own separator, under the file's header plus two columns, `line` (where the row stood) and
 * `reason`. It is kept beside the database file, in `imports/<batch id>-rejected.csv`, so it can be
 * downloaded later; fixing the rows and importing this file again works, as extra columns are ignored.
 */
import { mkdir, readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import Papa from "papaparse";
import type { TRejectedRow } from "./assemble";

export function rejectedRowsPath(databaseFile: string, batchId: number): string {
  return path.join(path.dirname(databaseFile), "imports", `${batchId}-rejected.csv`);
}

/** The rejected rows as CSV text (CRLF line ends, as spreadsheet programs write). */
export function rejectedRowsCsv(header: readonly string[], separator: string, rows: readonly TRejectedRow[]): string {
  const sorted = [...rows].sort((first, second) => first.line - second.line);
  const reasons = (row: TRejectedRow) =>
    row.problems.map((problem) => (problem.column === undefined ? problem.message : `column "${problem.column}": ${problem.message}`)).join("; ");
  return Papa.unparse(
    {
      fields: [...header, "line", "reason"],
      data: sorted.map((row) => [...header.map((_, index) => row.written[index] ?? ""), String(row.line), reasons(row)]),
    },
    { delimiter: separator, newline: "\r\n" },
  );
}

export async function writeRejectedRows(databaseFile: string, batchId: number, csv: string): Promise<void> {
  const file = rejectedRowsPath(databaseFile, batchId);
  await mkdir(path.dirname(file), { recursive: true });
  await writeFile(file, csv, "utf8");
}

/** The stored file's text, or undefined when the batch has none. */
export async function readRejectedRows(databaseFile: string, batchId: number): Promise<string | undefined> {
  return readFile(rejectedRowsPath(databaseFile, batchId), "utf8").catch((error: NodeJS.ErrnoException) => {
    if (error.code === "ENOENT") return undefined;
    throw error;
  });
}
