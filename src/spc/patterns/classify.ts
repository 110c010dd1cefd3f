/**
 * Classifier: which pattern explains an episode of signals on a level chart (x, x̄, p, np, c, u, EWMA,
 * CUSUM). Reads the standardised levels zᵢ around the episode and tries the kinds in a fixed order, each
 * test a published feature with a threshold calibrated by seeded simulation
 * (scripts/calibrate-patterns.ts; the confusion matrix is in docs/patterns-and-verification.md):
 *
 * (Outliers are taken out before, by `findIsolatedPoints`: a point beyond the 3σ limits that stands at
 * least `outlierDistance` σ from its neighbours, whose own level and scatter look in control
 * (isolation.ts); the signals that include it go with it, and the rest of the episode is read here.)
 * 1. stratification: Nelson's test 7 fired and the points over the episode hug the centre, mean z² at
 *    most `stratificationMeanSquare` over at least `stratificationLength` subgroups (a single chance run
 *    of 15 inside ±1σ is too short and too common to call);
 * 2. cycle: a periodogram peak with period between 3 and a third of the window that Fisher's g test finds
 *    significant (p < `cyclePValue`), confirmed by the autocorrelation: positive at the period
 *    (≥ `cycleAutocorrelation`) and negative at half the period (a step or drift gives positive
 *    autocorrelation at every short lag and no trough);
 * 3. mixture: points beyond 1σ on both sides (Nelson's tests 4 or 8, or at least half of the points
 *    beyond 1σ with a quarter of them on the minority side) with a two-population signature: alternation,
 *    a hole at the centre, or a bimodality coefficient above 5/9, and no net level change;
 * 4. spread: from the first signal on, mean z² at least `spreadMeanSquare` with at least a quarter of the
 *    points beyond 1σ on the minority side (a shift or a trend puts them nearly all on one side);
 * 5. shift or trend: the larger of the step (Samuel, Pignatiello & Calvin 1998) and drift (Perry &
 *    Pignatiello 2006) profile log-likelihood ratios (src/spc/change-point) reaches
 *    `levelLogLikelihood`; trend when the drift beats the step by `trendMargin`, else shift.
 * An episode that passes none of these is left unread: the signal stays, but no pattern is claimed.
 */
import { autocorrelation, dominantPeriod } from "../evidence";
import { driftChangePoint, stepChangePoint } from "../change-point";
import type { PatternKind } from "../../../shared/patterns";
import type { RuleId, Signal } from "../types";
import type { Episode } from "./episodes";
import { isolationOf, type Isolation } from "./isolation";
import type { PatternEvidence } from "./pattern";
import { shapeFeatures, type ShapeFeatures } from "./shape-features";

export interface PatternThresholds {
  readonly stratificationMeanSquare: number;
  readonly stratificationLength: number;
  readonly outlierDistance: number;
  readonly cyclePValue: number;
  readonly cycleAutocorrelation: number;
  readonly mixtureCentreShare: number;
  readonly mixtureBimodality: number;
  readonly mixtureAlternation: number;
  readonly spreadMeanSquare: number;
  readonly levelLogLikelihood: number;
  readonly trendMargin: number;
  /** Spread read from an R, S or MR chart: ratio of the statistic's mean to its centre. */
  readonly spreadRatio: number;
}

export const DEFAULT_PATTERN_THRESHOLDS: PatternThresholds = {
  stratificationMeanSquare: 0.4,
  stratificationLength: 20,
  outlierDistance: 4,
  cyclePValue: 0.01,
  cycleAutocorrelation: 0.3,
  mixtureCentreShare: 0.25,
  mixtureBimodality: 5 / 9,
  mixtureAlternation: 0.8,
  spreadMeanSquare: 2.5,
  levelLogLikelihood: 6,
  trendMargin: 1,
  spreadRatio: 1.4,
};

/**
 * Without Nelson's tests 4 or 8, a mixture is read from shape features only over at least this many
 * points: over fewer, a chance run of 4 of 5 beyond 1σ leaves centre shares as low as a mixture's.
 */
const MIXTURE_MINIMUM_POINTS = 16;

/** Subgroups before the episode that the change-point and cycle windows may reach back over. */
export const LOOKBACK = 30;
/** Subgroups after the last firing that the shape and spread windows may include (batch reading). */
export const LOOKAHEAD = 10;

export interface Classification {
  readonly kind: PatternKind;
  readonly evidence: PatternEvidence;
  /** For shift and trend: the window [start, end] the change point is estimated on. */
  readonly levelWindow?: { readonly start: number; readonly end: number };
  readonly period?: number;
}

/** Bounds of the data this episode may look at: up to the neighbouring episodes and the series ends. */
export interface EpisodeBounds {
  readonly lower: number;
  readonly upper: number;
}

export function classifyLevelEpisode(
  standardised: Float64Array,
  episode: Episode,
  bounds: EpisodeBounds,
  thresholds: PatternThresholds = DEFAULT_PATTERN_THRESHOLDS,
): Classification | undefined {
  const rules = [...new Set(episode.signals.map((signal) => signal.rule))];
  // Points set aside (NaN: outliers already read, the first moving range) count as the in-control
  // centre for the cycle and level models, which need an unbroken series; shape features skip them.
  const filled = standardised.map((value) => (Number.isNaN(value) ? 0 : value));
  const fired = (...ids: RuleId[]) => ids.some((id) => rules.includes(id));
  const contextStart = Math.max(bounds.lower, episode.start - LOOKBACK);
  const contextEnd = Math.min(bounds.upper, episode.end + LOOKAHEAD);
  const spanShape = shapeOver(standardised, episode.start, contextEnd);
  const shapeEvidence = spanShape ? shapeEvidenceOf(spanShape) : {};

  if (fired("nelson-7")) {
    const inside = shapeOver(standardised, episode.start, episode.end);
    const length = episode.end - episode.start + 1;
    if (inside && length >= thresholds.stratificationLength && inside.meanSquare <= thresholds.stratificationMeanSquare) {
      return { kind: "stratification", evidence: { rules, ...shapeEvidenceOf(inside) } };
    }
  }

  const cycle = readCycle(filled.subarray(contextStart, contextEnd + 1), thresholds);
  if (cycle) {
    return {
      kind: "cycle",
      period: cycle.period,
      evidence: {
        rules,
        cycleStrength: cycle.strength,
        cyclePValue: cycle.pValue,
        autocorrelationAtPeriod: cycle.autocorrelationAtPeriod,
      },
    };
  }

  if (spanShape && Math.abs(spanShape.mean) <= 1) {
    const crowdsBothSides =
      fired("nelson-4", "nelson-8") ||
      (spanShape.count >= MIXTURE_MINIMUM_POINTS && spanShape.beyondOne >= 0.5 && spanShape.bothSides >= 0.25);
    const twoPopulations =
      spanShape.alternation >= thresholds.mixtureAlternation ||
      spanShape.centreShare <= thresholds.mixtureCentreShare ||
      spanShape.bimodality >= thresholds.mixtureBimodality;
    if (crowdsBothSides && twoPopulations) return { kind: "mixture", evidence: { rules, ...shapeEvidence } };
  }

  if (spanShape && spanShape.meanSquare >= thresholds.spreadMeanSquare && spanShape.bothSides >= 0.25) {
    return {
      kind: "spread",
      evidence: { rules, ...shapeEvidence, spreadRatio: Math.sqrt(spanShape.meanSquare), direction: "increase" },
    };
  }

  // The level window runs past the last firing (LOOKAHEAD) so that a step is only called when the new
  // level persists: a single far point at the end of a window fits a one-point step as well as anything.
  const levelWindow = { start: contextStart, end: contextEnd };
  if (levelWindow.end - levelWindow.start + 1 >= 3) {
    const window = filled.subarray(levelWindow.start, levelWindow.end + 1);
    const step = stepChangePoint(window, { center: 0, sigma: 1 });
    const drift = driftChangePoint(window, { center: 0, sigma: 1 });
    const best = Math.max(step.logLikelihoodRatio, drift.logLikelihoodRatio);
    if (best >= thresholds.levelLogLikelihood) {
      const trend = drift.logLikelihoodRatio - step.logLikelihoodRatio >= thresholds.trendMargin;
      return {
        kind: trend ? "trend" : "shift",
        levelWindow,
        evidence: {
          rules,
          stepLogLikelihood: step.logLikelihoodRatio,
          driftLogLikelihood: drift.logLikelihoodRatio,
          ...(trend ? { slopeInSigma: drift.slopeInSigma } : { shiftInSigma: step.shiftInSigma }),
        },
      };
    }
  }
  return undefined;
}

function shapeOver(standardised: Float64Array, start: number, end: number): ShapeFeatures | undefined {
  const window = standardised.subarray(Math.max(0, start), end + 1);
  return window.filter((value) => !Number.isNaN(value)).length >= 4 ? shapeFeatures(window) : undefined;
}

function shapeEvidenceOf(shape: ShapeFeatures): Partial<PatternEvidence> {
  return {
    meanSquare: shape.meanSquare,
    withinOne: shape.withinOne,
    beyondOne: shape.beyondOne,
    bothSides: shape.bothSides,
    alternation: shape.alternation,
    bimodality: shape.bimodality,
    centreShare: shape.centreShare,
  };
}

/**
 * Largest mean squared scatter of the neighbours (in σ²) that still counts as calm: for 16 in-control
 * neighbours the statistic has mean 0.94 and standard deviation about 0.35, so 2 is three standard
 * deviations out, while a doubled σ gives about 4.
 */
const CALM_NEIGHBOUR_MEAN_SQUARE = 2;

/** Points beyond the 3σ limits (rule 1) that stand alone among calm neighbours. */
export function findIsolatedPoints(standardised: Float64Array, signals: readonly Signal[], thresholds: PatternThresholds): Isolation[] {
  const beyondLimits = new Set(
    signals.filter((signal) => signal.rule === "we-1" || signal.rule === "nelson-1").flatMap((signal) => signal.firing),
  );
  return [...beyondLimits]
    .sort((first, second) => first - second)
    .map((point) => isolationOf(standardised, point))
    .filter(
      (isolation) =>
        Math.abs(isolation.neighbourMean) < 1 &&
        isolation.neighbourMeanSquare <= CALM_NEIGHBOUR_MEAN_SQUARE &&
        isolation.distance >= thresholds.outlierDistance,
    );
}

function readCycle(window: Float64Array, thresholds: PatternThresholds) {
  if (window.length < 12) return undefined;
  const peak = dominantPeriod(window);
  if (peak.period < 3 || peak.period > window.length / 3 || peak.pValue >= thresholds.cyclePValue) return undefined;
  const lag = Math.round(peak.period);
  const acf = autocorrelation(window, lag);
  const atPeriod = acf[lag]!;
  const atHalf = acf[Math.max(1, Math.round(peak.period / 2))]!;
  if (atPeriod < thresholds.cycleAutocorrelation || atHalf >= 0) return undefined;
  return { period: peak.period, strength: peak.strength, pValue: peak.pValue, autocorrelationAtPeriod: atPeriod };
}
