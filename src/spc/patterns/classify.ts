/**
 * Classifier: which pattern explains an episode of signals on a level chart (x, x̄, p, np, c, u, EWMA,
 * CUSUM). Reads the standardised levels zᵢ around the episode and tries the kinds in a fixed order. Every
 * kind must show evidence beyond what chance firings of the rule set produce on in-control data: a test
 * with a stated level, or a threshold above the largest value seen in seeded in-control simulations
 * (scripts/calibrate-patterns.ts; the confusion matrix is in docs/patterns-and-verification.md):
 *
 * (Outliers are taken out before, by `findIsolatedPoints`: a point beyond the 3σ limits that stands
 * farther from its calm neighbours than the largest of the chart's in-control points reaches by chance
 * (isolation.ts); the signals that include it go with it, and the rest of the episode is read here.)
 * 1. stratification: Nelson's test 7 fired and the points from the episode's start to LOOKAHEAD after it
 *    hug the centre, mean z² at most `stratificationMeanSquare` over at least `stratificationLength`
 *    subgroups (a single chance run of 15 inside ±1σ is followed by ordinary scatter);
 * 2. cycle: a periodogram peak with period between 3 and a third of the window that Fisher's g test finds
 *    significant (p < `cyclePValue`), confirmed by the autocorrelation: positive at the period (above
 *    Bartlett's 95 % white-noise band, or `cycleAutocorrelation` if that is lower) and negative at half
 *    the period (a step or drift gives positive autocorrelation at every short lag and no trough);
 * 3. mixture: no net level change, points crowding both sides (Nelson's tests 4 or 8, or more points
 *    beyond 1σ than the binomial allows with a quarter of them on the minority side), a two-population
 *    signature (alternation, a hole at the centre, or a bimodality coefficient above 5/9), and more
 *    variance than the limits allow (χ² test);
 * 4. spread: mean z² at least `spreadMeanSquare` with at least a quarter of the points beyond 1σ on the
 *    minority side (a shift or a trend puts them nearly all on one side), more variance than the limits
 *    allow (χ²), and more than before the episode (F test);
 * 5. shift or trend: the two-segment statistic (segment-shift.ts) reaches `segmentLogLikelihood`, or the
 *    larger of the step (Samuel, Pignatiello & Calvin 1998) and drift (Perry & Pignatiello 2006) profile
 *    log-likelihood ratios against the known centre (src/spc/change-point) reaches `levelLogLikelihood`;
 *    trend when the drift beats the step by `trendMargin`, else shift. In 240 seeded in-control series
 *    read with all eight Nelson tests the largest two-segment value was 6.8 (threshold 8) and the 99th
 *    percentiles of the step and drift values 7.8 and 5.5 (largest 15.0 and 12.3; threshold 12), while
 *    the lowest 1 % of planted shifts (≥ 1.5σ) gave 10.3 and 27 and of planted trends 21 and 52.
 * An episode that passes none of these is left unread: the signal stays, but no pattern is claimed.
 */
import chisquareQuantile from "@stdlib/stats-base-dists-chisquare-quantile";
import binomialCdf from "@stdlib/stats-base-dists-binomial-cdf";
import fCdf from "@stdlib/stats-base-dists-f-cdf";
import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import normalQuantile from "@stdlib/stats-base-dists-normal-quantile";
import { autocorrelation, dominantPeriod, whiteNoiseBand } from "../evidence";
import { driftChangePoint, stepChangePoint } from "../change-point";
import type { PatternKind } from "../../../shared/patterns";
import type { RuleId, Signal } from "../types";
import type { Episode } from "./episodes";
import { isolationOf, type Isolation } from "./isolation";
import type { PatternEvidence } from "./pattern";
import { segmentShiftLogLikelihood } from "./segment-shift";
import { shapeFeatures, type ShapeFeatures } from "./shape-features";

export interface PatternThresholds {
  readonly stratificationMeanSquare: number;
  readonly stratificationLength: number;
  /** Chance that any in-control point of the chart stands out enough to be read as an outlier. */
  readonly outlierSignificance: number;
  readonly cyclePValue: number;
  readonly cycleAutocorrelation: number;
  readonly mixtureCentreShare: number;
  readonly mixtureBimodality: number;
  readonly mixtureAlternation: number;
  /** Binomial upper-tail level for the share of points beyond 1σ (see avoidsCentre). */
  readonly centreAvoidanceSignificance: number;
  readonly spreadMeanSquare: number;
  /** Upper-tail χ² level for the excess variance a mixture or a level-chart spread must show. */
  readonly varianceSignificance: number;
  /** Step or drift against the known centre (change-point/step.ts, drift.ts). */
  readonly levelLogLikelihood: number;
  /** Two segments with both levels unknown (segment-shift.ts). */
  readonly segmentLogLikelihood: number;
  readonly trendMargin: number;
  /** Spread read from an R, S or MR chart: ratio of the statistic's mean to its centre. */
  readonly spreadRatio: number;
  /** One-sided level of the variance test behind a spread read from an R, S or MR chart. */
  readonly spreadSignificance: number;
  /** Upper-tail F level for the scatter after an episode's start against before it. */
  readonly spreadGrowthSignificance: number;
}

export const DEFAULT_PATTERN_THRESHOLDS: PatternThresholds = {
  stratificationMeanSquare: 0.4,
  stratificationLength: 20,
  outlierSignificance: 0.02,
  cyclePValue: 0.01,
  cycleAutocorrelation: 0.3,
  mixtureCentreShare: 0.25,
  mixtureBimodality: 5 / 9,
  mixtureAlternation: 0.8,
  centreAvoidanceSignificance: 0.001,
  spreadMeanSquare: 2.5,
  varianceSignificance: 0.001,
  levelLogLikelihood: 12,
  segmentLogLikelihood: 8,
  trendMargin: 1,
  spreadRatio: 1.4,
  spreadSignificance: 0.001,
  spreadGrowthSignificance: 0.05,
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
/** Subgroups after the last firing that the cycle window may include. */
const CYCLE_LOOKAHEAD = 40;

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
    // Over the episode and the points after it: a chance run of 15 inside ±1σ is followed by ordinary
    // scatter, stratification by more of the same.
    const length = contextEnd - episode.start + 1;
    if (spanShape && length >= thresholds.stratificationLength && spanShape.meanSquare <= thresholds.stratificationMeanSquare) {
      return { kind: "stratification", evidence: { rules, ...shapeEvidence } };
    }
  }

  // A weak wave fires now and then, so its signals fall into several episodes; the cycle is looked for
  // past the next episode, up to CYCLE_LOOKAHEAD after the last firing, where a wave that persists shows
  // more clearly each period (bounded: the periodogram costs O(N²)).
  const cycle = readCycle(filled.subarray(contextStart, episode.end + CYCLE_LOOKAHEAD + 1), thresholds);
  if (cycle) {
    return {
      kind: "cycle",
      period: cycle.period,
      evidence: {
        rules,
        cycleStrength: cycle.strength,
        cyclePValue: 0.01,
        autocorrelationAtPeriod: cycle.autocorrelationAtPeriod,
      },
    };
  }

  if (spanShape && Math.abs(spanShape.mean) <= 1) {
    const crowdsBothSides =
      fired("nelson-4", "nelson-8") ||
      (spanShape.count >= MIXTURE_MINIMUM_POINTS && spanShape.bothSides >= 0.25 && avoidsCentre(spanShape, thresholds));
    const twoPopulations =
      spanShape.alternation >= thresholds.mixtureAlternation ||
      spanShape.centreShare <= thresholds.mixtureCentreShare ||
      spanShape.bimodality >= thresholds.mixtureBimodality;
    if (crowdsBothSides && twoPopulations && excessVariance(spanShape, thresholds)) return { kind: "mixture", evidence: { rules, ...shapeEvidence } };
  }

  if (
    spanShape &&
    spanShape.meanSquare >= thresholds.spreadMeanSquare &&
    spanShape.bothSides >= 0.25 &&
    excessVariance(spanShape, thresholds) &&
    grewFromBefore(standardised, contextStart, episode.start, spanShape, thresholds)
  ) {
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
    const segment = segmentShiftLogLikelihood(window);
    const significant =
      segment >= thresholds.segmentLogLikelihood ||
      Math.max(step.logLikelihoodRatio, drift.logLikelihoodRatio) >= thresholds.levelLogLikelihood;
    if (significant) {
      const trend = drift.logLikelihoodRatio - step.logLikelihoodRatio >= thresholds.trendMargin;
      return {
        kind: trend ? "trend" : "shift",
        levelWindow,
        evidence: {
          rules,
          stepLogLikelihood: step.logLikelihoodRatio,
          driftLogLikelihood: drift.logLikelihoodRatio,
          segmentLogLikelihood: segment,
          ...(trend ? { slopeInSigma: drift.slopeInSigma } : { shiftInSigma: step.shiftInSigma }),
        },
      };
    }
  }
  return undefined;
}

/**
 * Whether the points vary more than chance allows: Σzᵢ² over N points is χ²_N in control (known centre
 * and σ), tested in the upper tail at `varianceSignificance` (the χ² test for a variance, e.g.
 * NIST/SEMATECH e-Handbook §1.3.5.8). A mixture of streams at ±a has E z² = 1 + a², a spread ×k has k²;
 * a chance run of alternations (Nelson 4) or of points beyond 1σ leaves Σz² near N.
 */
function excessVariance(shape: ShapeFeatures, thresholds: PatternThresholds): boolean {
  return shape.count * shape.meanSquare >= chisquareQuantile(1 - thresholds.varianceSignificance, shape.count);
}

/**
 * Nelson's test 8 read over a whole stretch: more points beyond 1σ than chance allows. In control a
 * point is beyond 1σ with probability 2(1 − Φ(1)) = 0.3173, so the count over N points is binomial;
 * the upper-tail probability must be below `centreAvoidanceSignificance`.
 */
function avoidsCentre(shape: ShapeFeatures, thresholds: PatternThresholds): boolean {
  const beyond = Math.round(shape.beyondOne * shape.count);
  return 1 - binomialCdf(beyond - 1, shape.count, BEYOND_ONE_SIGMA) < thresholds.centreAvoidanceSignificance;
}

/** P(|Z| > 1) for a standard normal Z. */
const BEYOND_ONE_SIGMA = 2 * (1 - normalCdf(1, 0, 1));

/** Fewest points before an episode that its scatter is compared with (below that, only the limits). */
const MINIMUM_POINTS_BEFORE = 10;

/**
 * Whether the scatter grew at the episode, not merely exceeds the limits: Σz²/N after against before the
 * episode (both about the known centre, so each is χ²_N/N in control and the ratio is F), upper tail at
 * `spreadGrowthSignificance` (the F test for two variances, NIST/SEMATECH e-Handbook §1.3.5.9). Limits
 * computed from data that scatter more than the model says throughout (overdispersed counts) put many
 * points near them everywhere; that is not a change in spread.
 */
function grewFromBefore(
  standardised: Float64Array,
  start: number,
  end: number,
  after: ShapeFeatures,
  thresholds: PatternThresholds,
): boolean {
  const before = standardised.subarray(start, end).filter((value) => !Number.isNaN(value));
  if (before.length < MINIMUM_POINTS_BEFORE) return true;
  const meanSquareBefore = before.reduce((sum, value) => sum + value * value, 0) / before.length;
  if (meanSquareBefore === 0) return true;
  const ratio = after.meanSquare / meanSquareBefore;
  return 1 - fCdf(ratio, after.count, before.length) < thresholds.spreadGrowthSignificance;
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

/**
 * Points beyond the 3σ limits (rule 1) that stand alone among calm neighbours, farther from their level
 * than the largest of the chart's N in-control points reaches by chance: the distance z − (mean of k
 * neighbours) has variance 1 + 1/k, and the largest |z| of N independent normal points exceeds
 * Φ⁻¹(1 − α/(2N)) with probability at most α (Šidák/Bonferroni bound for the maximum normed residual with
 * σ known; common practice), α = `outlierSignificance`. With 16 neighbours and α = 2 %: about 3.5σ for
 * 30 points, 3.9σ for 120, 4.4σ for 1000 — a short chart needs less to single a point out, a long one
 * more. The distance is divided by the neighbours' own scatter when that exceeds 1: limits estimated
 * from a short baseline can understate σ, and then every point looks farther out than it is.
 */
export function findIsolatedPoints(standardised: Float64Array, signals: readonly Signal[], thresholds: PatternThresholds): Isolation[] {
  const defined = standardised.filter((value) => !Number.isNaN(value)).length;
  const largestByChance = normalQuantile(1 - thresholds.outlierSignificance / (2 * Math.max(1, defined)), 0, 1);
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
        isolation.distance / Math.sqrt(Math.max(1, isolation.neighbourMeanSquare)) >=
          largestByChance * Math.sqrt(1 + 1 / Math.max(1, isolation.neighbours)),
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
  if (atPeriod < Math.min(thresholds.cycleAutocorrelation, whiteNoiseBand(window.length)) || atHalf >= 0) return undefined;
  return { period: peak.period, strength: peak.strength, pValue: peak.pValue, autocorrelationAtPeriod: atPeriod };
}
