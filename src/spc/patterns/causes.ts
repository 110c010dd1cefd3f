/**
 * Cause categories to check first for each pattern, with one-line reasons. The pairing of chart patterns
 * with their usual sources follows the Western Electric Company's Statistical Quality Control Handbook
 * (1956), Part B, "Interpretation of charts" (from memory), and Montgomery, Introduction to Statistical
 * Quality Control, §5.3.5 "Discussion of other patterns" (from memory); the categories are the six of the
 * cause-and-effect diagram (shared/constants.ts). Order: most likely first.
 */
import type { CauseCategory } from "../../../shared/constants";
import type { PatternKind } from "../../../shared/patterns";

export interface CauseHint {
  readonly category: CauseCategory;
  readonly reason: string;
}

export const CAUSES_TO_CHECK: Record<PatternKind, readonly CauseHint[]> = {
  shift: [
    { category: "material", reason: "a new lot, supplier or batch of raw material entering at the change point" },
    { category: "method", reason: "a changed setting, recipe or procedure at the change point" },
    { category: "machine", reason: "a repair, tool change or set-up done at the change point" },
    { category: "people", reason: "a new or differently trained operator taking over at the change point" },
    { category: "measurement", reason: "a gauge recalibrated or replaced at the change point" },
  ],
  trend: [
    { category: "machine", reason: "gradual wear of a tool or die, or a heater band or chiller losing capacity" },
    { category: "environment", reason: "temperature or humidity creeping through the day or the season" },
    { category: "material", reason: "material ageing, drying or settling while it waits to be used" },
    { category: "measurement", reason: "a gauge drifting between calibrations" },
  ],
  cycle: [
    { category: "environment", reason: "day–night temperature, or a chiller, dryer or air conditioning cycling" },
    { category: "people", reason: "shift rotation: each crew running the process its own way" },
    { category: "machine", reason: "maintenance, cleaning or tool-change intervals repeating on the same rhythm" },
    { category: "material", reason: "material lots or containers used in a repeating order" },
  ],
  mixture: [
    { category: "machine", reason: "several machines, cavities, heads or spindles posting to one chart" },
    { category: "measurement", reason: "several gauges or inspectors measuring the same characteristic" },
    { category: "material", reason: "two material lots or suppliers used side by side" },
  ],
  stratification: [
    { category: "measurement", reason: "a gauge whose resolution is coarse for the variation it measures" },
    { category: "method", reason: "limits computed from mixed streams: each subgroup takes one part from each source" },
  ],
  outlier: [
    { category: "measurement", reason: "a misread gauge or a measurement taken on the wrong feature" },
    { category: "people", reason: "a value written or typed wrongly when recorded" },
    { category: "material", reason: "a single defective piece of material" },
  ],
  spread: [
    { category: "machine", reason: "worn bearings, loose fixtures or an unstable controller" },
    { category: "material", reason: "less uniform material within a lot" },
    { category: "people", reason: "people doing the same task in different ways" },
  ],
};

/** A welcome decrease in spread has other usual sources than an increase. */
export const CAUSES_OF_REDUCED_SPREAD: readonly CauseHint[] = [
  { category: "method", reason: "an improvement to keep: find what changed and make it the standard" },
  { category: "measurement", reason: "a gauge that stopped responding, or rounding introduced in recording" },
];
