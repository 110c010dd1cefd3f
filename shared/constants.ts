/**
 * Vocabulary shared by the engine, the server and the browser. One name per concept: these strings
 * are stored in the database, printed by the command line and shown in the UI.
 */

/** Control chart types. Machine ids (CLI `--chart`, database `chartType`). */
export const CHART_TYPES = ["imr", "xbar-r", "xbar-s", "p", "np", "c", "u", "ewma", "cusum"] as const;
export type ChartType = (typeof CHART_TYPES)[number];

export const CHART_TYPE_LABELS: Record<ChartType, string> = {
  imr: "Individuals and moving range",
  "xbar-r": "X-bar and R",
  "xbar-s": "X-bar and S",
  p: "p (fraction defective)",
  np: "np (number defective)",
  c: "c (defects per sample)",
  u: "u (defects per unit)",
  ewma: "EWMA",
  cusum: "Tabular CUSUM",
};

/** Charts whose data are measured values (as opposed to counts). */
export const VARIABLES_CHART_TYPES: readonly ChartType[] = ["imr", "xbar-r", "xbar-s", "ewma", "cusum"];

/** The plotted statistics; keys of `charts` in the analyze JSON output. */
export const STATISTIC_KEYS = [
  "x",
  "mr",
  "xbar",
  "r",
  "s",
  "p",
  "np",
  "c",
  "u",
  "ewma",
  "cusum-upper",
  "cusum-lower",
] as const;
export type StatisticKey = (typeof STATISTIC_KEYS)[number];

/** The plotted statistics of each chart, in the order the engine evaluates and reports them. */
export const CHART_STATISTIC_KEYS: Readonly<Record<ChartType, readonly StatisticKey[]>> = {
  imr: ["x", "mr"],
  "xbar-r": ["xbar", "r"],
  "xbar-s": ["xbar", "s"],
  p: ["p"],
  np: ["np"],
  c: ["c"],
  u: ["u"],
  ewma: ["ewma"],
  cusum: ["cusum-upper", "cusum-lower"],
};

/** Run rules: the four Western Electric rules and Nelson's eight tests. */
export const WESTERN_ELECTRIC_RULES = ["we-1", "we-2", "we-3", "we-4"] as const;
export const NELSON_RULES = [
  "nelson-1",
  "nelson-2",
  "nelson-3",
  "nelson-4",
  "nelson-5",
  "nelson-6",
  "nelson-7",
  "nelson-8",
] as const;
export const RULE_IDS = [...WESTERN_ELECTRIC_RULES, ...NELSON_RULES] as const;
export type RuleId = (typeof RULE_IDS)[number];

/** Named rule sets a characteristic can choose instead of a list. */
export const RULE_SET_NAMES = ["we", "nelson"] as const;
export type RuleSetName = (typeof RULE_SET_NAMES)[number];

/** Cause-and-effect diagram categories. */
export const CAUSE_CATEGORIES = [
  "material",
  "method",
  "machine",
  "people",
  "environment",
  "measurement",
] as const;
export type CauseCategory = (typeof CAUSE_CATEGORIES)[number];

/** Kinds of process event in the event log. */
export const EVENT_KINDS = [
  "lot-change",
  "maintenance",
  "setting-change",
  "operator-change",
  "shift-change",
  "calibration",
  "environment",
] as const;
export type EventKind = (typeof EVENT_KINDS)[number];

export const EVENT_KIND_LABELS: Record<EventKind, string> = {
  "lot-change": "Lot change",
  maintenance: "Maintenance",
  "setting-change": "Setting change",
  "operator-change": "Operator change",
  "shift-change": "Shift change",
  calibration: "Calibration",
  environment: "Environment reading",
};

/** Caution shown wherever a verdict concerns a safety-related characteristic. */
export const SAFETY_CAUTION =
  "This characteristic is safety-related. Assignable's verdicts support, and do not replace, the plant's " +
  "own procedures, the regulations that apply, and the judgement of qualified people.";
