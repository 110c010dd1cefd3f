/**
 * Batch evaluation of run rules over one plotted statistic: one pass of the shared scanner
 * (scanner.ts) over the whole series, then the firings merged into signals (merge.ts).
 * Rules and conventions: definitions.ts (Western Electric 1956; Nelson 1984, JQT 16(4)).
 * Cost: O(n) time, memory O(number of firings).
 */
import type { RuleId } from "../../../shared/constants";
import { SpcInputError, type Signal, type StatisticSeries } from "../types";
import { lowerZoneNotes, planRules, type RuleOptions, type SkippedRule } from "./applicability";
import { mergeFirings } from "./merge";
import { RuleScanner, ruleMask, type Firing } from "./scanner";

export interface RuleEvaluation {
  readonly signals: Signal[];
  readonly skipped: SkippedRule[];
  readonly notes: string[];
}

/** Throws SpcInputError when the series' arrays or constants cannot be evaluated. */
export function checkSeries(series: StatisticSeries): void {
  const length = series.points.length;
  for (const name of ["ucl", "lcl", "sigma"] as const) {
    if (series[name].length !== length) {
      throw new SpcInputError(`${series.key}: ${name} has ${series[name].length} values for ${length} points`);
    }
  }
  if (!Number.isFinite(series.center)) throw new SpcInputError(`${series.key}: the centre line is not finite`);
  if (Number.isNaN(series.floor)) throw new SpcInputError(`${series.key}: the floor is NaN`);
}

function plan(series: StatisticSeries, rules: readonly RuleId[], options: RuleOptions) {
  // Stops at the first defined sigma, so it costs one step for every chart but CUSUM.
  const sigmaDefined = series.sigma.some((deviation) => deviation === deviation);
  return planRules(series, rules, options, sigmaDefined);
}

function scanSeries(series: StatisticSeries, active: readonly RuleId[]): Firing[] {
  const firings: Firing[] = [];
  if (active.length === 0) return firings;
  const scanner = new RuleScanner(series.key, ruleMask(active), series.center, series.floor);
  scanner.scan(series, 0, series.points.length, 0, firings);
  return firings;
}

/** Every firing of the applicable rules, in index order (what live detection reproduces point by point). */
export function ruleFirings(series: StatisticSeries, rules: readonly RuleId[], options: RuleOptions = {}): Firing[] {
  checkSeries(series);
  return scanSeries(series, plan(series, rules, options).active);
}

/** Signals of the requested rules on one statistic, the rules skipped and why, and notes. */
export function evaluateRules(
  series: StatisticSeries,
  rules: readonly RuleId[],
  options: RuleOptions = {},
): RuleEvaluation {
  checkSeries(series);
  const { active, skipped } = plan(series, rules, options);
  return { signals: mergeFirings(scanSeries(series, active)), skipped, notes: lowerZoneNotes(series, active) };
}
