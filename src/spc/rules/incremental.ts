/**
 * Incremental run-rule evaluation for live detection and simulation.
 *
 * Whether a rule fires at point i, and where its window starts, depends only on the points i − 14 .. i
 * (the longest window, Nelson's test 7, has 15 points; scanner.ts), so evaluating a new point needs at
 * most RULE_TAIL_LENGTH = 14 earlier points with their limits and sigma, whatever the length of the
 * history, and gives exactly the batch answer for that index (proved by a property test).
 * Rules and conventions: definitions.ts (Western Electric 1956; Nelson 1984, JQT 16(4)).
 */
import type { RuleId } from "../../../shared/constants";
import { SpcInputError, type StatisticSeries } from "../types";
import { planRules, type RuleOptions, type SeriesDescription } from "./applicability";
import { LONGEST_RULE_WINDOW } from "./definitions";
import { checkSeries } from "./evaluate";
import { RuleScanner, ruleMask, type Firing } from "./scanner";

/** Earlier points needed to evaluate a new one: the longest window (15 points) minus the new point. */
export const RULE_TAIL_LENGTH = LONGEST_RULE_WINDOW - 1;

/**
 * The firings at the last point of `tail`. `tail` holds the most recent points of a series, oldest first,
 * ending with the new point; `firstIndex` is the position of `tail.points[0]` in the whole series. The
 * tail must reach back RULE_TAIL_LENGTH points before the new one, or to the start of the series
 * (`firstIndex` 0); only those points are read, so the cost does not depend on the tail's length.
 */
export function firingsAt(
  tail: StatisticSeries,
  firstIndex: number,
  rules: readonly RuleId[],
  options: RuleOptions = {},
): Firing[] {
  checkSeries(tail);
  const length = tail.points.length;
  if (length === 0) throw new SpcInputError(`${tail.key}: the tail has no points`);
  if (!Number.isInteger(firstIndex) || firstIndex < 0) {
    throw new SpcInputError(`${tail.key}: the tail's first index must be a whole number ≥ 0 (got ${firstIndex})`);
  }
  if (firstIndex > 0 && length < LONGEST_RULE_WINDOW) {
    throw new SpcInputError(
      `${tail.key}: the new point ${firstIndex + length - 1} needs the ${RULE_TAIL_LENGTH} points before it ` +
        `(got ${length - 1})`,
      firstIndex + length - 1,
    );
  }
  // Rules needing zones cannot fire where sigma is NaN, so the plan needs no look at sigma here.
  const { active } = planRules(tail, rules, options);
  const firings: Firing[] = [];
  if (active.length === 0) return firings;
  const from = Math.max(0, length - LONGEST_RULE_WINDOW);
  new RuleScanner(tail.key, ruleMask(active), tail.center, tail.floor, firstIndex + from).scan(
    tail,
    from,
    length,
    firstIndex,
    firings,
  );
  const newIndex = firstIndex + length - 1;
  return firings.filter((firing) => firing.index === newIndex);
}

/** A rule evaluator fed one point at a time (for simulations and long-running consumers). */
export interface RuleStream {
  /** Feed the next point with its limits and sigma; returns the firings at it. */
  push(value: number, ucl: number, lcl: number, sigma: number): readonly Firing[];
  /** The index the next point will have. */
  readonly nextIndex: number;
}

const NO_FIRINGS: readonly Firing[] = Object.freeze([]);

export function createRuleStream(
  series: SeriesDescription,
  rules: readonly RuleId[],
  options: RuleOptions = {},
): RuleStream {
  const { active } = planRules(series, rules, options);
  const scanner = new RuleScanner(series.key, ruleMask(active), series.center, series.floor, 0);
  const point = { points: new Float64Array(1), ucl: new Float64Array(1), lcl: new Float64Array(1), sigma: new Float64Array(1) };
  const firings: Firing[] = [];
  let nextIndex = 0;
  return {
    push(value, ucl, lcl, sigma) {
      point.points[0] = value;
      point.ucl[0] = ucl;
      point.lcl[0] = lcl;
      point.sigma[0] = sigma;
      scanner.scan(point, 0, 1, nextIndex, firings);
      nextIndex++;
      return firings.length === 0 ? NO_FIRINGS : firings.splice(0);
    },
    get nextIndex() {
      return nextIndex;
    },
  };
}
