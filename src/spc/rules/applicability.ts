/**
 * Which rules apply to a statistic, and what the output must say about the ones that do not.
 *
 * Rule 1 (a point beyond the limits) applies to every chart. The run rules assume independent, roughly
 * normal points with meaningful zones, which is not so for range, standard-deviation and moving-range
 * charts (skewed, and the moving ranges overlap) nor for EWMA and CUSUM (each point carries the previous
 * ones, so runs are expected): there they apply only when asked. This is common practice; the Wikipedia
 * article "Nelson rules" also notes that a moving-range chart should use tests 1–4 at most. Where the
 * lower zone boundary falls below the statistic's floor, the lower side of the tests that need it is
 * undefined (definitions.ts, convention 11).
 */
import type { RuleId } from "../../../shared/constants";
import type { StatisticSeries } from "../types";
import { RULE_DEFINITIONS } from "./definitions";
import { indexRanges } from "./index-ranges";

export interface RuleOptions {
  /** Apply the run rules (beyond rule 1) even where they do not apply by default. */
  readonly forceZoneRules?: boolean;
}

export interface SkippedRule {
  readonly rule: RuleId;
  readonly reason: string;
}

export type SeriesDescription = Pick<StatisticSeries, "key" | "center" | "floor" | "zoneRulesByDefault">;

function defaultSkipReason(series: SeriesDescription): string {
  switch (series.key) {
    case "r":
      return "run rules do not apply to a range chart unless asked";
    case "s":
      return "run rules do not apply to a standard-deviation chart unless asked";
    case "mr":
      return "run rules do not apply to a moving-range chart unless asked (successive moving ranges share a point)";
    case "ewma":
    case "cusum-upper":
    case "cusum-lower":
      return "run rules do not apply unless asked: the plotted statistic is autocorrelated (each point carries the previous ones)";
    default:
      return `run rules do not apply to the ${series.key} statistic unless asked`;
  }
}

/**
 * Split the requested rules into those to evaluate and those skipped with a reason. `sigmaDefined`
 * false (no point has a sigma, e.g. CUSUM) skips the rules that need zones.
 */
export function planRules(
  series: SeriesDescription,
  rules: readonly RuleId[],
  options: RuleOptions = {},
  sigmaDefined = true,
): { active: RuleId[]; skipped: SkippedRule[] } {
  const runRulesApply = series.zoneRulesByDefault || options.forceZoneRules === true;
  const active: RuleId[] = [];
  const skipped: SkippedRule[] = [];
  for (const rule of rules) {
    const definition = RULE_DEFINITIONS[rule];
    if (!definition.isLimitRule && !runRulesApply) skipped.push({ rule, reason: defaultSkipReason(series) });
    else if (definition.usesZones && !sigmaDefined) {
      skipped.push({ rule, reason: `zones are undefined for the ${series.key} statistic (it has no sigma)` });
    } else active.push(rule);
  }
  return { active, skipped };
}

/** "0–4, 9, 12–20" for sorted indices, at most `shown` ranges and then how many more. */
function describeRanges(indices: readonly number[], shown = 8): string {
  const ranges = indexRanges(indices);
  const rest = ranges.length - shown;
  return rest > 0 ? `${ranges.slice(0, shown).join(", ")} and ${rest} more ranges` : ranges.join(", ");
}

/** Notes naming the active rules whose lower zone boundary is undefined, and at which points. */
export function lowerZoneNotes(series: StatisticSeries, active: readonly RuleId[]): string[] {
  if (series.floor === Number.NEGATIVE_INFINITY) return [];
  const notes: string[] = [];
  for (const sigmas of [2, 1] as const) {
    const affected = active.filter((rule) => RULE_DEFINITIONS[rule].lowerBoundarySigmas === sigmas);
    if (affected.length === 0) continue;
    const points: number[] = [];
    series.points.forEach((value, index) => {
      if (value === value && series.center - sigmas * series.sigma[index]! < series.floor) points.push(index);
    });
    if (points.length === 0) continue;
    notes.push(
      `${series.key}: the lower ${sigmas}σ zone boundary is below the floor (${series.floor}) at ` +
        `${points.length === 1 ? "point" : "points"} ${describeRanges(points)}; ` +
        `${affected.join(", ")} cannot use points below the centre line there.`,
    );
  }
  return notes;
}
