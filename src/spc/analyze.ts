/**
 * One analysis of a data set, as the `analyze` command reports it: Phase I parameters from a baseline
 * window (with excluded subgroups left out), the chart evaluated with those frozen parameters on every
 * point (Phase II), the run rules on each plotted statistic, process capability when specification
 * limits are given; then the patterns read from the signals (src/spc/patterns) with their change
 * points. A pure composition of the engine's functions; the report is plain JSON
 * (shared/analyze-report.ts), with numbers that do not exist written as null.
 *
 * Capability is computed from the baseline's values with the within-subgroup σ of the chart (Cp, Cpk)
 * and the overall σ (Pp, Ppk); it is refused, as a value, when a signal fires inside the baseline
 * (indices of an unstable process predict nothing: Montgomery, Introduction to Statistical Quality
 * Control, §8.2) or when the capability module finds too few values.
 */
import { type TAnalyzeReport, type TCapabilityReport, type TPatternReport, type TStatisticReport } from "../../shared/analyze-report";
import { RULE_IDS, VARIABLES_CHART_TYPES, type RuleId } from "../../shared/constants";
import { computeCapability } from "./capability";
import { estimateParameters, evaluateChart, warningLimitsAt, zoneOf } from "./charts";
import { subgroupCount } from "./data";
import { patternReport } from "./patterns/report";
import { evaluateRules, resolveRuleSet, type SkippedRule } from "./rules";
import { SpcInputError, type ChartData, type ChartParameters, type ChartType, type CusumDesign, type EwmaDesign, type Signal, type StatisticSeries } from "./types";

/** The rule set used when none is named. */
export const DEFAULT_RULE_SET = "nelson";
/** Fewer baseline subgroups than this earn a note (common practice asks for 20 to 25). */
export const RECOMMENDED_BASELINE_SUBGROUPS = 20;

export interface AnalyzeOptions {
  /** Rule-set specification: "nelson", "we" or a list of rule ids (see resolveRuleSet). */
  readonly rules?: string;
  /** Apply run rules to statistics where they do not apply by default (ranges, EWMA, CUSUM). */
  readonly forceZoneRules?: boolean;
  /** Estimate from the first `baseline` subgroups only; default all. */
  readonly baseline?: number;
  /** Subgroups (0-based) left out of the estimate. */
  readonly exclude?: readonly number[];
  readonly subgroupSize?: number;
  readonly lsl?: number;
  readonly usl?: number;
  /** Confidence level of the capability intervals; the capability module's default when absent. */
  readonly confidence?: number;
  readonly ewma?: EwmaDesign;
  readonly cusum?: CusumDesign;
  /** Known process centre for variables charts, used instead of the baseline mean. */
  readonly target?: number;
  /** One label per subgroup, copied to the report. */
  readonly labels?: readonly string[];
}

export function analyze(chart: ChartType, data: ChartData, options: AnalyzeOptions = {}): TAnalyzeReport {
  const rules = resolveRuleSet(options.rules ?? DEFAULT_RULE_SET);
  const total = subgroupCount(data);
  checkOptions(options, total);
  const parameters = estimateParameters(chart, data, {
    baseline: { start: 0, end: options.baseline, exclude: options.exclude },
    subgroupSize: options.subgroupSize,
    ewma: options.ewma,
    cusum: options.cusum,
    target: options.target,
  });
  const result = evaluateChart(data, parameters);
  const notes: string[] = [];
  const signals: Signal[] = [];
  const charts: TAnalyzeReport["charts"] = {};
  for (const series of result.statistics) {
    const evaluation = evaluateRules(series, rules, { forceZoneRules: options.forceZoneRules });
    // In time order, then in the order rules are listed, so a reader meets them as they happened.
    const inOrder = [...evaluation.signals].sort((a, b) => a.start - b.start || RULE_IDS.indexOf(a.rule) - RULE_IDS.indexOf(b.rule));
    signals.push(...inOrder);
    notes.push(...describeSkipped(series.key, evaluation.skipped), ...evaluation.notes);
    charts[series.key] = statisticReport(series);
  }
  notes.push(...baselineNotes(parameters, total));
  const capability = capabilityReport(chart, data, parameters, signals, options, notes);
  const { patterns, changePoints } = patternReport(result, signals, data);
  return {
    chart,
    charts,
    signals: signals.map((signal) => ({ ...signal, firing: [...signal.firing] })),
    capability,
    patterns: patterns.map((pattern) => structuredClone(pattern) as TPatternReport),
    changePoints: changePoints.map((changePoint) => structuredClone(changePoint)),
    rules,
    parameters: {
      center: parameters.center,
      sigma: jsonNumber(parameters.sigma),
      subgroupSize: parameters.subgroupSize,
      baseline: { ...parameters.baseline, excluded: [...parameters.baseline.excluded] },
      ...(parameters.ewma === undefined ? {} : { ewma: { lambda: parameters.ewma.lambda, L: parameters.ewma.L } }),
      ...(parameters.cusum === undefined ? {} : { cusum: { k: parameters.cusum.k, h: parameters.cusum.h } }),
    },
    ...(options.labels === undefined ? {} : { labels: [...options.labels] }),
    notes,
  };
}

/** Baseline, exclusions and labels against the data, checked here so the message speaks of the data. */
function checkOptions(options: AnalyzeOptions, total: number): void {
  if (options.labels !== undefined && options.labels.length !== total) {
    throw new SpcInputError(`${options.labels.length} labels were given for ${total} subgroups`);
  }
  const end = options.baseline ?? total;
  if (end > total) throw new SpcInputError(`the baseline of ${end} subgroups is longer than the data (${total} subgroups)`);
  for (const index of options.exclude ?? []) {
    if (index >= end) {
      throw new SpcInputError(`excluded subgroup ${index} is outside the baseline (subgroups 0–${end - 1})`, index);
    }
  }
}

/** JSON has no NaN or infinity: a number that does not exist is null. */
function jsonNumber(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

/** A scalar when every point has the same value, else the values point by point. */
function compactLimit(values: ArrayLike<number>): number | null | (number | null)[] {
  const first = values[0] ?? NaN;
  const constant = Array.prototype.every.call(values, (value: number) => Object.is(value, first));
  return constant ? jsonNumber(first) : Array.from(values, jsonNumber);
}

function statisticReport(series: StatisticSeries): TStatisticReport {
  const { points, center, sigma, ucl } = series;
  const upperWarning = new Float64Array(points.length);
  const lowerWarning = new Float64Array(points.length);
  for (let index = 0; index < points.length; index++) {
    const warning = warningLimitsAt(series, index);
    upperWarning[index] = warning.upper;
    lowerWarning[index] = warning.lower;
  }
  return {
    center,
    ucl: compactLimit(ucl),
    lcl: compactLimit(series.lcl),
    points: Array.from(points, jsonNumber),
    warning: { upper: compactLimit(upperWarning), lower: compactLimit(lowerWarning) },
    zones: Array.from(points, (value, index) => jsonNumber(zoneOf(value, center, sigma[index]!))),
  };
}

/** One note per statistic and reason, listing the rules skipped for it. */
function describeSkipped(key: string, skipped: readonly SkippedRule[]): string[] {
  const byReason = new Map<string, RuleId[]>();
  for (const { rule, reason } of skipped) byReason.set(reason, [...(byReason.get(reason) ?? []), rule]);
  return [...byReason].map(([reason, rules]) => `${key}: ${rules.join(", ")} not evaluated: ${reason}`);
}

function baselineNotes(parameters: ChartParameters, total: number): string[] {
  const { start, end, excluded, used } = parameters.baseline;
  const notes: string[] = [];
  if (end - start < total || excluded.length > 0) {
    const left = excluded.length > 0 ? `, leaving out ${excluded.join(", ")}` : "";
    notes.push(`limits estimated from subgroups ${start}–${end - 1}${left} (${used} used) and applied to all ${total}`);
  }
  if (used < RECOMMENDED_BASELINE_SUBGROUPS) {
    notes.push(
      `limits rest on ${used} subgroups; common practice asks for ${RECOMMENDED_BASELINE_SUBGROUPS} to 25 before they are trusted`,
    );
  }
  return notes;
}

function capabilityReport(
  chart: ChartType,
  data: ChartData,
  parameters: ChartParameters,
  signals: readonly Signal[],
  options: AnalyzeOptions,
  notesOut: string[],
): TCapabilityReport | null {
  const { lsl, usl } = options;
  if (lsl === undefined && usl === undefined) return null;
  if (!VARIABLES_CHART_TYPES.includes(chart) || data.kind !== "variables") {
    throw new SpcInputError(`capability needs measured values: the ${chart} chart counts, so --lsl/--usl do not apply`);
  }
  const used = usedSubgroups(parameters);
  const inBaseline = [...new Set(signals.flatMap((signal) => signal.firing.filter((index) => used.has(index))))].sort((a, b) => a - b);
  const values = baselineValues(data, used);
  const result = computeCapability({
    values,
    mean: values.reduce((sum, value) => sum + value, 0) / values.length,
    withinSigma: parameters.sigma,
    lsl,
    usl,
    confidence: options.confidence,
    subgroupCount: used.size,
    inControl: inBaseline.length === 0,
  });
  if (result.status === "refused") {
    const where =
      result.code === "not-in-control"
        ? ` (signals in the baseline at subgroups ${inBaseline.join(", ")}; once their causes are confirmed, leave them out with --exclude)`
        : "";
    return { status: "refused", code: result.code, reason: `${result.reason}${where}` };
  }
  const { notes, ...computed } = result;
  notesOut.push(...notes.map((note) => `capability: ${note}`));
  return { ...computed, lsl: lsl ?? null, usl: usl ?? null };
}

function usedSubgroups(parameters: ChartParameters): Set<number> {
  const { start, end, excluded } = parameters.baseline;
  const used = new Set<number>();
  for (let index = start; index < end; index++) if (!excluded.includes(index)) used.add(index);
  return used;
}

/** The individual values of the used baseline subgroups, in order. */
function baselineValues(data: ChartData & { kind: "variables" }, used: ReadonlySet<number>): Float64Array {
  const values: number[] = [];
  for (const index of used) {
    for (let position = data.offsets[index]!; position < data.offsets[index + 1]!; position++) values.push(data.values[position]!);
  }
  return Float64Array.from(values);
}
