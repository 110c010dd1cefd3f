/**
 * CSV → chart data: accepted variants (BOM, CRLF, semicolons with decimal commas) and malformed files,
 * each rejected with every problem named by line (header = line 1) and column.
 */
import { describe, expect, test } from "vitest";
import { CsvInputError, MAX_PROBLEMS_SHOWN, parseChartCsv, type CsvProblem } from "@/src/io/csv";
import type { ChartType } from "@/shared/constants";

function problemsOf(text: string, chart: ChartType, subgroupSize?: number): readonly CsvProblem[] {
  try {
    parseChartCsv(text, chart, { subgroupSize });
  } catch (error) {
    if (error instanceof CsvInputError) return error.problems;
    throw error;
  }
  throw new Error("the file was accepted");
}

const valuesOf = (text: string, chart: ChartType) => {
  const { data } = parseChartCsv(text, chart);
  return data.kind === "variables" ? Array.from(data.values) : Array.from(data.counts);
};

describe("accepted variants", () => {
  test("a UTF-8 byte-order mark before the header is ignored", () => {
    expect(valuesOf("\uFEFFvalue\n1.5\n2.5\n", "imr")).toEqual([1.5, 2.5]);
  });

  test("CRLF line ends", () => {
    expect(valuesOf("value\r\n1.5\r\n2.5\r\n", "imr")).toEqual([1.5, 2.5]);
  });

  test("semicolons with decimal commas, BOM and CRLF together", () => {
    const input = parseChartCsv("\uFEFFsubgroup;value\r\nA;1,5\r\nA;2,5\r\nB;3\r\nB;4,25\r\n", "xbar-r");
    expect(input.data.kind).toBe("variables");
    if (input.data.kind !== "variables") return;
    expect(Array.from(input.data.values)).toEqual([1.5, 2.5, 3, 4.25]);
    expect(Array.from(input.data.offsets)).toEqual([0, 2, 4]);
    expect(input.labels).toEqual(["A", "B"]);
  });

  test("semicolons also accept a decimal point", () => {
    expect(valuesOf("value;note\n1.5;a\n2,5;b\n", "imr")).toEqual([1.5, 2.5]);
  });

  test("cells and column names are trimmed, names matched without regard to case, blank lines skipped", () => {
    expect(valuesOf(" Defectives , SIZE \n 3 , 50 \n\n 4 ,50\n", "p")).toEqual([3, 4]);
  });

  test("extra columns are ignored and timestamps become labels", () => {
    const input = parseChartCsv("timestamp,value,operator\n2024-03-01T06:00,1,x\n2024-03-01T07:00,2,y\n", "imr");
    expect(input.labels).toEqual(["2024-03-01T06:00", "2024-03-01T07:00"]);
  });

  test("quoted cells with separators and line breaks keep line numbers right", () => {
    expect(problemsOf('value,note\n1,"a, b\nc"\nx,d\n', "imr")).toEqual([
      { line: 4, column: "value", message: '"x" is not a number' },
    ]);
  });

  test("u chart units may be fractional; c chart sizes are 1", () => {
    const u = parseChartCsv("count,units\n3,1.5\n2,0.5\n", "u").data;
    expect(u.kind === "attributes" && Array.from(u.sizes)).toEqual([1.5, 0.5]);
    const c = parseChartCsv("count\n3\n2\n", "c").data;
    expect(c.kind === "attributes" && Array.from(c.sizes)).toEqual([1, 1]);
  });
});

// Each malformed file with the problems it must report: [description, chart, text, expected problems].
const malformed: [string, ChartType, string, CsvProblem[]][] = [
  ["empty file", "imr", "", [{ line: 1, message: "the file is empty: a header row is required" }]],
  ["header only", "c", "count\n", [{ line: 1, message: "the file has a header but no data rows" }]],
  [
    "missing column",
    "p",
    "defectives,sample\n1,50\n",
    [{ line: 1, column: "size", message: "missing column: the p chart reads the columns defectives,size (the header has defectives,sample)" }],
  ],
  ["non-numeric cell", "imr", "value\n1\nabc\n3\n", [{ line: 3, column: "value", message: '"abc" is not a number' }]],
  ["empty cell", "imr", "value,note\n1,a\n,b\n", [{ line: 3, column: "value", message: "is empty: a number is required" }]],
  [
    "decimal comma under comma separators (unquoted)",
    "imr",
    "value\n1.5\n1,5\n",
    [
      {
        line: 3,
        message:
          "expected 1 cell (value), found 2 (with comma-separated columns a decimal comma is not allowed: write 1.5, or separate the columns with semicolons)",
      },
    ],
  ],
  [
    "decimal comma under comma separators (quoted)",
    "imr",
    'value\n1.5\n"1,5"\n',
    [{ line: 3, column: "value", message: '"1,5" is not a number (a decimal comma needs semicolon-separated columns)' }],
  ],
  ["thousands separator", "imr", "value;x\n1.234,5;a\n2;b\n", [{ line: 2, column: "value", message: '"1.234,5" is not a number' }]],
  [
    "defectives above the sample size",
    "p",
    "defectives,size\n3,50\n51,50\n",
    [{ line: 3, column: "defectives", message: "51 defectives is more than the sample size 50" }],
  ],
  ["negative count", "c", "count\n4\n-2\n", [{ line: 3, column: "count", message: "-2 is negative: a count cannot be negative" }]],
  ["fractional count", "c", "count\n4\n2.5\n", [{ line: 3, column: "count", message: "2.5 is not a whole number" }]],
  [
    "zero sample size",
    "p",
    "defectives,size\n0,0\n1,50\n",
    [{ line: 2, column: "size", message: "0 is not a valid size: it must be greater than zero" }],
  ],
  [
    "negative inspection units",
    "u",
    "count,units\n2,1\n3,-1\n",
    [{ line: 3, column: "units", message: "-1 is not a valid size: it must be greater than zero" }],
  ],
  [
    "ragged subgroups for X-bar/R",
    "xbar-r",
    "subgroup,value\n1,10\n1,11\n1,12\n2,10\n2,11\n",
    [{ line: 5, column: "subgroup", message: 'subgroup "2" has 2 values; the xbar-r chart needs equal subgroup sizes and the first subgroup has 3' }],
  ],
  [
    "a subgroup reappearing after another",
    "xbar-s",
    "subgroup,value\nA,1\nA,2\nB,3\nB,4\nA,5\n",
    [{ line: 6, column: "subgroup", message: 'subgroup "A" started on line 2 and reappears after another subgroup: keep a subgroup\'s rows together' }],
  ],
  [
    "subgroups of one value on an X-bar chart",
    "xbar-r",
    "subgroup,value\n1,10\n2,11\n",
    [{ line: 2, column: "subgroup", message: 'the xbar-r chart needs 2 to 25 values per subgroup; subgroup "1" has 1' }],
  ],
  [
    "varying sample sizes on an np chart",
    "np",
    "defectives,size\n2,50\n3,60\n",
    [{ line: 3, column: "size", message: "sample size 60 differs from the first row's 50: the np chart needs one sample size (use the p chart for varying sizes)" }],
  ],
  ["too few points for I-MR", "imr", "value\n5\n", [{ line: 1, message: "the imr chart needs at least 2 rows of data; the file has 1" }]],
  [
    "too few subgroups for X-bar/S",
    "xbar-s",
    "subgroup,value\n1,10\n1,11\n",
    [{ line: 1, message: "the xbar-s chart needs at least 2 subgroups of data; the file has 1" }],
  ],
  [
    "bad timestamp",
    "ewma",
    "value,timestamp\n1,2024-03-01\n2,01/03/2024\n",
    [{ line: 3, column: "timestamp", message: "must be an ISO 8601 date or date-time, e.g. 2024-03-01 or 2024-03-01T08:30" }],
  ],
  ["duplicate column", "imr", "value,Value\n1,2\n", [{ line: 1, message: 'column "Value" appears twice in the header' }]],
  ["unclosed quote", "imr", 'value\n1\n"2\n', [{ line: 3, message: "a quoted cell is not closed" }]],
  ["infinite value", "cusum", "value\n1\n1e999\n", [{ line: 3, column: "value", message: "\"1e999\" is too large to be a number" }]],
];

describe("malformed files", () => {
  test.each(malformed)("%s", (_description, chart, text, expected) => {
    expect(problemsOf(text, chart)).toEqual(expected);
  });

  test("--subgroup-size names every subgroup of another size", () => {
    expect(problemsOf("subgroup,value\n1,1\n1,2\n1,3\n2,1\n2,2\n2,3\n", "xbar-r", 2)).toEqual([
      { line: 2, column: "subgroup", message: 'subgroup "1" has 3 values; the xbar-r chart needs equal subgroup sizes and --subgroup-size is 2' },
      { line: 5, column: "subgroup", message: 'subgroup "2" has 3 values; the xbar-r chart needs equal subgroup sizes and --subgroup-size is 2' },
    ]);
  });

  test("every problem of every row is collected, in file order", () => {
    const problems = problemsOf("defectives,size\nx,50\n60,50\n2,y\n-1,0\n", "p");
    expect(problems.map((problem) => [problem.line, problem.column])).toEqual([
      [2, "defectives"],
      [3, "defectives"],
      [4, "size"],
      [5, "defectives"],
      [5, "size"],
    ]);
  });

  test(`the message lists the first ${MAX_PROBLEMS_SHOWN} problems and the total`, () => {
    const rows = Array.from({ length: 30 }, (_, index) => `bad${index}`).join("\n");
    let message = "";
    try {
      parseChartCsv(`value\n${rows}\n`, "imr");
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message.split("\n")[0]).toBe("The CSV file has 30 problems:");
    expect(message).toContain('line 21, column "value": "bad19" is not a number');
    expect(message).not.toContain('"bad20"');
    expect(message.split("\n").at(-1)).toBe("  ... and 10 more");
  });
});

test("attributes charts also need two samples to estimate limits", () => {
  expect(problemsOf("count\n4\n", "c")).toEqual([{ line: 1, message: "the c chart needs at least 2 rows of data; the file has 1" }]);
});
