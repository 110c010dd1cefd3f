/**
 * Browser-side first look at a chosen file: the first rows as papaparse reads them, the separator (from
 * the header line, exactly as the server decides it), the decimal mark that follows from it, and a
 * column mapping guessed from the header names for the person to confirm.
 */
import Papa from "papaparse";
import type { ChartType } from "@/shared/constants";
import { BYTE_ORDER_MARK, detectSeparator, type CsvSeparator } from "@/src/io/csv/read-table";
import { measurementRolesFor, type TColumnMapping, type TColumnRole } from "@/src/imports/options";

/** Bytes read for the preview: enough for the header and ten rows of any sensible file. */
const PREVIEW_BYTES = 64 * 1024;
export const PREVIEW_ROWS = 10;

export interface TFilePreview {
  readonly separator: CsvSeparator;
  readonly decimalMark: "." | ",";
  /** Whether a decimal comma was seen in the preview rows (only possible with semicolons). */
  readonly decimalCommaSeen: boolean;
  readonly header: readonly string[];
  readonly rows: readonly (readonly string[])[];
}

export async function previewFile(file: File): Promise<TFilePreview> {
  let text = await file.slice(0, PREVIEW_BYTES).text();
  if (text.startsWith(BYTE_ORDER_MARK)) text = text.slice(1);
  const separator = detectSeparator(text);
  const parsed = Papa.parse<string[]>(text, { delimiter: separator, preview: PREVIEW_ROWS + 1, skipEmptyLines: "greedy" });
  const [header = [], ...rows] = parsed.data;
  const decimalCommaSeen = separator === ";" && rows.some((row) => row.some((cell) => /^\s*[+-]?\d+,\d+\s*$/.test(cell)));
  return { separator, decimalMark: separator === ";" ? "," : ".", decimalCommaSeen, header: header.map((name) => name.trim()), rows };
}

const ROLE_NAMES: Record<TColumnRole, RegExp> = {
  timestamp: /^(timestamp|time|date|date ?time|measured ?at|checked ?at|when)$/i,
  subgroup: /^(subgroup|subgroup ?id|sample|sample ?id|group)$/i,
  value: /^(value|measurement|reading|result|x)$/i,
  count: /^(count|defects|defectives|nonconforming)$/i,
  size: /^(size|sample ?size|inspected|n)$/i,
  units: /^(units|inspection ?units)$/i,
};

/** Tag names offered for columns with common stratification names. */
const TAG_NAMES = /^(cavity|lot|operator|shift|machine|line|gauge|mould|mold|nozzle|crew)$/i;

/** A lower-case tag name for a column name: "Resin lot" → "resin-lot". */
export function tagNameFor(column: string): string {
  const slug = column.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "");
  return /^[a-z]/.test(slug) ? slug.slice(0, 40) : `tag-${slug}`.slice(0, 40);
}

/** The mapping guessed from the header: roles by name, tags for columns with common tag names. */
export function guessMapping(header: readonly string[], chart: ChartType, subgroupSize: number): TColumnMapping {
  const wanted: TColumnRole[] = ["timestamp", ...measurementRolesFor(chart)];
  if (subgroupSize > 1 || chart === "xbar-r" || chart === "xbar-s") wanted.push("subgroup");
  const find = (role: TColumnRole) => header.find((name) => ROLE_NAMES[role].test(name.trim()));
  const mapping: Record<string, unknown> = { timestamp: find("timestamp") ?? "" };
  for (const role of wanted) {
    const column = find(role);
    if (column !== undefined) mapping[role] = column;
  }
  const taken = new Set(Object.values(mapping));
  const tags = header.filter((name) => !taken.has(name) && TAG_NAMES.test(name.trim())).map((column) => ({ column, tag: tagNameFor(column) }));
  return { ...(mapping as Pick<TColumnMapping, "timestamp">), tags };
}
