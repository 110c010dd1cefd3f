/**
 * Per-subgroup summaries, the one input every chart's statistics are computed from
 * (Montgomery, Introduction to Statistical Quality Control, §6.2–6.4, §7.2–7.3, §9.1–9.2: each plotted
 * statistic is a function of its subgroup's summary and, for the moving range, the EWMA and the CUSUM,
 * of the point before):
 * - means x̄ᵢ = Σx/nᵢ (the value itself on individuals charts): I-MR, X-bar, EWMA, CUSUM;
 * - spreads: the range Rᵢ = max − min (X-bar & R) or the sample standard deviation sᵢ (X-bar & S);
 * - counts dᵢ or cᵢ with their sizes nᵢ (sample size for p and np, inspection units for u; c needs none).
 * `evaluateChart` summarises measurements with src/spc/data.ts and evaluates the summaries; summaries
 * cached elsewhere (a stored history, a bounded tail of it) go through the same entry point,
 * `evaluateSummaries`, so the formulas exist once.
 *
 * A slice of a limit segment (a fresh chart: moving ranges, the EWMA and the CUSUM start again there) is
 * described by its `SliceStart`: the position of its first subgroup in the segment and the state carried
 * over from the point before it. Evaluating consecutive slices, each with the state the previous one
 * ended in, gives the same values, to the bit, as evaluating the whole segment at once.
 */
import { commonSubgroupSize, subgroupMeans, subgroupRanges, subgroupStandardDeviations } from "../data";
import { SpcInputError, type ChartData, type ChartParameters, type ChartType } from "../types";
import { requireAttributes, requireVariables } from "./chart-input";

/** One array per summary, one entry per subgroup, all of one length; a chart reads only SUMMARY_FIELDS[chart]. */
export interface SubgroupSummaries {
  readonly means?: Float64Array;
  /** Ranges (X-bar & R) or sample standard deviations (X-bar & S). */
  readonly spreads?: Float64Array;
  readonly counts?: Float64Array;
  /** Sample sizes (p, np) or inspection units (u). */
  readonly sizes?: Float64Array;
}

export type SummaryField = keyof SubgroupSummaries;

/** The summaries each chart is computed from. */
export const SUMMARY_FIELDS: Readonly<Record<ChartType, readonly SummaryField[]>> = {
  imr: ["means"],
  "xbar-r": ["means", "spreads"],
  "xbar-s": ["means", "spreads"],
  p: ["counts", "sizes"],
  np: ["counts", "sizes"],
  c: ["counts"],
  u: ["counts", "sizes"],
  ewma: ["means"],
  cusum: ["means"],
};

/** What the point before a slice hands on: its mean (I-MR's moving range), its EWMA, its CUSUM sums. */
export interface CarriedState {
  readonly mean?: number;
  readonly ewma?: number;
  readonly cusumUpper?: number;
  readonly cusumLower?: number;
}

export interface SliceStart {
  /** Position of the first subgroup within its limit segment (0: the segment's first point). */
  readonly firstIndex: number;
  /** The state after the point before the slice; read only when firstIndex > 0, by the charts that carry one. */
  readonly previous?: CarriedState;
}

/** What each summary can be: finite, and for spreads, counts and sizes not below a bound. */
const ACCEPTED: Readonly<Record<SummaryField, { readonly name: string; readonly minimum: number; readonly inclusive: boolean; readonly requirement: string }>> = {
  means: { name: "mean", minimum: -Infinity, inclusive: true, requirement: "a finite number" },
  spreads: { name: "spread", minimum: 0, inclusive: true, requirement: "a finite number ≥ 0" },
  counts: { name: "count", minimum: 0, inclusive: true, requirement: "a finite number ≥ 0" },
  sizes: { name: "size", minimum: 0, inclusive: false, requirement: "a finite number > 0" },
};

/**
 * Throws SpcInputError unless every summary `chart` reads is there, all of one length, every entry finite
 * and within its range (spreads and counts ≥ 0, sizes > 0), naming the first bad subgroup. Summaries that
 * `summariesOf` made from validated chart data need no such check.
 */
export function assertSummaries(summaries: SubgroupSummaries, chart: ChartType): void {
  const fields = SUMMARY_FIELDS[chart];
  const length = summaries[fields[0]!]?.length;
  for (const field of fields) {
    const array = summaryArray(summaries, field, chart);
    if (array.length !== length) {
      throw new SpcInputError(`the ${chart} chart was given ${array.length} subgroup ${field} for ${length} subgroups`);
    }
    const { name, minimum, inclusive, requirement } = ACCEPTED[field];
    for (let index = 0; index < array.length; index++) {
      const value = array[index]!;
      if (!Number.isFinite(value) || value < minimum || (!inclusive && value === minimum)) {
        throw new SpcInputError(`subgroup ${index}: the ${name} ${value} is not ${requirement}`, index);
      }
    }
  }
}

/** The summary `field`, or an SpcInputError saying that `chart` needs it. */
export function summaryArray(summaries: SubgroupSummaries, field: SummaryField, chart: ChartType): Float64Array {
  const array = summaries[field];
  if (array === undefined) throw new SpcInputError(`the ${chart} chart needs the subgroup ${field}`);
  return array;
}

/** Throws SpcInputError unless the slice starts at a whole position of 0 or more. */
export function assertSliceStart(start: SliceStart): void {
  if (!Number.isInteger(start.firstIndex) || start.firstIndex < 0) {
    throw new SpcInputError(`a slice starts at a whole position of 0 or more in its segment, not ${start.firstIndex}`);
  }
}

/** The state `field` the slice starts from: `atSegmentStart` on a segment's first point, else the previous point's. */
export function carriedState(start: SliceStart, field: keyof CarriedState, chart: ChartType, atSegmentStart: number): number {
  const { firstIndex } = start;
  if (firstIndex === 0) return atSegmentStart;
  const value = start.previous?.[field];
  if (value === undefined || !Number.isFinite(value)) {
    throw new SpcInputError(`the ${chart} slice starts at position ${firstIndex} of its segment but the previous point's ${field} is ${value}`);
  }
  return value;
}

/**
 * The summaries `parameters.chart` reads, from validated chart data: the data kind the chart needs, and
 * for variables charts every subgroup of the frozen size (the first one of another size is named).
 */
export function summariesOf(data: ChartData, parameters: ChartParameters): SubgroupSummaries {
  const { chart } = parameters;
  switch (chart) {
    case "imr": {
      const variables = requireVariables(data, chart);
      commonSubgroupSize(variables, 1);
      // Each value is a subgroup of one: its mean is the value (Σx/1), so the values serve as they are.
      return { means: variables.values };
    }
    case "xbar-r":
    case "xbar-s": {
      const variables = requireVariables(data, chart);
      commonSubgroupSize(variables, parameters.subgroupSize);
      const means = subgroupMeans(variables);
      return { means, spreads: chart === "xbar-r" ? subgroupRanges(variables) : subgroupStandardDeviations(variables, means) };
    }
    case "ewma":
    case "cusum": {
      const variables = requireVariables(data, chart);
      commonSubgroupSize(variables, parameters.subgroupSize);
      return { means: subgroupMeans(variables) };
    }
    case "p":
    case "np":
    case "u": {
      const { counts, sizes } = requireAttributes(data, chart);
      return { counts, sizes };
    }
    case "c":
      return { counts: requireAttributes(data, chart).counts };
  }
}
