/**
 * `verify FILE.csv --chart TYPE --adjusted-at I [options]`: the verdict on the subgroups after an
 * adjustment (src/spc/verification): passed, failed with reasons, or insufficient data with how many
 * more subgroups are needed. Input formats and error handling as for `analyze` (exit 2 on bad input).
 */
import { z } from "zod";
import { CHART_TYPES } from "../../shared/constants";
import { readChartCsvFile } from "../io/csv";
import { createRng } from "../spc/random";
import { resolveRuleSet } from "../spc/rules";
import { verifyFix, type VerificationResult } from "../spc/verification";
import { CHART_FILE_OPTION_SCHEMAS, CHART_FILE_OPTIONS, chartFileArgument, decimalOption, refuseCrossedSpecification, valueOptions, wholeNumberOption } from "./chart-file";
import type { Command, ParsedArguments } from "./command";

const ZVerifyCommandOptions = z
  .object({
    chart: CHART_FILE_OPTION_SCHEMAS.chart,
    "adjusted-at": wholeNumberOption.pipe(z.number().min(1)),
    baseline: wholeNumberOption.pipe(z.number().min(2)).optional(),
    "subgroup-size": CHART_FILE_OPTION_SCHEMAS["subgroup-size"],
    rules: CHART_FILE_OPTION_SCHEMAS.rules,
    delta: decimalOption.pipe(z.number().positive()).default(1),
    power: decimalOption.pipe(z.number().gt(0).lt(1)).default(0.9),
    window: wholeNumberOption.pipe(z.number().min(2)).optional(),
    target: CHART_FILE_OPTION_SCHEMAS.target,
    lsl: CHART_FILE_OPTION_SCHEMAS.lsl,
    usl: CHART_FILE_OPTION_SCHEMAS.usl,
    format: CHART_FILE_OPTION_SCHEMAS.format,
  })
  .superRefine((options, context) => {
    refuseCrossedSpecification(options, context);
    if (options.baseline !== undefined && options.baseline > options["adjusted-at"]) {
      context.addIssue({ code: "custom", path: ["baseline"], message: "must end at or before --adjusted-at" });
    }
  });

/** The JSON contract of `verify --format json`. */
export function verificationReport(result: VerificationResult) {
  return {
    verdict: result.verdict,
    reasons: result.reasons,
    subgroupsAfter: result.subgroupsAfter,
    subgroupsNeeded: result.subgroupsNeeded,
    subgroupsMissing: result.subgroupsMissing,
    window: result.window,
    baseline: result.parameters.baseline,
    limits: { center: result.parameters.center, sigma: Number.isNaN(result.parameters.sigma) ? null : result.parameters.sigma },
    falseAlarmProbability: result.falseAlarmProbability,
    signals: result.signals.map((signal) => ({ ...signal, firing: [...signal.firing] })),
    tests: result.tests,
    capability: result.capability ?? null,
  };
}

function formatText(result: VerificationResult): string {
  const lines = [
    `Verdict: ${result.verdict}`,
    ...result.reasons.map((reason) => `  - ${reason}`),
    `Window: subgroups ${result.window.start}..${result.window.end} (${result.subgroupsNeeded} needed, ${result.subgroupsAfter} after the adjustment)`,
    `Limits from subgroups ${result.parameters.baseline.start}..${result.parameters.baseline.end - 1}`,
    `Chance of a false alarm by the rule set over the window: ${(100 * result.falseAlarmProbability.probability).toFixed(1)} %`,
  ];
  const { meanEquivalence, spreadF } = result.tests;
  if (meanEquivalence) {
    lines.push(
      `Mean: difference ${meanEquivalence.difference.toPrecision(4)}, 90 % interval ${meanEquivalence.interval.lower.toPrecision(4)} to ${meanEquivalence.interval.upper.toPrecision(4)}, margin ±${meanEquivalence.margin.toPrecision(4)}: ${meanEquivalence.equivalent ? "equivalent" : "not shown equivalent"} (TOST p = ${meanEquivalence.pValue.toPrecision(3)})`,
    );
  }
  if (spreadF) lines.push(`Spread: ${spreadF.sentence}`);
  for (const [when, capability] of Object.entries(result.capability ?? {})) {
    lines.push(
      capability.status === "computed"
        ? `Capability ${when}: Cpk ${capability.cpk.value.toFixed(2)} (${capability.cpk.lower.toFixed(2)} to ${capability.cpk.upper.toFixed(2)})`
        : `Capability ${when}: refused: ${capability.reason}`,
    );
  }
  return `${lines.join("\n")}\n`;
}

async function run(parsed: ParsedArguments, output: { stdout: (text: string) => void }): Promise<number> {
  const file = chartFileArgument(parsed, "verify", "verify FILE.csv --chart TYPE --adjusted-at I");
  const options = ZVerifyCommandOptions.parse(parsed.values);
  const input = await readChartCsvFile(file, options.chart, { subgroupSize: options["subgroup-size"] });
  const result = verifyFix({
    chart: options.chart,
    data: input.data,
    adjustedAt: options["adjusted-at"],
    rules: resolveRuleSet(options.rules),
    delta: options.delta,
    power: options.power,
    ...(options.baseline !== undefined ? { baseline: { end: options.baseline } } : {}),
    ...(options.window !== undefined ? { windowLength: options.window } : {}),
    ...(options["subgroup-size"] !== undefined ? { subgroupSize: options["subgroup-size"] } : {}),
    ...(options.target !== undefined ? { target: options.target } : {}),
    ...(options.lsl !== undefined ? { lsl: options.lsl } : {}),
    ...(options.usl !== undefined ? { usl: options.usl } : {}),
    // A fixed seed: the same file gives the same report (the simulated false-alarm probability).
    rng: createRng(1),
  });
  output.stdout(options.format === "json" ? `${JSON.stringify(verificationReport(result), null, 2)}\n` : formatText(result));
  return 0;
}

const help = `Usage: npm run -s cli -- verify FILE.csv --chart TYPE --adjusted-at I [options]

Verdict on the subgroups after an adjustment: passed, failed (with reasons) or insufficient-data
(with how many more subgroups are needed). Subgroups from I on (0-based) come after the adjustment;
the verdict uses the first m* of them, m* from the detection power unless --window is given.
Input columns as for analyze.

Options:
  --chart TYPE            ${CHART_TYPES.join(" | ")} (required)
  --adjusted-at I         first subgroup after the adjustment (required)
  --baseline K            limits from the first K subgroups (default: all before the first point
                          beyond refined trial limits)
  --rules SPEC            nelson (default) | we | a list of rule ids
  --delta D               shift to detect and equivalence margin, in sigmas (default 1)
  --power P               wanted probability of detecting that shift in the window (default 0.9)
  --window M              window length instead of the power calculation
  --target X              reference for the mean instead of the baseline centre
  --lsl X, --usl Y        specification limits: capability before and after
  --subgroup-size N       xbar-r, xbar-s: every subgroup must have N values
  --format FORMAT         text (default) | json
  -h, --help              this help

Exit codes: 0 verdict given (whatever it is), 2 bad usage or input, 1 unexpected error.
`;

export const verifyCommand: Command = {
  name: "verify",
  summary: "verdict on the subgroups after an adjustment: passed, failed or insufficient data",
  help,
  options: { ...CHART_FILE_OPTIONS, ...valueOptions("adjusted-at", "baseline", "delta", "power", "window") },
  run,
};
