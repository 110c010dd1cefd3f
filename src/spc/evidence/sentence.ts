/**
 * The shape of every evidence result, and the plain-language pieces its sentence is built from.
 * p-values follow the APA convention (Publication Manual of the American Psychological Association,
 * 7th ed., §6.36): "p < 0.001" below 0.001, otherwise the value to 3 decimals below 0.01 and to 2
 * decimals above; never "p = 0".
 */

/** Names used in sentences: the measured variable, its unit and how many significant digits to print. */
export interface EvidenceLabels {
  /** The measured characteristic, e.g. "weight". Default "the value". */
  readonly variable?: string;
  /** Unit printed after amounts, e.g. "g". Default none. */
  readonly unit?: string;
  /** The tag whose levels are compared, e.g. "cavity". Default "level". */
  readonly tag?: string;
  /** The covariate a correlation is taken with, e.g. "barrel temperature". Default "the covariate". */
  readonly covariate?: string;
  /** Significant digits of amounts (default 3). */
  readonly digits?: number;
}

export interface EvidenceResult<Effect> {
  /** Name of the test, e.g. "one-way ANOVA". */
  readonly test: string;
  readonly statistic: number;
  /** Degrees of freedom: one number, or [numerator, denominator] for F tests. */
  readonly df?: number | readonly [number, number];
  readonly pValue: number;
  readonly effect: Effect;
  /** One plain sentence: the effect, then the test and p-value. */
  readonly sentence: string;
}

export function formatPValue(pValue: number): string {
  if (pValue < 0.001) return "p < 0.001";
  if (pValue < 0.01) return `p = ${pValue.toFixed(3)}`;
  // 0.995 and above would print as 1.00; say so plainly.
  return pValue >= 0.995 ? "p > 0.99" : `p = ${pValue.toFixed(2)}`;
}

/** An amount with its unit, to the requested significant digits ("0.0412 g"). */
export function formatAmount(value: number, labels: EvidenceLabels = {}): string {
  const digits = labels.digits ?? 3;
  const text = Number(value.toPrecision(digits)).toString();
  return labels.unit ? `${text} ${labels.unit}` : text;
}

/** A plain number to the requested significant digits (statistics, ratios). */
export function formatNumber(value: number, digits = 3): string {
  return Number(value.toPrecision(digits)).toString();
}

/** "higher" or "lower" for a signed difference. */
export function direction(difference: number): "higher" | "lower" {
  return difference >= 0 ? "higher" : "lower";
}

export function variableName(labels: EvidenceLabels): string {
  return labels.variable ?? "the value";
}
