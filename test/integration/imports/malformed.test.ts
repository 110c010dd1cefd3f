// Malformed files, each with the message it must produce (line, column, reason) and proof that nothing
// was written: every table an import touches has the same row count before and after, and no batch exists.
import { describe, expect, test } from "vitest";
import type { ChartType } from "@/shared/constants";
import type { TColumnMapping } from "@/src/imports/options";
import { createTestCharacteristic, runImport, tableCounts, openImportTestDatabase } from "./harness";

const harness = openImportTestDatabase("malformed");

const IMR = { chart: "imr" as ChartType, size: 1, mapping: { timestamp: "timestamp", value: "value", tags: [] } as TColumnMapping };
const XBAR = { chart: "xbar-r" as ChartType, size: 3, mapping: { timestamp: "timestamp", subgroup: "sample", value: "value", tags: [{ column: "cavity", tag: "cavity" }] } as TColumnMapping };
const P = { chart: "p" as ChartType, size: 500, mapping: { timestamp: "timestamp", count: "defectives", size: "inspected", tags: [] } as TColumnMapping };

const latin1 = (text: string) => Uint8Array.from([...text].map((character) => character.charCodeAt(0)));

interface MalformedCase {
  readonly name: string;
  readonly target: typeof IMR;
  readonly file: string | Uint8Array;
  readonly utcOffset?: string;
  readonly line: number;
  readonly column?: string;
  readonly message: RegExp;
}

const CASES: MalformedCase[] = [
  { name: "a word where a number belongs", target: IMR, file: "timestamp,value\n2026-03-01T06:00:00Z,18.2\n2026-03-01T07:00:00Z,abc\n", line: 3, column: "value", message: /^"abc" is not a number$/ },
  { name: "an empty value", target: IMR, file: "timestamp,value\n2026-03-01T06:00:00Z,\n", line: 2, column: "value", message: /^is empty: a number is required$/ },
  { name: "a quoted decimal comma in a comma-separated file", target: IMR, file: 'timestamp,value\n2026-03-01T06:00:00Z,"18,2"\n', line: 2, column: "value", message: /"18,2" is not a number \(a decimal comma needs semicolon-separated columns\)/ },
  { name: "an unquoted decimal comma splitting a row into too many cells", target: IMR, file: "timestamp,value\n2026-03-01T06:00:00Z,18,2\n", line: 2, message: /expected 2 cells \(timestamp,value\), found 3 \(with comma-separated columns a decimal comma is not allowed/ },
  { name: "a number too large for a double", target: IMR, file: "timestamp,value\n2026-03-01T06:00:00Z,1e999\n", line: 2, column: "value", message: /"1e999" is too large to be a number/ },
  { name: "a time without a zone and no stated offset", target: IMR, file: "timestamp,value\n2026-03-01 06:00,18.2\n", line: 2, column: "timestamp", message: /"2026-03-01 06:00" has no time zone: state the UTC offset/ },
  { name: "an ambiguous slash date", target: IMR, file: "timestamp,value\n03/04/2026 06:00,18.2\n", utcOffset: "Z", line: 2, column: "timestamp", message: /is ambiguous: it reads as 3 April \(day first\) or March 4 \(month first\)/ },
  { name: "a day that does not exist", target: IMR, file: "timestamp,value\n31.04.2026 06:00,18.2\n", utcOffset: "+01:00", line: 2, column: "timestamp", message: /names day 31 of April 2026, which has 30 days/ },
  { name: "a date without a time of day", target: IMR, file: "timestamp,value\n2026-03-01,18.2\n", line: 2, column: "timestamp", message: /is a date without a time of day/ },
  { name: "rows out of time order", target: IMR, file: "timestamp,value\n2026-03-01T07:00:00Z,18.2\n2026-03-01T06:00:00Z,18.3\n", line: 3, column: "timestamp", message: /is before the previous subgroup's .*: rows must be in time order/ },
  { name: "an unclosed quote", target: IMR, file: 'timestamp,value\n2026-03-01T06:00:00Z,"18.2\n2026-03-01T07:00:00Z,18.3\n', line: 2, message: /a quoted cell is not closed/ },
  { name: "a mapped column missing from the header", target: IMR, file: "time,value\n2026-03-01T06:00:00Z,18.2\n", line: 1, column: "timestamp", message: /the timestamp column "timestamp" is not in the header \(time, value\)/ },
  { name: "a column named twice in the header", target: IMR, file: "timestamp,value,Value\n2026-03-01T06:00:00Z,18.2,18.3\n", line: 1, message: /column "Value" appears twice in the header/ },
  { name: "an empty file", target: IMR, file: "", line: 1, message: /the file is empty: a header row is required/ },
  { name: "a header without data rows", target: IMR, file: "timestamp,value\r\n\r\n", line: 1, message: /the file has a header but no data rows/ },
  { name: "bytes that are not UTF-8 (a Latin-1 export)", target: IMR, file: latin1("timestamp,value,shift\n2026-03-01T06:00:00Z,18.2,Früh\n"), line: 2, message: /the file is not UTF-8 text from here on/ },
  { name: "a subgroup with too few values", target: XBAR, file: "timestamp,sample,value,cavity\n2026-03-01T06:00:00Z,S1,10.01,1\n2026-03-01T06:00:00Z,S1,10.02,1\n", line: 2, column: "value", message: /subgroup "S1" \(2 rows\): values must hold exactly 3 values/ },
  { name: "a subgroup whose rows come back after another subgroup", target: XBAR, file: "timestamp,sample,value,cavity\n2026-03-01T06:00:00Z,S1,10.01,1\n2026-03-01T06:00:00Z,S1,10.02,1\n2026-03-01T06:00:00Z,S1,10.0,1\n2026-03-01T07:00:00Z,S2,10.01,1\n2026-03-01T07:00:00Z,S1,10.02,1\n", line: 6, column: "sample", message: /subgroup "S1" started on line 2 and reappears after another subgroup/ },
  { name: "tags that differ within one subgroup", target: XBAR, file: "timestamp,sample,value,cavity\n2026-03-01T06:00:00Z,S1,10.01,1\n2026-03-01T06:00:00Z,S1,10.02,2\n2026-03-01T06:00:00Z,S1,10.0,1\n", line: 3, column: "cavity", message: /tag "cavity" is "2" here but "1" on line 2: the rows of one subgroup share their tags/ },
  { name: "more defectives than inspected", target: P, file: "timestamp,defectives,inspected\n2026-03-01T06:00:00Z,12,10\n", line: 2, column: "defectives", message: /count must not exceed the number inspected/ },
  { name: "a negative count", target: P, file: "timestamp,defectives,inspected\n2026-03-01T06:00:00Z,-1,500\n", line: 2, column: "defectives", message: /-1 is negative: a count cannot be negative/ },
  { name: "a fractional sample size", target: P, file: "timestamp,defectives,inspected\n2026-03-01T06:00:00Z,1,499.5\n", line: 2, column: "inspected", message: /499.5 is not a whole number/ },
  { name: "a measured-value column mapped on an attributes chart", target: { ...P, mapping: { ...P.mapping, value: "value" } }, file: "timestamp,defectives,inspected,value\n2026-03-01T06:00:00Z,1,500,3\n", line: 1, column: "value", message: /a p chart has no measured value: leave "value" unmapped/ },
  { name: "subgroups of three without a subgroup column", target: { ...XBAR, mapping: { timestamp: "timestamp", value: "value", tags: [] } }, file: "timestamp,value\n2026-03-01T06:00:00Z,10.01\n", line: 1, message: /subgroups of 3 values need a subgroup id column/ },
];

describe("malformed files are refused with a message naming line, column and reason, and write nothing", () => {
  test.each(CASES)("$name", async ({ target, file, utcOffset, line, column, message }) => {
    const id = await createTestCharacteristic(harness.prisma, target.chart, target.size);
    const before = await tableCounts(harness.prisma);
    const result = await runImport(harness, id, file, { mapping: target.mapping, ...(utcOffset === undefined ? {} : { utcOffset }) });
    expect(result.status).toBe("rejected");
    expect(result.batchId).toBeNull();
    expect(result.problems).toContainEqual(column === undefined ? expect.objectContaining({ line, message: expect.stringMatching(message) }) : { line, column, message: expect.stringMatching(message) });
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });

  test("there are at least 12 cases", () => {
    expect(CASES.length).toBeGreaterThanOrEqual(12);
  });
});
