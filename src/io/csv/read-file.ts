/** Reads a CSV file from disk as UTF-8 and parses it for a chart (the only I/O of the CSV layer). */
import { readFile } from "node:fs/promises";
import type { ChartType } from "../../../shared/constants";
import { parseChartCsv, type ChartCsvOptions, type ChartInput } from "./chart-csv";

/** The file could not be read at all (missing, unreadable, not UTF-8 text). */
export class InputFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "InputFileError";
  }
}

export async function readChartCsvFile(path: string, chart: ChartType, options: ChartCsvOptions = {}): Promise<ChartInput> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a directory" : code === "EACCES" ? "permission denied" : String(code ?? error);
    throw new InputFileError(`cannot read ${path}: ${reason}`);
  }
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new InputFileError(`cannot read ${path}: it is not UTF-8 text`);
  }
  return parseChartCsv(text, chart, options);
}
