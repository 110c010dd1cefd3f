/**
 * What the commands that chart one CSV file (`analyze`, `verify`) share: the file argument, the options
 * both take (as parseArgs declares them and as zod checks their values), and the order check of the
 * specification limits. Each command keeps its own options and refinements beside these.
 */
import { z } from "zod";
import { CHART_TYPES } from "../../shared/constants";
import { DECIMAL_NUMBER, SUBGROUP_SIZE_RANGE } from "../io/csv";
import { DEFAULT_RULE_SET } from "../spc/analyze";
import { UsageError, type CommandOptions, type ParsedArguments } from "./command";

export const decimalOption = z.string().regex(DECIMAL_NUMBER, "must be a number, e.g. 1.5").transform(Number);
export const wholeNumberOption = z.string().regex(/^\d+$/, "must be a whole number").transform(Number);

/** The zod checks of the shared options; a command lists them in its own option object. */
export const CHART_FILE_OPTION_SCHEMAS = {
  chart: z.enum(CHART_TYPES, {
    error: (issue) => (issue.input === undefined ? "is required" : `must be one of ${CHART_TYPES.join(", ")}`),
  }),
  "subgroup-size": wholeNumberOption.pipe(z.number().min(SUBGROUP_SIZE_RANGE.min).max(SUBGROUP_SIZE_RANGE.max)).optional(),
  rules: z.string().default(DEFAULT_RULE_SET),
  target: decimalOption.optional(),
  lsl: decimalOption.optional(),
  usl: decimalOption.optional(),
  format: z.enum(["text", "json"], { error: "must be text or json" }).default("text"),
};

/** Options that take a value (`--name value`), as parseArgs declares them. */
export function valueOptions(...names: readonly string[]): CommandOptions {
  return Object.fromEntries(names.map((name) => [name, { type: "string" }]));
}

/** The shared options as parseArgs declares them: every one takes a value. */
export const CHART_FILE_OPTIONS = valueOptions(...Object.keys(CHART_FILE_OPTION_SCHEMAS));

/** Refuses an upper specification limit at or below the lower one. */
export function refuseCrossedSpecification(options: { lsl?: number; usl?: number }, context: z.RefinementCtx): void {
  if (options.lsl !== undefined && options.usl !== undefined && options.lsl >= options.usl) {
    context.addIssue({ code: "custom", path: ["usl"], message: "must be greater than --lsl" });
  }
}

/** The one CSV file a command reads; `usage` is its call, e.g. "verify FILE.csv --chart TYPE". */
export function chartFileArgument(parsed: ParsedArguments, command: string, usage: string): string {
  const [file, ...extra] = parsed.positionals;
  if (file === undefined) throw new UsageError(`${command} needs a CSV file: ${usage}`);
  if (extra.length > 0) throw new UsageError(`${command} reads one file; unexpected argument "${extra[0]}"`);
  return file;
}
