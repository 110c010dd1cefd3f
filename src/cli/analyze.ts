/**
 * `analyze FILE.csv --chart TYPE [options]`: charts a CSV file and reports limits, signals and
 * capability as a table for a person (`--format text`) or as the JSON contract (`--format json`,
 * shared/analyze-report.ts). Option values are checked with zod before any file is read.
 */
import { z } from "zod";
import { CHART_TYPES, type ChartType } from "../../shared/constants";
import { readChartCsvFile } from "../io/csv";
import { analyze, type AnalyzeOptions } from "../spc/analyze";
import { DEFAULT_CUSUM_DESIGN, DEFAULT_EWMA_DESIGN } from "../spc/charts";
import { formatAnalyzeText } from "./analyze-text";
import { CHART_FILE_OPTION_SCHEMAS, CHART_FILE_OPTIONS, chartFileArgument, decimalOption, refuseCrossedSpecification, valueOptions, wholeNumberOption } from "./chart-file";
import type { Command, ParsedArguments } from "./command";

const SUBGROUP_CHARTS: readonly ChartType[] = ["xbar-r", "xbar-s"];
const CAPABILITY_CHARTS: readonly ChartType[] = ["imr", "xbar-r", "xbar-s", "ewma", "cusum"];

const ZAnalyzeCommandOptions = z
  .object({
    chart: CHART_FILE_OPTION_SCHEMAS.chart,
    "subgroup-size": CHART_FILE_OPTION_SCHEMAS["subgroup-size"],
    rules: CHART_FILE_OPTION_SCHEMAS.rules,
    "force-zone-rules": z.boolean().default(false),
    baseline: wholeNumberOption.optional(),
    exclude: z
      .string()
      .transform((list) => list.split(",").map((item) => item.trim()))
      .pipe(z.array(z.string().regex(/^\d+$/, "must be a comma-separated list of 0-based subgroup numbers, e.g. 3,17").transform(Number)))
      .optional(),
    lsl: CHART_FILE_OPTION_SCHEMAS.lsl,
    usl: CHART_FILE_OPTION_SCHEMAS.usl,
    confidence: decimalOption.pipe(z.number().gt(0).lt(1)).optional(),
    target: CHART_FILE_OPTION_SCHEMAS.target,
    lambda: decimalOption.pipe(z.number().gt(0).max(1)).optional(),
    L: decimalOption.pipe(z.number().positive()).optional(),
    k: decimalOption.pipe(z.number().nonnegative()).optional(),
    h: decimalOption.pipe(z.number().positive()).optional(),
    format: CHART_FILE_OPTION_SCHEMAS.format,
  })
  .superRefine((options, context) => {
    const refuse = (path: string, message: string) => context.addIssue({ code: "custom", path: [path], message });
    const { chart } = options;
    if (options["subgroup-size"] !== undefined && !SUBGROUP_CHARTS.includes(chart)) refuse("subgroup-size", "applies to xbar-r and xbar-s only");
    if ((options.lambda !== undefined || options.L !== undefined) && chart !== "ewma") refuse(options.lambda === undefined ? "L" : "lambda", "applies to the ewma chart only");
    if ((options.k !== undefined || options.h !== undefined) && chart !== "cusum") refuse(options.k === undefined ? "h" : "k", "applies to the cusum chart only");
    if (options.target !== undefined && !CAPABILITY_CHARTS.includes(chart)) refuse("target", "applies to charts of measured values only");
    if ((options.lsl !== undefined || options.usl !== undefined) && !CAPABILITY_CHARTS.includes(chart)) {
      refuse(options.lsl === undefined ? "usl" : "lsl", "capability applies to charts of measured values (imr, xbar-r, xbar-s, ewma, cusum)");
    }
    refuseCrossedSpecification(options, context);
  });

type TAnalyzeCommandOptions = z.infer<typeof ZAnalyzeCommandOptions>;

function engineOptions(options: TAnalyzeCommandOptions, labels: readonly string[] | undefined): AnalyzeOptions {
  const { lambda, L, k, h } = options;
  return {
    rules: options.rules,
    forceZoneRules: options["force-zone-rules"],
    baseline: options.baseline,
    exclude: options.exclude,
    subgroupSize: options["subgroup-size"],
    lsl: options.lsl,
    usl: options.usl,
    confidence: options.confidence,
    target: options.target,
    ewma: lambda === undefined && L === undefined ? undefined : { ...DEFAULT_EWMA_DESIGN, ...(lambda === undefined ? {} : { lambda }), ...(L === undefined ? {} : { L }) },
    cusum: k === undefined && h === undefined ? undefined : { ...DEFAULT_CUSUM_DESIGN, ...(k === undefined ? {} : { k }), ...(h === undefined ? {} : { h }) },
    labels,
  };
}

async function run(parsed: ParsedArguments, output: { stdout: (text: string) => void }): Promise<number> {
  const file = chartFileArgument(parsed, "analyze", "analyze FILE.csv --chart TYPE");
  const options = ZAnalyzeCommandOptions.parse(parsed.values);
  const input = await readChartCsvFile(file, options.chart, { subgroupSize: options["subgroup-size"] });
  const report = analyze(options.chart, input.data, engineOptions(options, input.labels));
  output.stdout(options.format === "json" ? `${JSON.stringify(report, null, 2)}\n` : formatAnalyzeText(report));
  return 0;
}

const help = `Usage: npm run -s cli -- analyze FILE.csv --chart TYPE [options]

Charts a CSV file: limits from a baseline, run-rule signals, and capability when specification
limits are given. Subgroup numbers are 0-based positions, in text and JSON alike.

Input columns (header row required; comma or semicolon separated; with semicolons a decimal comma
is allowed):
  imr, ewma, cusum   value            (optional timestamp column, ISO 8601)
  xbar-r, xbar-s     subgroup,value   (several rows per subgroup, a subgroup's rows together)
  p, np              defectives,size
  c                  count
  u                  count,units

Options:
  --chart TYPE            ${CHART_TYPES.join(" | ")} (required)
  --subgroup-size N       xbar-r, xbar-s: every subgroup must have N values (2 to 25)
  --rules SPEC            nelson (default) | we | a list of rule ids, e.g. we-1,nelson-3
  --force-zone-rules      also apply run rules to R, S, MR, EWMA and CUSUM statistics
  --baseline K            estimate limits from the first K subgroups, apply them to all
  --exclude I,J           leave subgroups I, J (0-based, inside the baseline) out of the estimate
  --lsl X, --usl Y        specification limits: capability (measured-value charts only)
  --confidence C          confidence level of the capability intervals, 0 < C < 1 (default 0.95)
  --target X              known process centre instead of the baseline mean (measured values)
  --lambda W, --L W       ewma: weight (default ${DEFAULT_EWMA_DESIGN.lambda}) and limit width in sigmas (default ${DEFAULT_EWMA_DESIGN.L})
  --k K, --h H            cusum: reference value (default ${DEFAULT_CUSUM_DESIGN.k}) and decision interval (default ${DEFAULT_CUSUM_DESIGN.h}), in sigmas
  --format FORMAT         text (default) | json
  -h, --help              this help

Exit codes: 0 done (signals or not), 2 bad usage or input, 1 unexpected error.
`;

export const analyzeCommand: Command = {
  name: "analyze",
  summary: "chart a CSV file: limits, run-rule signals, capability",
  help,
  options: { ...CHART_FILE_OPTIONS, ...valueOptions("baseline", "exclude", "confidence", "lambda", "L", "k", "h"), "force-zone-rules": { type: "boolean" } },
  run,
};
