/**
 * The run rules: the four Western Electric zone rules and Nelson's eight tests for special causes, with
 * the conventions this engine takes where the published wording leaves a choice.
 *
 * Sources:
 * - Western Electric Company (1956), *Statistical Quality Control Handbook*, the four zone rules.
 * - Nelson, L.S. (1984), "The Shewhart Control Chart—Tests for Special Causes", *Journal of Quality
 *   Technology* 16(4), 237–239, the eight tests.
 * - Champ, C.W. & Woodall, W.H. (1987), "Exact results for Shewhart control charts with supplementary runs
 *   rules", *Technometrics* 29, 393–399: average run lengths, and the early-window convention below.
 *
 * Conventions (each pinned by a test in test/unit/spc/rules):
 * 1. Zones. σ is `sigma[i]` of the plotted statistic and the zone boundaries are center ± k·σ (k = 1, 2).
 *    "Beyond kσ" is strict: a point exactly at center ± k·σ is not beyond it.
 * 2. Sides. A point is above when value > center and below when value < center; a point exactly on the
 *    centre line is on neither side and breaks every same-side run.
 * 3. Rule 1 (`we-1`, `nelson-1`) compares each point with the series' own `ucl[i]` / `lcl[i]`, strictly, so
 *    it works for every chart (variable limits, EWMA, CUSUM, truncated attribute limits).
 * 4. Firing. A rule fires at point i when the window ending at i satisfies it and point i is one of the
 *    points the rule counts (the point that completes the pattern is the one marked). For a k-of-m rule
 *    the window is the m points ending at i; for an "n in a row" rule, the n points ending at i. A long
 *    run fires at every point from the n-th on; merging turns that into one signal.
 * 5. Early windows. Following Champ & Woodall's Markov chain, a k-of-m rule may fire before m points
 *    exist: the first 2 points both beyond +2σ fire `we-2`; its window then starts at point 0.
 * 6. Missing points. A NaN point (the first moving range) is skipped and breaks every run and window:
 *    evaluation restarts after it as at the start of a series.
 * 7. Nelson 3: six points in a row steadily increasing means 5 consecutive strict increases; an equal
 *    successive value (a tie) breaks the run. Same for decreasing.
 * 8. Nelson 4: fourteen points alternating means 13 consecutive successive differences alternating in
 *    sign; a zero difference breaks the run.
 * 9. Nelson 7: 15 consecutive points within 1σ (|value − center| ≤ σ) with at least one point above and
 *    one below the centre line among them (Nelson: "above and below the centerline"). The test looks
 *    for stratification, which shows on both sides; so constant data exactly on the centre line never
 *    fires it (nor any other rule).
 * 10. Nelson 8: 8 consecutive points beyond 1σ with at least one on each side (Nelson: "on both sides of
 *    the centerline"); a one-sided run is what tests 2, 5 and 6 look for.
 * 11. Floors. Where center − k·σ < `floor` (counts, fractions and ranges near zero) the lower k·σ boundary
 *    is undefined: the tests that need it (table below) cannot fire on the lower side there, and a point
 *    below the centre there does not count as within 1σ for Nelson 7.
 */
import { NELSON_RULES, RULE_IDS, WESTERN_ELECTRIC_RULES, type RuleId } from "../../../shared/constants";

export interface RuleDefinition {
  readonly id: RuleId;
  /** One line for people. */
  readonly summary: string;
  /** Points in the rule's window (the longest run it looks at). */
  readonly windowLength: number;
  /** Whether the rule needs the zone boundaries (and so a defined sigma). */
  readonly usesZones: boolean;
  /** The lower boundary (in sigmas) the rule needs below the centre line, if any. */
  readonly lowerBoundarySigmas?: 1 | 2;
  /** Rule 1 compares with the limits; the others are run rules, applied only where they make sense. */
  readonly isLimitRule: boolean;
}

const definitions: readonly RuleDefinition[] = [
  { id: "we-1", summary: "1 point beyond the control limits", windowLength: 1, usesZones: false, isLimitRule: true },
  {
    id: "we-2",
    summary: "2 of 3 points in a row beyond 2σ, on the same side",
    windowLength: 3,
    usesZones: true,
    lowerBoundarySigmas: 2,
    isLimitRule: false,
  },
  {
    id: "we-3",
    summary: "4 of 5 points in a row beyond 1σ, on the same side",
    windowLength: 5,
    usesZones: true,
    lowerBoundarySigmas: 1,
    isLimitRule: false,
  },
  {
    id: "we-4",
    summary: "8 points in a row on the same side of the centre line",
    windowLength: 8,
    usesZones: false,
    isLimitRule: false,
  },
  {
    id: "nelson-1",
    summary: "1 point beyond the control limits",
    windowLength: 1,
    usesZones: false,
    isLimitRule: true,
  },
  {
    id: "nelson-2",
    summary: "9 points in a row on the same side of the centre line",
    windowLength: 9,
    usesZones: false,
    isLimitRule: false,
  },
  {
    id: "nelson-3",
    summary: "6 points in a row steadily increasing or decreasing",
    windowLength: 6,
    usesZones: false,
    isLimitRule: false,
  },
  {
    id: "nelson-4",
    summary: "14 points in a row alternating up and down",
    windowLength: 14,
    usesZones: false,
    isLimitRule: false,
  },
  {
    id: "nelson-5",
    summary: "2 of 3 points in a row beyond 2σ, on the same side",
    windowLength: 3,
    usesZones: true,
    lowerBoundarySigmas: 2,
    isLimitRule: false,
  },
  {
    id: "nelson-6",
    summary: "4 of 5 points in a row beyond 1σ, on the same side",
    windowLength: 5,
    usesZones: true,
    lowerBoundarySigmas: 1,
    isLimitRule: false,
  },
  {
    id: "nelson-7",
    summary: "15 points in a row within 1σ, above and below the centre line",
    windowLength: 15,
    usesZones: true,
    lowerBoundarySigmas: 1,
    isLimitRule: false,
  },
  {
    id: "nelson-8",
    summary: "8 points in a row beyond 1σ, on both sides of the centre line",
    windowLength: 8,
    usesZones: true,
    lowerBoundarySigmas: 1,
    isLimitRule: false,
  },
];

export const RULE_DEFINITIONS: Readonly<Record<RuleId, RuleDefinition>> = Object.fromEntries(
  definitions.map((definition) => [definition.id, definition]),
) as Record<RuleId, RuleDefinition>;

/** The longest window of any rule (Nelson 7: 15 points). */
export const LONGEST_RULE_WINDOW = Math.max(...definitions.map((definition) => definition.windowLength));

/** The named rule sets. */
export const RULE_SETS: Readonly<Record<"we" | "nelson", readonly RuleId[]>> = {
  we: WESTERN_ELECTRIC_RULES,
  nelson: NELSON_RULES,
};

/** A Map rather than an object: looked up once per firing when merging, and a Map reads a string key faster. */
const RULE_POSITIONS = new Map(RULE_IDS.map((rule, position) => [rule, position]));

/** Position of a rule in the canonical order (RULE_IDS); also its bit in a rule mask. */
export function ruleOrder(rule: RuleId): number {
  return RULE_POSITIONS.get(rule)!;
}
