/**
 * Pattern reading: what kind of change the signals of a chart show, when it began, and which cause
 * categories to check first.
 *
 * 1. The signals of each statistic are grouped into episodes (episodes.ts).
 * 2. Isolated points beyond the limits become outliers (classify.ts, `findIsolatedPoints`), checked on
 *    measured data for a recording slip (recording-slip.ts) against the level of their neighbours.
 *    Each remaining episode on the level statistic (x, x̄, p, np, c, u, EWMA, CUSUM) is classified from the
 *    standardised subgroup levels (level-series.ts, classify.ts). Shifts and trends get a change point
 *    estimated on the level scale by the published maximum-likelihood estimators (src/spc/change-point:
 *    normal step or drift for measured data; binomial or Poisson step for counts).
 * 3. Each episode on a dispersion statistic (R, S, MR) becomes a spread pattern (increase above the
 *    centre, welcome decrease below it) unless a level pattern already explains it: an outlier or a
 *    mixture makes moving ranges and ranges jump too, and a step makes one large moving range at the
 *    change; a spread read on the level chart is merged with it.
 * Episodes no kind explains produce no pattern (their signals stand on their own). In-control data
 * produce no signals and so no pattern.
 */
import { binomialChangePoint, driftChangePoint, poissonChangePoint, stepChangePoint } from "../change-point";
import type { ChartData, ChartResult, Signal, StatisticKey, StatisticSeries } from "../types";
import { CAUSES_OF_REDUCED_SPREAD, CAUSES_TO_CHECK } from "./causes";
import { classifyLevelEpisode, DEFAULT_PATTERN_THRESHOLDS, findIsolatedPoints, LOOKAHEAD, type Classification, type PatternThresholds } from "./classify";
import { EPISODE_GAP, groupIntoEpisodes, type Episode } from "./episodes";
import { levelSeries, type LevelSeries } from "./level-series";
import type { Pattern, PatternChangePoint, RecordingSlipReading } from "./pattern";
import { recordingSlipCandidates } from "./recording-slip";
import { spreadTest } from "./spread-test";

export interface ReadPatternsOptions {
  /** Largest gap between the signals of one episode (default 10 subgroups). */
  readonly gap?: number;
  readonly thresholds?: Partial<PatternThresholds>;
  /** The readings as originally written, one per value of variables data, for the recording-slip check. */
  readonly printedValues?: readonly string[];
  /** Largest distance, in σ, of a corrected reading from its neighbours' level (default 1.5). */
  readonly slipTolerance?: number;
}

const DISPERSION_KEYS: readonly StatisticKey[] = ["mr", "r", "s"];
/** Largest values of a dispersion statistic left out of its spread ratio (see readSpread). */
const TRIMMED_LARGEST = 2;

export function readPatterns(
  result: ChartResult,
  signals: readonly Signal[],
  data: ChartData,
  options: ReadPatternsOptions = {},
): Pattern[] {
  const thresholds = { ...DEFAULT_PATTERN_THRESHOLDS, ...options.thresholds };
  const levels = levelSeries(data, result.parameters);
  const last = levels.levels.length - 1;
  const levelSignals = signals.filter((signal) => !DISPERSION_KEYS.includes(signal.chart));
  const patterns: Pattern[] = [];

  // Isolated points first: the short-window signals that include one go with it, so that a chance
  // firing nearby does not hide it inside a larger episode, nor it distort the reading of one.
  const isolated = findIsolatedPoints(levels.standardised, levelSignals, thresholds);
  // Windows of at most 5 points (rules 1, 2 of 3, 4 of 5) that contain the point fire within 4 after it.
  const ownedBy = (signal: Signal, point: number) =>
    signal.start >= point - 4 && signal.firing.every((firing) => firing >= point && firing <= point + 4);
  for (const isolation of isolated) {
    const owned = levelSignals.filter((signal) => ownedBy(signal, isolation.index));
    const recordingSlip = readRecordingSlip(isolation.index, levels, result, data, options);
    patterns.push({
      kind: "outlier",
      chart: owned[0]?.chart ?? levelSignals[0]!.chart,
      start: isolation.index,
      end: isolation.index,
      evidence: {
        rules: [...new Set(owned.map((signal) => signal.rule))],
        isolation: isolation.distance,
        ...(recordingSlip ? { recordingSlip } : {}),
      },
      causes: CAUSES_TO_CHECK.outlier,
    });
  }
  // The outliers are read; the other patterns are read without them.
  const standardised = Float64Array.from(levels.standardised);
  for (const isolation of isolated) standardised[isolation.index] = Number.NaN;
  const remaining = signals.filter(
    (signal) => DISPERSION_KEYS.includes(signal.chart) || !isolated.some((isolation) => ownedBy(signal, isolation.index)),
  );
  const episodes = groupIntoEpisodes(remaining, options.gap ?? EPISODE_GAP);
  const levelEpisodes = episodes.filter((episode) => !DISPERSION_KEYS.includes(episode.chart));

  levelEpisodes.forEach((episode, position) => {
    const previous = levelEpisodes[position - 1];
    const next = levelEpisodes[position + 1];
    const bounds = {
      lower: previous && previous.chart === episode.chart ? previous.end + 1 : 0,
      upper: next && next.chart === episode.chart ? next.start - 1 : last,
    };
    const classification = classifyLevelEpisode(standardised, episode, bounds, thresholds);
    if (classification) patterns.push(toPattern(classification, episode, levels, result, data));
  });

  for (const episode of episodes.filter((candidate) => DISPERSION_KEYS.includes(candidate.chart))) {
    const series = result.statistics.find((statistic) => statistic.key === episode.chart);
    if (!series) continue;
    const explained = patterns.find((pattern) => explains(pattern, episode));
    if (explained) continue;
    const spread = readSpread(series, episode, data, result.parameters.sigma, last, thresholds);
    if (spread) patterns.push(spread);
  }
  return patterns.sort((first, second) => first.start - second.start);
}

/** Whether a level pattern already accounts for a dispersion episode (see the file comment). */
function explains(pattern: Pattern, episode: Episode): boolean {
  const overlaps = episode.start <= pattern.end + 1 && episode.end >= pattern.start - 1;
  if (!overlaps) return false;
  if (pattern.kind === "shift" || pattern.kind === "trend") {
    const change = pattern.changePoint?.index;
    return change !== undefined && episode.firing.length <= 2 && episode.firing.every((point) => Math.abs(point - change - 1) <= 1);
  }
  return true;
}

/**
 * Spread from a dispersion episode: the mean of the statistic over the episode and up to LOOKAHEAD
 * points after it, against its centre line, leaving out the two largest values (a single far value makes
 * two large moving ranges). At least LOOKAHEAD + 1 points are used (the window reaches back when the
 * series ends), and the change must be significant by the variance test of spread-test.ts, so one
 * chance point beyond the limit does not make a pattern.
 */
function readSpread(
  series: StatisticSeries,
  episode: Episode,
  data: ChartData,
  sigma: number,
  last: number,
  thresholds: PatternThresholds,
): Pattern | undefined {
  const end = Math.min(last, episode.end + LOOKAHEAD);
  const start = Math.max(0, Math.min(episode.start, end - LOOKAHEAD));
  const points = [...series.points.subarray(start, end + 1)].filter((point) => !Number.isNaN(point)).sort((a, b) => a - b);
  const kept = points.slice(0, Math.max(1, points.length - TRIMMED_LARGEST));
  if (points.length === 0 || !(series.center > 0)) return undefined;
  const ratio = kept.reduce((sum, point) => sum + point, 0) / kept.length / series.center;
  // The reading must agree with what fired: points above the centre line cannot show a decrease.
  const firedAbove = episode.firing.some((point) => series.points[point]! > series.center);
  const firedBelow = episode.firing.some((point) => series.points[point]! < series.center);
  // Beyond chance too: a single range above its limit among ordinary ones is a signal, not a new spread.
  const test = data.kind === "variables" ? spreadTest(data, sigma, start, end) : undefined;
  if (!test) return undefined;
  const increase = firedAbove && ratio >= thresholds.spreadRatio && test.pIncrease < thresholds.spreadSignificance;
  const decrease = firedBelow && ratio <= 1 / thresholds.spreadRatio && test.pDecrease < thresholds.spreadSignificance;
  if (!increase && !decrease) return undefined;
  return {
    kind: "spread",
    chart: series.key,
    start: episode.start,
    end: episode.end,
    evidence: {
      rules: [...new Set(episode.signals.map((signal) => signal.rule))],
      spreadRatio: ratio,
      spreadPValue: increase ? test.pIncrease : test.pDecrease,
      direction: increase ? "increase" : "decrease",
    },
    causes: increase ? CAUSES_TO_CHECK.spread : CAUSES_OF_REDUCED_SPREAD,
  };
}

function toPattern(
  classification: Classification,
  episode: Episode,
  levels: LevelSeries,
  result: ChartResult,
  data: ChartData,
): Pattern {
  const { kind, evidence, levelWindow } = classification;
  const changePoint = levelWindow ? estimateChangePoint(kind === "trend" ? "drift" : "step", levelWindow, levels, result, data) : undefined;
  return {
    kind,
    chart: episode.chart,
    start: episode.start,
    end: episode.end,
    ...(changePoint ? { changePoint } : {}),
    ...(classification.period !== undefined ? { period: classification.period } : {}),
    evidence,
    causes: CAUSES_TO_CHECK[kind],
  };
}

/** Change point on the level scale with the estimator that matches the data, shifted to series indices. */
function estimateChangePoint(
  shape: "step" | "drift",
  window: { start: number; end: number },
  levels: LevelSeries,
  result: ChartResult,
  data: ChartData,
): PatternChangePoint {
  const range = [window.start, window.end + 1] as const;
  const sigma = levels.sigmas.subarray(...range);
  let model: PatternChangePoint["model"] = shape;
  let estimate;
  if (shape === "drift" || data.kind === "variables") {
    const options = { center: levels.center, sigma };
    estimate = shape === "drift" ? driftChangePoint(levels.levels.subarray(...range), options) : stepChangePoint(levels.levels.subarray(...range), options);
  } else if (result.chart === "p" || result.chart === "np") {
    model = "binomial";
    estimate = binomialChangePoint(data.counts.subarray(...range), { fraction: levels.center, sizes: data.sizes.subarray(...range) });
  } else {
    model = "poisson";
    const units = result.chart === "u" ? data.sizes.subarray(...range) : undefined;
    estimate = poissonChangePoint(data.counts.subarray(...range), { rate: levels.center, ...(units ? { units } : {}) });
  }
  return {
    model,
    index: estimate.index + window.start,
    window: {
      start: estimate.confidenceSet.start + window.start,
      end: estimate.confidenceSet.end + window.start,
      level: estimate.confidenceSet.level,
    },
  };
}

/**
 * For measured data: the reading in the outlying subgroup farthest from its neighbours' level, and the
 * values one recording slip away from it that land near that level.
 */
function readRecordingSlip(
  index: number,
  levels: LevelSeries,
  result: ChartResult,
  data: ChartData,
  options: ReadPatternsOptions,
): RecordingSlipReading | undefined {
  if (data.kind !== "variables") return undefined;
  const sigma = result.parameters.sigma;
  const neighbours: number[] = [];
  for (let offset = 1; offset <= 8; offset++) {
    for (const position of [index - offset, index + offset]) {
      const level = levels.levels[position];
      if (level !== undefined) neighbours.push(level);
    }
  }
  if (neighbours.length === 0 || !(sigma > 0)) return undefined;
  const level = neighbours.reduce((sum, value) => sum + value, 0) / neighbours.length;
  let valueIndex = data.offsets[index]!;
  for (let position = valueIndex; position < data.offsets[index + 1]!; position++) {
    if (Math.abs(data.values[position]! - level) > Math.abs(data.values[valueIndex]! - level)) valueIndex = position;
  }
  const printed = options.printedValues?.[valueIndex] ?? String(data.values[valueIndex]);
  const candidates = recordingSlipCandidates(printed, { level, sigma, tolerance: options.slipTolerance ?? 1.5 });
  return candidates.length > 0 ? { printed, valueIndex, candidates } : undefined;
}
