/**
 * Streams a CSV file into rows without holding the file in memory: bytes are hashed (SHA-256) and
 * decoded as UTF-8 chunk by chunk, the header line picks the separator (the command-line reader's
 * `detectSeparator`), and papaparse parses the rest as a Node stream, one row at a time. The header and
 * row checks are the command-line reader's own (`readHeader`, `createRowMaker`, `describeParseError`), so a file
 * is read the same way by `analyze` and by the import.
 *
 * Line numbers count physical lines from 1 (the header is line 1 unless blank lines come first). Every
 * line yields one papaparse row (blank lines yield an empty row, skipped), and a quoted cell spanning lines
 * holds its line breaks, so the next row starts 1 + (line breaks inside the cells) lines further on.
 */
import { createHash } from "node:crypto";
import { Readable } from "node:stream";
import Papa from "papaparse";
import type { CsvProblem } from "@/src/io/csv/errors";
import { BYTE_ORDER_MARK, createRowMaker, describeParseError, detectSeparator, readHeader, type CsvRow, type CsvSeparator } from "@/src/io/csv/read-table";

export interface TStreamedRow {
  readonly row: CsvRow;
  /** The cells as written (untrimmed), for the rejected-rows file. */
  readonly written: readonly string[];
  /** Problems of the row's shape (unclosed quote, wrong number of cells). */
  readonly problems: readonly CsvProblem[];
}

export interface TStreamHandlers {
  /** The header row; problems with it (empty or repeated names) are reported through `problems`. */
  onHeader(columns: readonly string[], line: number, separator: CsvSeparator, problems: readonly CsvProblem[]): void;
  onRow(streamed: TStreamedRow): void;
  onProgress?(progress: { readonly bytesRead: number; readonly rowsRead: number }): void;
}

export interface TStreamSummary {
  /** SHA-256 of the file's bytes, hex. */
  readonly fileHash: string;
  readonly bytesRead: number;
  /** Data rows read (blank lines not counted). */
  readonly rowsRead: number;
  /** Problems of the whole file (empty, not UTF-8); row problems go to the handlers. */
  readonly problems: readonly CsvProblem[];
}

const NO_ERRORS: readonly Papa.ParseError[] = [];

function countLineBreaks(cells: readonly string[]): number {
  let breaks = 0;
  for (const cell of cells) for (let index = cell.indexOf("\n"); index !== -1; index = cell.indexOf("\n", index + 1)) breaks += 1;
  return breaks;
}

export async function streamCsvRows(source: AsyncIterable<Uint8Array>, handlers: TStreamHandlers): Promise<TStreamSummary> {
  const hash = createHash("sha256");
  const problems: CsvProblem[] = [];
  let bytesRead = 0;
  let rowsRead = 0;
  let line = 1;

  // Decoded text, BOM removed; stops (with a problem naming its line) at the first bytes that are not UTF-8.
  async function* text(): AsyncGenerator<string> {
    const decoder = new TextDecoder("utf-8", { fatal: true, ignoreBOM: true });
    let first = true;
    let linesDecoded = 1;
    for await (const chunk of source) {
      hash.update(chunk);
      bytesRead += chunk.byteLength;
      let decoded: string;
      try {
        decoded = decoder.decode(chunk, { stream: true });
      } catch (error) {
        if (!(error instanceof TypeError)) throw error;
        const lossy = new TextDecoder("utf-8").decode(chunk);
        const line = linesDecoded + countLineBreaks([lossy.slice(0, Math.max(0, lossy.indexOf("\uFFFD")))]);
        problems.push({ line, message: "the file is not UTF-8 text from here on: save it as UTF-8 (CSV UTF-8) and import it again" });
        return;
      }
      if (first && decoded.length > 0) {
        if (decoded.startsWith(BYTE_ORDER_MARK)) decoded = decoded.slice(1);
        first = false;
      }
      linesDecoded += countLineBreaks([decoded]);
      if (decoded.length > 0) yield decoded;
      handlers.onProgress?.({ bytesRead, rowsRead });
    }
    const rest = decoder.decode();
    if (rest.length > 0) yield rest;
  }

  // The separator comes from the header line, so the text is read up to the first line break first.
  const chunks = text()[Symbol.asyncIterator]();
  let head = "";
  for (;;) {
    if (head.includes("\n")) break;
    const next = await chunks.next();
    if (next.done === true) break;
    head += next.value;
  }
  const separator = detectSeparator(head);
  async function* whole(): AsyncGenerator<string> {
    if (head.length > 0) yield head;
    for (let next = await chunks.next(); next.done !== true; next = await chunks.next()) yield next.value;
  }

  let makeRow: ReturnType<typeof createRowMaker> | undefined;
  const readRow = (written: string[], errors: readonly Papa.ParseError[]) => {
    const cells = written.map((cell) => cell.trim());
    const rowLine = line;
    line += 1 + countLineBreaks(written);
    if (!cells.some((cell) => cell !== "")) return;
    const rowProblems: CsvProblem[] = errors.map((error) => ({ line: rowLine, message: describeParseError(error) }));
    if (makeRow === undefined) {
      const header = readHeader(cells, rowLine, rowProblems);
      makeRow = createRowMaker(header, separator);
      handlers.onHeader(header, rowLine, separator, rowProblems);
      return;
    }
    rowsRead += 1;
    handlers.onRow({ row: makeRow(cells, rowLine, rowProblems), written, problems: rowProblems });
  };
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(Readable.from(whole()), {
      delimiter: separator,
      header: false,
      skipEmptyLines: false,
      // Whole parsed chunks rather than one callback per row: papaparse's per-row result objects cost more
      // than the rows themselves on large files. Errors carry their row's index within the chunk.
      chunk: (result) => {
        const errorsByRow = new Map<number, Papa.ParseError[]>();
        for (const error of result.errors) errorsByRow.set(error.row ?? -1, [...(errorsByRow.get(error.row ?? -1) ?? []), error]);
        result.data.forEach((written, index) => readRow(written, errorsByRow.get(index) ?? NO_ERRORS));
      },
      complete: () => resolve(),
      error: (error: Error) => reject(error),
    });
  });
  if (makeRow === undefined && problems.length === 0) problems.push({ line: 1, message: "the file is empty: a header row is required" });
  handlers.onProgress?.({ bytesRead, rowsRead });
  return { fileHash: hash.digest("hex"), bytesRead, rowsRead, problems };
}
