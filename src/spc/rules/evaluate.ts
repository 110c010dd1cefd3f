/**
 * Batch evaluation of run rules over one plotted statistic: one word-parallel pass over the whole series
 * (batch-scanner.ts, equal to the shared scanner of scanner.ts), its firings merged into signals as they
 * come (merge.ts).
 * Rules and conventions: definitions.ts (Western Electric 1956; Nelson 1984, JQT 16(4)).
 * Cost: O(n) time, memory O(number of firings).
 */
import type { RuleId } from "../../../shared/constants";
import { SpcInputError, type Signal, type StatisticSeries } from "../types";
import { ruleOrder } from "./definitions";
import { lowerZoneNotes, planRules, type RuleOptions, type SkippedRule } from "./applicability";
import { scanWords } from "./batch-scanner";
import { SignalBuilder } from "./merge";
import { RuleScanner, ruleMask, type Firing, type FiringSink } from "./scanner";

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
  // The batch scan trusts `uniformLimits` (set by the charts module by construction) and reads only the
  // first point's limits; checking every point would cost what the flag saves, so only the last is compared.
  if (series.uniformLimits === true && length > 1) {
    for (const name of ["ucl", "lcl", "sigma"] as const) {
      const first = series[name][0]!;
      const last = series[name][length - 1]!;
      if (!(first === last || (first !== first && last !== last))) {
        throw new SpcInputError(`${series.key}: uniformLimits is set but ${name} is ${first} at 0 and ${last} at ${length - 1}`, length - 1);
      }
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

/**
 * Feeds `sink` every firing of the active rules over the whole series, in index order: the word-parallel
 * scan (batch-scanner.ts, equal to the scanner by a property test) for speed; the scanner itself when the
 * word scan declines (input the scanner refuses with its error), after `restart` has dropped what the
 * word scan had fed.
 */
function scanSeries(series: StatisticSeries, active: readonly RuleId[], sink: FiringSink, restart: () => void): void {
  if (active.length === 0) return;
  const rules = ruleMask(active);
  if (scanWords(series, rules, series.center, series.floor, sink)) return;
  restart();
  const firings: Firing[] = [];
  new RuleScanner(series.key, rules, series.center, series.floor).scan(series, 0, series.points.length, 0, firings);
  for (const { rule, index, windowStart, side } of firings) sink(rule, index, windowStart, side, ruleOrder(rule));
}

/** Every firing of the applicable rules, in index order (what live detection reproduces point by point). */
export function ruleFirings(series: StatisticSeries, rules: readonly RuleId[], options: RuleOptions = {}): Firing[] {
  checkSeries(series);
  const chart = series.key;
  let firings: Firing[] = [];
  scanSeries(
    series,
    plan(series, rules, options).active,
    (rule, index, windowStart, side) =>
      firings.push(side === undefined ? { rule, chart, index, windowStart } : { rule, chart, index, windowStart, side }),
    () => (firings = []),
  );
  return firings;
}

/** Signals of the requested rules on one statistic, the rules skipped and why, and notes. */
export function evaluateRules(
  series: StatisticSeries,
  rules: readonly RuleId[],
  options: RuleOptions = {},
): RuleEvaluation {
  checkSeries(series);
  const { active, skipped } = plan(series, rules, options);
  const chart = series.key;
  let builder = new SignalBuilder();
  scanSeries(
    series,
    active,
    (rule, index, windowStart, side, order) => builder.add(rule, chart, index, windowStart, side, order),
    () => (builder = new SignalBuilder()),
  );
  return { signals: builder.result(), skipped, notes: lowerZoneNotes(series, active) };
}
