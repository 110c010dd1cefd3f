/**
 * Phase I baseline selection: a window of subgroups [start, end) with confirmed assignable causes left
 * out. The estimate uses only the remaining subgroups, so limits are "recomputed without them"
 * (Montgomery, Introduction to Statistical Quality Control, §6.2 on revised limits in Phase I).
 */
import { SpcInputError, type BaselineSpec, type ChartParameters } from "../types";

/**
 * Fewest subgroups a baseline may keep. Two is the least that can estimate anything (one moving range,
 * a centre from more than one point); practice asks for 20–25 subgroups (common practice), which is the
 * caller's advice to give, not a computational limit.
 */
export const MINIMUM_BASELINE_SUBGROUPS = 2;

export interface ResolvedBaseline {
  /** 1 where the subgroup takes part in the estimate. Length: every subgroup of the data. */
  readonly used: Uint8Array;
  readonly summary: ChartParameters["baseline"];
}

function assertIndex(value: number, low: number, high: number, what: string): void {
  if (!Number.isInteger(value) || value < low || value > high) {
    throw new SpcInputError(`${what} ${value} must be a whole number from ${low} to ${high}`, value);
  }
}

export function resolveBaseline(subgroupTotal: number, spec: BaselineSpec | undefined): ResolvedBaseline {
  const start = spec?.start ?? 0;
  const end = spec?.end ?? subgroupTotal;
  assertIndex(start, 0, subgroupTotal - 1, "baseline start");
  assertIndex(end, start + 1, subgroupTotal, "baseline end");
  const used = new Uint8Array(subgroupTotal);
  used.fill(1, start, end);
  const excluded = [...new Set(spec?.exclude ?? [])].sort((left, right) => left - right);
  for (const index of excluded) {
    assertIndex(index, start, end - 1, "excluded subgroup");
    used[index] = 0;
  }
  const usedCount = end - start - excluded.length;
  if (usedCount < MINIMUM_BASELINE_SUBGROUPS) {
    throw new SpcInputError(
      `the baseline keeps ${usedCount} subgroup(s) after exclusions; at least ${MINIMUM_BASELINE_SUBGROUPS} are needed`,
    );
  }
  return { used, summary: { start, end, excluded, used: usedCount } };
}
