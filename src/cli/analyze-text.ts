/**
 * The analyze report as text for a person: what was charted, each statistic's centre and limits, the
 * signals with the rule in words, the patterns read from them, capability, and notes. Subgroup numbers are 0-based as in the JSON.
 */
import type { TAnalyzeReport, TCapabilityReport, TPatternReport, TSignalReport, TStatisticReport } from "../../shared/analyze-report";
import { CHART_TYPE_LABELS, type RuleId } from "../../shared/constants";
import { PATTERN_KIND_LABELS } from "../../shared/patterns";
import { indexRanges, RULE_DEFINITIONS } from "../spc/rules";

/** Seven significant digits: enough for any published limit, without float noise. */
export function formatNumber(value: number | null): string {
  return value === null ? "–" : String(Number(value.toPrecision(7)));
}

/** "Nelson test 2" or "Western Electric rule 1". */
export function ruleTitle(rule: RuleId): string {
  const [family, number] = rule.split("-");
  return family === "we" ? `Western Electric rule ${number}` : `Nelson test ${number}`;
}

/** A limit that varies point by point is shown as its range. */
function formatLimit(limit: TStatisticReport["ucl"]): string {
  if (!Array.isArray(limit)) return formatNumber(limit);
  const defined = limit.filter((value): value is number => value !== null);
  if (defined.length === 0) return "–";
  return `${formatNumber(Math.min(...defined))} to ${formatNumber(Math.max(...defined))} (varies)`;
}

function table(rows: readonly (readonly string[])[]): string[] {
  const widths = rows[0]!.map((_, column) => Math.max(...rows.map((row) => row[column]!.length)));
  return rows.map((row) => `  ${row.map((cell, column) => cell.padEnd(widths[column]!)).join("  ")}`.trimEnd());
}

function statisticRows(report: TAnalyzeReport): string[] {
  const header = ["statistic", "centre", "LCL", "UCL", "warning low", "warning high", "points", "beyond limits"];
  const rows = Object.entries(report.charts).map(([key, statistic]) => {
    const beyond = report.signals.filter((signal) => signal.chart === key && (signal.rule === "we-1" || signal.rule === "nelson-1"));
    const beyondCount = new Set(beyond.flatMap((signal) => signal.firing)).size;
    return [
      key,
      formatNumber(statistic.center),
      formatLimit(statistic.lcl),
      formatLimit(statistic.ucl),
      formatLimit(statistic.warning.lower),
      formatLimit(statistic.warning.upper),
      String(statistic.points.length),
      String(beyondCount),
    ];
  });
  return table([header, ...rows]);
}

function signalLine(signal: TSignalReport, labels: readonly string[] | undefined): string {
  const title = `${ruleTitle(signal.rule)}: ${RULE_DEFINITIONS[signal.rule].summary}`;
  const span = signal.start === signal.end ? `subgroup ${signal.start}` : `subgroups ${signal.start}–${signal.end}`;
  const named = labels === undefined ? "" : ` (${labels[signal.start]}${signal.start === signal.end ? "" : ` to ${labels[signal.end]}`})`;
  const side = signal.side === undefined ? "" : `, ${signal.side}`;
  return `  ${signal.chart}: ${title} — ${span}${named}${side}; fires at ${indexRanges(signal.firing).join(", ")}`;
}

/** "Shift in level on xbar, subgroups 40–52: changed after subgroup 39 (window 37–41, 95%)", then causes. */
function patternLines(pattern: TPatternReport): string[] {
  const span = pattern.start === pattern.end ? `subgroup ${pattern.start}` : `subgroups ${pattern.start}–${pattern.end}`;
  const facts: string[] = [];
  if (pattern.changePoint !== undefined) {
    const { index, window } = pattern.changePoint;
    const after = index < 0 ? "before the first subgroup" : `after subgroup ${index}`;
    facts.push(`changed ${after} (window ${window.start}–${window.end}, ${formatNumber(window.level * 100)}%)`);
  }
  if (pattern.period !== undefined) facts.push(`period ${formatNumber(pattern.period)} subgroups`);
  const slip = pattern.evidence.recordingSlip;
  const likely = slip?.candidates[0];
  if (slip !== undefined && likely !== undefined) facts.push(`${slip.printed} may be ${likely.text} (${likely.slip})`);
  return [
    `  ${pattern.chart}: ${PATTERN_KIND_LABELS[pattern.kind]} — ${span}${facts.length > 0 ? `: ${facts.join("; ")}` : ""}`,
    ...pattern.causes.map((cause) => `      check ${cause.category}: ${cause.reason}`),
  ];
}

function capabilityLines(capability: TCapabilityReport): string[] {
  if (capability.status === "refused") return ["Capability: not computed.", `  ${capability.reason}`];
  const percent = `${formatNumber(capability.confidence * 100)}%`;
  const limits = [capability.lsl === null ? "" : `LSL ${formatNumber(capability.lsl)}`, capability.usl === null ? "" : `USL ${formatNumber(capability.usl)}`]
    .filter((text) => text !== "")
    .join(", ");
  const index = (name: string, estimate: { value: number; lower: number | null; upper: number | null } | null) =>
    estimate === null ? [name, "–", "needs both specification limits"] : [name, formatNumber(estimate.value), `${formatNumber(estimate.lower)} to ${formatNumber(estimate.upper)}`];
  return [
    `Capability (${limits}; ${capability.valueCount} baseline values, mean ${formatNumber(capability.mean)}):`,
    `  within σ ${formatNumber(capability.withinSigma)}, overall σ ${formatNumber(capability.overallSigma)}`,
    ...table([
      ["index", "value", `${percent} interval`],
      index("Cp", capability.cp),
      index("Cpk", capability.cpk),
      index("Pp", capability.pp),
      index("Ppk", capability.ppk),
    ]),
  ];
}

export function formatAnalyzeText(report: TAnalyzeReport): string {
  const { parameters } = report;
  const total = Object.values(report.charts)[0]?.points.length ?? 0;
  const size = parameters.subgroupSize > 1 ? ` of ${parameters.subgroupSize}` : "";
  const sigma = parameters.sigma === null ? "" : `, σ (within) ${formatNumber(parameters.sigma)}`;
  const design = [
    parameters.ewma === undefined ? "" : `, λ = ${parameters.ewma.lambda}, L = ${parameters.ewma.L}`,
    parameters.cusum === undefined ? "" : `, k = ${parameters.cusum.k}, h = ${parameters.cusum.h}`,
  ].join("");
  const lines = [
    `${CHART_TYPE_LABELS[report.chart]} chart: ${total} subgroups${size}; baseline ${parameters.baseline.used} subgroups`,
    `Centre ${formatNumber(parameters.center)}${sigma}${design}`,
    "",
    ...statisticRows(report),
    "",
    report.signals.length === 0
      ? `Signals: none (rules: ${report.rules.join(", ")})`
      : `Signals (${report.signals.length}; rules: ${report.rules.join(", ")}):`,
    ...report.signals.map((signal) => signalLine(signal, report.labels)),
  ];
  if (report.patterns.length > 0) lines.push("", "Patterns:", ...report.patterns.flatMap(patternLines));
  if (report.capability !== null) lines.push("", ...capabilityLines(report.capability));
  if (report.notes.length > 0) lines.push("", "Notes:", ...report.notes.map((note) => `  - ${note}`));
  return `${lines.join("\n")}\n`;
}
