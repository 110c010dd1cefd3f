/** The result type of pattern reading (see read-patterns.ts). */
import type { RuleId, StatisticKey } from "../types";
import type { PatternKind } from "../../../shared/patterns";
import type { CauseHint } from "./causes";
import type { SlipCandidate } from "./recording-slip";

export type { PatternKind };

export interface PatternChangePoint {
  /** Estimator used: normal step (Samuel et al.), linear drift (Perry & Pignatiello), or rate MLEs. */
  readonly model: "step" | "drift" | "poisson" | "binomial";
  /** Last in-control subgroup (0-based); the change came after it. */
  readonly index: number;
  /** Confidence window for `index`, both ends inclusive. */
  readonly window: { readonly start: number; readonly end: number; readonly level: number };
}

export interface RecordingSlipReading {
  /** The reading as printed (the value's shortest decimal form unless the caller supplied the text). */
  readonly printed: string;
  /** Subgroup and position of the reading inside the flat values array. */
  readonly valueIndex: number;
  /** The likely intended value and the slip that explains it, best first. */
  readonly candidates: readonly SlipCandidate[];
}

/** Numbers behind a classification; which ones are present depends on the kind. */
export interface PatternEvidence {
  /** Rules that fired in the episode. */
  readonly rules: readonly RuleId[];
  /** Step model: new level minus centre, in σ of the plotted level. */
  readonly shiftInSigma?: number;
  /** Drift model: slope per subgroup in σ of the plotted level. */
  readonly slopeInSigma?: number;
  /** Profile log-likelihood ratios of the best step and the best drift against no change. */
  readonly stepLogLikelihood?: number;
  readonly driftLogLikelihood?: number;
  /** Two-segment shift statistic with both levels unknown (segment-shift.ts). */
  readonly segmentLogLikelihood?: number;
  /** Cycle: Fisher's g share of the variance at the peak, its p-value, the autocorrelation at the period. */
  readonly cycleStrength?: number;
  readonly cyclePValue?: number;
  readonly autocorrelationAtPeriod?: number;
  /** Shape features of the episode (shape-features.ts). */
  readonly meanSquare?: number;
  readonly withinOne?: number;
  readonly beyondOne?: number;
  readonly bothSides?: number;
  readonly alternation?: number;
  readonly bimodality?: number;
  readonly centreShare?: number;
  /** Outlier: distance from the neighbours' level in σ. */
  readonly isolation?: number;
  /** Spread: ratio of the dispersion statistic (or of mean z²) to its in-control value, and direction. */
  readonly spreadRatio?: number;
  /** Spread from an R, S or MR chart: one-sided p-value of the variance test (spread-test.ts). */
  readonly spreadPValue?: number;
  readonly direction?: "increase" | "decrease";
  readonly recordingSlip?: RecordingSlipReading;
}

export interface Pattern {
  readonly kind: PatternKind;
  readonly chart: StatisticKey;
  /** First and last subgroup of the episode. */
  readonly start: number;
  readonly end: number;
  readonly changePoint?: PatternChangePoint;
  /** Cycle period in subgroups. */
  readonly period?: number;
  readonly evidence: PatternEvidence;
  readonly causes: readonly CauseHint[];
}
