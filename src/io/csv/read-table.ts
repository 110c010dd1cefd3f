/**
 * Splits CSV text into a header and rows of trimmed cells, each row keeping its line number in the file.
 *
 * Accepted: a UTF-8 byte-order mark, LF or CRLF line ends, comma or semicolon separators. The separator is
 * taken from the header line (semicolon when it has semicolons and no commas), so a data cell can never
 * change it. Under semicolons a decimal comma is allowed in numbers; under commas it is not, and "1,5"
 * in a one-column file shows up as a row with too many cells rather than being misread.
 * Blank lines are skipped. Parsing itself is done by papaparse (quotes, escaped quotes, line ends).
 */
import Papa from "papaparse";
import { CsvInputError, plural, type CsvProblem } from "./errors";

export type CsvSeparator = "," | ";";

export interface CsvRow {
  /** Line number in the file where the row starts (the header is line 1). */
  readonly line: number;
  /** Cells by lower-case column name, trimmed. */
  readonly cells: Readonly<Record<string, string>>;
}

export interface CsvTable {
  readonly separator: CsvSeparator;
  /** Column names as written (trimmed), in order. */
  readonly columns: readonly string[];
  /** Line number of the header row (1 unless blank lines come first). */
  readonly headerLine: number;
  readonly rows: readonly CsvRow[];
}

export const BYTE_ORDER_MARK = "\uFEFF";

/** The separator the header line uses. */
export function detectSeparator(text: string): CsvSeparator {
  const headerLine = text.split(/\r?\n/, 1)[0] ?? "";
  return headerLine.includes(";") && !headerLine.includes(",") ? ";" : ",";
}

/** Reads CSV text into rows; throws CsvInputError listing every structural problem. */
export function readCsvTable(source: string): CsvTable {
  const text = source.startsWith(BYTE_ORDER_MARK) ? source.slice(1) : source;
  const separator = detectSeparator(text);
  const problems: CsvProblem[] = [];
  const rows: CsvRow[] = [];
  let header: string[] | undefined;
  let makeRow: ReturnType<typeof createRowMaker> | undefined;
  let headerLine = 1;
  // papaparse reports where each row ends; counting line breaks up to a row's start gives its line
  // number even when a quoted cell spans lines.
  let rowStart = 0;
  let line = 1;
  Papa.parse<string[]>(text, {
    delimiter: separator,
    header: false,
    skipEmptyLines: false,
    step: (result) => {
      const cells = result.data.map((cell) => cell.trim());
      for (const error of result.errors) problems.push({ line, message: describeParseError(error) });
      if (cells.some((cell) => cell !== "")) {
        if (makeRow === undefined) {
          header = readHeader(cells, line, problems);
          makeRow = createRowMaker(header, separator);
          headerLine = line;
        } else rows.push(makeRow(cells, line, problems));
      }
      const rowEnd = result.meta.cursor;
      for (let position = rowStart; position < rowEnd; position += 1) if (text[position] === "\n") line += 1;
      rowStart = rowEnd;
    },
  });
  if (header === undefined) throw new CsvInputError([{ line: 1, message: "the file is empty: a header row is required" }]);
  if (problems.length > 0) throw new CsvInputError(problems);
  return { separator, columns: header, headerLine, rows };
}

export function describeParseError(error: Papa.ParseError): string {
  if (error.code === "MissingQuotes") return "a quoted cell is not closed";
  if (error.code === "InvalidQuotes") return "a quote character inside an unquoted cell";
  return error.message;
}

export function readHeader(cells: string[], line: number, problems: CsvProblem[]): string[] {
  const seen = new Set<string>();
  cells.forEach((name, position) => {
    const key = name.toLowerCase();
    if (name === "") problems.push({ line, message: `column ${position + 1} of the header has no name` });
    else if (seen.has(key)) problems.push({ line, message: `column "${name}" appears twice in the header` });
    seen.add(key);
  });
  return cells;
}

/**
 * Turns a data row's trimmed cells into a CsvRow for this header, reporting a wrong number of cells into
 * `problems`. The header's lower-case names are taken once per file: this runs once per row of a
 * million-row import.
 */
export function createRowMaker(header: readonly string[], separator: CsvSeparator) {
  const keys = header.map((name) => name.toLowerCase());
  return (cells: readonly string[], line: number, problems: CsvProblem[]): CsvRow => {
    if (cells.length !== header.length) {
      const hint =
        separator === "," && cells.length > header.length
          ? " (with comma-separated columns a decimal comma is not allowed: write 1.5, or separate the columns with semicolons)"
          : "";
      problems.push({ line, message: `expected ${plural(header.length, "cell")} (${header.join(separator)}), found ${cells.length}${hint}` });
    }
    const named: Record<string, string> = {};
    for (let position = 0; position < keys.length; position++) named[keys[position]!] = cells[position] ?? "";
    return { line, cells: named };
  };
}
