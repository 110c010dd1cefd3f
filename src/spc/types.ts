/**
 * Types shared by every part of the statistics engine.
 *
 * Conventions (decided once, see DEVELOPERS.md "Engine conventions"):
 * - Pure functions over typed arrays: no I/O, no clock, no global random state. Code that needs
 *   randomness takes an `Rng` (src/spc/random.ts); code that needs the time takes it as an argument.
 * - Invalid input (empty data, non-finite values, a subgroup size outside the tabulated range, a count
 *   above its sample size, ...) throws `SpcInputError` with a message that names the offending index.
 *   The engine never returns NaN to mean "bad input". NaN in a `points` array means "no value at this
 *   position by definition" (the first moving range), never "invalid".
 * - Indices are 0-based subgroup positions.
 */
import type { ChartType, RuleId, StatisticKey } from "../../shared/constants";

export type { ChartType, RuleId, StatisticKey };

/** Thrown for input the engine cannot compute on. `index` is the 0-based subgroup (or value) position. */
export class SpcInputError extends RangeError {
  readonly index: number | undefined;
  constructor(message: string, index?: number) {
    super(message);
    this.name = "SpcInputError";
    this.index = index;
  }
}

/**
 * Measured values grouped into subgroups, flattened for speed: subgroup i holds
 * `values[offsets[i]] .. values[offsets[i + 1] - 1]`. `offsets.length` is the number of subgroups + 1.
 * Individuals data (imr, ewma, cusum on single values) have every subgroup of size 1.
 */
export interface VariablesData {
  readonly kind: "variables";
  readonly values: Float64Array;
  readonly offsets: Uint32Array;
}

/**
 * Attributes data: per subgroup, a count (defectives for p/np, defects for c/u) and a size
 * (sample size for p/np, inspection units for u, 1 for c).
 */
export interface AttributesData {
  readonly kind: "attributes";
  readonly counts: Float64Array;
  readonly sizes: Float64Array;
}

export type ChartData = VariablesData | AttributesData;

/** Which subgroups estimate the limits (Phase I). */
export interface BaselineSpec {
  /** First subgroup of the baseline window (inclusive). Default 0. */
  readonly start?: number;
  /** End of the baseline window (exclusive). Default: all subgroups. */
  readonly end?: number;
  /** Subgroups inside the window left out of the estimate (confirmed assignable causes). */
  readonly exclude?: readonly number[];
}

/** EWMA design: weight lambda in (0, 1], limit width L in sigma units. */
export interface EwmaDesign {
  readonly lambda: number;
  readonly L: number;
  /**
   * Use the fixed asymptotic limits ±L·σ·√(λ/(2−λ)) from the first point instead of the exact
   * time-varying ones (published ARL tables assume fixed limits). Default false.
   */
  readonly asymptoticLimits?: boolean;
}

/** Tabular CUSUM design: reference value k and decision interval h, both in sigma units. */
export interface CusumDesign {
  readonly k: number;
  readonly h: number;
}

/**
 * What Phase I estimates and Phase II freezes. Limits for any later point follow from these and that
 * point's own size, so frozen parameters also serve charts whose sample size varies.
 */
export interface ChartParameters {
  readonly chart: ChartType;
  /**
   * Process centre: the mean of individual values (variables charts); p-bar (p, np); c-bar (c);
   * u-bar (u).
   */
  readonly center: number;
  /**
   * Within-subgroup standard deviation of one individual value (variables charts: MR-bar/d2,
   * R-bar/d2 or S-bar/c4). NaN for attributes charts, whose sigma follows from the centre.
   */
  readonly sigma: number;
  /** Nominal subgroup size n for variables charts (R and S limits depend on it); 1 for individuals. */
  readonly subgroupSize: number;
  readonly ewma?: EwmaDesign;
  readonly cusum?: CusumDesign;
  /** Where the estimate came from. */
  readonly baseline: {
    readonly start: number;
    readonly end: number;
    readonly excluded: readonly number[];
    /** Subgroups actually used. */
    readonly used: number;
  };
}

/** One plotted statistic with its limits, point by point. */
export interface StatisticSeries {
  readonly key: StatisticKey;
  /** The plotted values; NaN only where undefined by definition (e.g. the first moving range). */
  readonly points: Float64Array;
  readonly center: number;
  /** Per-point limits (constant arrays when the limits do not vary). */
  readonly ucl: Float64Array;
  /** Per-point lower limits, already truncated at `floor` where the statistic cannot go lower. */
  readonly lcl: Float64Array;
  /**
   * Per-point standard deviation of the plotted statistic: zone boundaries are center ± k·sigma.
   * NaN where zones are meaningless (CUSUM); zone-based rules then do not apply.
   */
  readonly sigma: Float64Array;
  /**
   * The smallest value the statistic can take (0 for counts, fractions, ranges and deviations), or
   * -Infinity. A lower zone boundary below the floor is undefined, and rules that need it are skipped.
   */
  readonly floor: number;
  /** Whether run rules beyond rule 1 apply to this statistic unless asked (false for R, S, MR, EWMA, CUSUM). */
  readonly zoneRulesByDefault: boolean;
  /**
   * True when `ucl`, `lcl` and `sigma` each hold the same value at every point (fixed limits: I-MR,
   * X-bar/R and X-bar/S, np, c, and p or u with one sample size; not EWMA's exact time-varying limits).
   * Set by the charts module, which knows it by construction; readers may then use the first value for
   * every point without reading the arrays (the batch run-rule scan does). Absent means "not known".
   */
  readonly uniformLimits?: boolean;
}

/** A chart evaluated against parameters: one or two statistics. */
export interface ChartResult {
  readonly chart: ChartType;
  readonly parameters: ChartParameters;
  readonly statistics: readonly StatisticSeries[];
}

/**
 * A run of firings of one rule on one statistic. A rule fires at point i when the window ending at i
 * satisfies it; consecutive or overlapping firings merge: `start` is the first point of the first
 * window, `end` the last firing point, `firing` every firing point in order.
 */
export interface Signal {
  readonly rule: RuleId;
  readonly chart: StatisticKey;
  readonly start: number;
  readonly end: number;
  readonly firing: readonly number[];
  /** Side of the centre line the rule saw, where the rule has one. */
  readonly side?: "above" | "below";
}
