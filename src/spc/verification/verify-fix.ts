/**
 * Verification of a fix: after an adjustment at subgroup `adjustedAt`, is the process back in control?
 *
 * 1. Limits come from the baseline: the subgroups the caller names, or by default all subgroups before
 *    the first point beyond refined Phase I limits (see `defaultBaseline` for why rule 1 only).
 * 2. The verification window is the first m* subgroups from the adjustment. m* is set by the caller or
 *    is the smallest m with P(a Shewhart 3σ chart signals within m subgroups | shift δ) ≥ power
 *    (src/spc/power `subgroupsNeeded`, closed form; δ in σ of one value for measured data, in σ of the
 *    plotted statistic for counts). Later subgroups are ordinary monitoring and not part of the verdict.
 * 3. On the window, charted afresh with the frozen baseline parameters:
 *    - no rule of the chosen set fires;
 *    - the mean of the plotted levels is equivalent to the reference (target, else the baseline centre)
 *      within ±δσ_level·√n (= δσ of one value) by two one-sided t-tests at α (Schuirmann 1987, tost.ts);
 *    - the spread of the plotted levels is not larger than in the baseline: one-sided F test at α
 *      (NIST/SEMATECH e-Handbook §1.3.5.9), with Brown–Forsythe's robust test beside it
 *      (src/spc/evidence) — measured data only;
 *    - capability before (baseline) and after (window) with confidence intervals when specification
 *      limits exist (src/spc/capability.ts), reported beside the verdict, not part of it.
 *    Verdict: `failed` if a rule fires in the part of the window seen so far, or when the window is
 *    complete and equivalence is not shown or the spread grew; `insufficient-data` while fewer than m*
 *    subgroups exist after the adjustment (with how many more are needed); otherwise `passed`.
 * 4. Beside the verdict: the probability that the rule set fires by chance over m* in-control subgroups
 *    (simulated, src/spc/power), since with many rules chance firings grow with the window.
 */
import { computeCapability, type TCapabilityResult } from "../capability";
import { estimateParameters, evaluateChart } from "../charts";
import { subgroupCount, subgroupMeans } from "../data";
import { brownForsytheBeforeAfter, median, varianceRatioTest, type EvidenceResult, type SpreadChangeEffect, type SpreadComparisonEffect } from "../evidence";
import { levelSeries } from "../patterns/level-series";
import { simulateFalseAlarmProbability, subgroupsNeeded, type SimulatedProbability } from "../power";
import type { Rng } from "../random";
import { evaluateRules } from "../rules";
import { SpcInputError, type BaselineSpec, type ChartData, type ChartParameters, type ChartType, type CusumDesign, type EwmaDesign, type RuleId, type Signal } from "../types";
import { sliceSubgroups } from "./slice-data";
import { oneSampleEquivalence, type EquivalenceTest } from "./tost";

export interface VerifyFixInput {
  readonly chart: ChartType;
  readonly data: ChartData;
  /** Index of the first subgroup made after the adjustment. */
  readonly adjustedAt: number;
  readonly rules: readonly RuleId[];
  /** Baseline for the limits; default: every subgroup before the first signal. */
  readonly baseline?: BaselineSpec;
  /** Shift to detect, in σ (default 1). */
  readonly delta?: number;
  /** Wanted probability of detecting that shift within the window (default 0.9). */
  readonly power?: number;
  /** A window length chosen by the user instead of the power calculation. */
  readonly windowLength?: number;
  /** Reference for the equivalence test instead of the baseline centre. */
  readonly target?: number;
  readonly lsl?: number;
  readonly usl?: number;
  /** Level of the equivalence and spread tests (default 0.05). */
  readonly alpha?: number;
  readonly subgroupSize?: number;
  readonly ewma?: EwmaDesign;
  readonly cusum?: CusumDesign;
  /** Generator for the false-alarm simulation, and its number of runs (default 4000). */
  readonly rng: Rng;
  readonly falseAlarmRuns?: number;
}

export type Verdict = "passed" | "failed" | "insufficient-data";

export interface VerificationResult {
  readonly verdict: Verdict;
  readonly reasons: readonly string[];
  readonly adjustedAt: number;
  /** Subgroups that exist from the adjustment on. */
  readonly subgroupsAfter: number;
  /** m*: the window length. */
  readonly subgroupsNeeded: number;
  /** How many more subgroups the window still needs (0 when complete). */
  readonly subgroupsMissing: number;
  readonly window: { readonly start: number; readonly end: number };
  readonly parameters: ChartParameters;
  /** Signals inside the window, with indices in the whole series. */
  readonly signals: readonly Signal[];
  readonly falseAlarmProbability: SimulatedProbability;
  readonly tests: {
    readonly meanEquivalence?: EquivalenceTest;
    readonly spreadF?: EvidenceResult<SpreadChangeEffect>;
    readonly spreadBrownForsythe?: EvidenceResult<SpreadComparisonEffect>;
  };
  readonly capability?: { readonly before: TCapabilityResult; readonly after: TCapabilityResult };
}

export function verifyFix(input: VerifyFixInput): VerificationResult {
  const { chart, data, adjustedAt, rules } = input;
  const total = subgroupCount(data);
  if (!(Number.isInteger(adjustedAt) && adjustedAt >= 1 && adjustedAt < total)) {
    throw new SpcInputError(`the adjustment index must be a subgroup from 1 to ${total - 1}, got ${adjustedAt}`, adjustedAt);
  }
  const delta = input.delta ?? 1;
  const alpha = input.alpha ?? 0.05;
  if (!(delta > 0) || !Number.isFinite(delta)) throw new SpcInputError(`delta must be a positive number, got ${delta}`);
  const estimateOptions = {
    ...(input.subgroupSize !== undefined ? { subgroupSize: input.subgroupSize } : {}),
    ...(input.ewma ? { ewma: input.ewma } : {}),
    ...(input.cusum ? { cusum: input.cusum } : {}),
    ...(input.target !== undefined ? { target: input.target } : {}),
  };
  const baseline = input.baseline ?? defaultBaseline(chart, data, adjustedAt, estimateOptions);
  if ((baseline.end ?? total) > adjustedAt) {
    throw new SpcInputError(`the baseline must end at or before the adjustment (subgroup ${adjustedAt})`, adjustedAt);
  }
  const parameters = estimateParameters(chart, data, { ...estimateOptions, baseline });

  const plottedSize = data.kind === "variables" ? parameters.subgroupSize : 1;
  const needed =
    input.windowLength ?? subgroupsNeeded({ delta, n: plottedSize, ...(input.power !== undefined ? { probability: input.power } : {}) });
  if (!(Number.isInteger(needed) && needed >= 2)) throw new SpcInputError(`the verification window needs at least 2 subgroups, got ${needed}`);
  const after = total - adjustedAt;
  const windowEnd = adjustedAt + Math.min(needed, after);
  const windowData = sliceSubgroups(data, adjustedAt, windowEnd);
  const windowResult = evaluateChart(windowData, parameters);
  const signals = windowResult.statistics
    .flatMap((series) => evaluateRules(series, rules).signals)
    .map((signal) => shiftSignal(signal, adjustedAt))
    .sort((first, second) => first.end - second.end);
  const falseAlarmProbability = simulateFalseAlarmProbability({
    m: needed,
    rules,
    evaluate: evaluateRules,
    rng: input.rng,
    runs: input.falseAlarmRuns ?? 4000,
  });

  const reasons = signals.map(
    (signal) => `rule ${signal.rule} fired on ${signal.chart} at subgroup ${signal.end} (window ${signal.start}..${signal.end})`,
  );
  const missing = Math.max(0, needed - after);
  const base = {
    adjustedAt,
    subgroupsAfter: after,
    subgroupsNeeded: needed,
    subgroupsMissing: missing,
    window: { start: adjustedAt, end: windowEnd - 1 },
    parameters,
    signals,
    falseAlarmProbability,
  };
  if (missing > 0) {
    const verdict: Verdict = signals.length > 0 ? "failed" : "insufficient-data";
    const waiting = `the verification window needs ${needed} subgroups after the adjustment; ${after} exist, ${missing} more needed`;
    return { ...base, verdict, reasons: verdict === "failed" ? reasons : [waiting], tests: {} };
  }

  const baselineRange = { start: parameters.baseline.start, end: parameters.baseline.end };
  const levels = levelSeries(data, parameters);
  const windowLevels = levels.levels.subarray(adjustedAt, windowEnd);
  const reference = input.target ?? parameters.center;
  const levelSigma = mean(levels.sigmas.subarray(adjustedAt, windowEnd));
  const margin = delta * levelSigma * Math.sqrt(plottedSize);
  const meanEquivalence = oneSampleEquivalence(windowLevels, reference, margin, alpha);
  if (!meanEquivalence.equivalent) {
    reasons.push(
      `the mean is not shown equivalent to ${reference} within ±${margin} (${meanEquivalence.test}, p = ${meanEquivalence.pValue.toPrecision(3)})`,
    );
  }
  let tests: VerificationResult["tests"] = { meanEquivalence };
  let capability: VerificationResult["capability"];
  if (data.kind === "variables") {
    const baselineLevels = levels.levels.subarray(baselineRange.start, baselineRange.end);
    const labels = { variable: "the subgroup level" };
    const spreadF = varianceRatioTest(baselineLevels, windowLevels, labels, "greater");
    const spreadBrownForsythe = brownForsytheBeforeAfter(baselineLevels, windowLevels, labels);
    tests = { ...tests, spreadF, spreadBrownForsythe };
    if (spreadF.pValue < alpha) reasons.push(`the spread grew: ${spreadF.sentence}`);
    if (input.lsl !== undefined || input.usl !== undefined) {
      capability = capabilityBeforeAfter(input, parameters, windowData, baselineRange, { start: adjustedAt, end: windowEnd, inControl: signals.length === 0 }, estimateOptions);
    }
  }
  return { ...base, verdict: reasons.length === 0 ? "passed" : "failed", reasons, tests, ...(capability ? { capability } : {}) };
}

function mean(values: Float64Array): number {
  return values.reduce((sum, value) => sum + value, 0) / values.length;
}

function shiftSignal(signal: Signal, offset: number): Signal {
  return { ...signal, start: signal.start + offset, end: signal.end + offset, firing: signal.firing.map((point) => point + offset) };
}

/**
 * Every subgroup before the first signal. Limits from everything before the adjustment are widened and
 * moved by the disturbance itself, so they are first refined the way a Phase I study is (Montgomery,
 * Introduction to Statistical Quality Control, §6.2.1 "trial control limits", from memory), centred on
 * the median subgroup mean for measured data: leave out
 * the points beyond the limits, recompute, and repeat until no new point falls outside (at most
 * BASELINE_ITERATIONS times). With those limits, the baseline ends at the first point beyond them.
 * Only rule 1 counts here: over a Phase I history of 40–60 subgroups the full Western Electric or Nelson
 * set fires by chance in a third or more of in-control series (their in-control ARL is 92 and less),
 * which would cut the baseline short for nothing; a smaller disturbance that stays inside the limits
 * is the caller's to exclude by naming the baseline.
 */
function defaultBaseline(
  chart: ChartType,
  data: ChartData,
  adjustedAt: number,
  options: Parameters<typeof estimateParameters>[2],
): BaselineSpec {
  const before = sliceSubgroups(data, 0, adjustedAt);
  const excluded = new Set<number>();
  let signals: Signal[] = [];
  const levels = before.kind === "variables" ? subgroupMeans(before) : undefined;
  for (let iteration = 0; iteration < BASELINE_ITERATIONS; iteration++) {
    // Measured data: the trial centre is the median subgroup mean, which a disturbance affecting fewer
    // than half of the subgroups cannot drag across the in-control points.
    const kept = levels?.filter((_, index) => !excluded.has(index));
    const trialCentre = kept ? { target: median(kept) } : {};
    const parameters = estimateParameters(chart, before, { ...options, ...trialCentre, baseline: { exclude: [...excluded] } });
    signals = evaluateChart(before, parameters).statistics.flatMap((series) => evaluateRules(series, BEYOND_LIMITS).signals);
    const beyond = signals.filter((signal) => BEYOND_LIMITS.includes(signal.rule)).flatMap((signal) => signal.firing);
    const fresh = beyond.filter((point) => !excluded.has(point));
    if (fresh.length === 0 || excluded.size + fresh.length > adjustedAt - MINIMUM_BASELINE) break;
    for (const point of fresh) excluded.add(point);
  }
  const beyond = signals.filter((signal) => BEYOND_LIMITS.includes(signal.rule)).map((signal) => signal.start);
  const start = beyond.length === 0 ? adjustedAt : Math.min(...beyond);
  if (start < MINIMUM_BASELINE) {
    throw new SpcInputError(`a rule fires from subgroup ${start}, leaving no in-control baseline before it: name the baseline`, start);
  }
  return { start: 0, end: start };
}

const BEYOND_LIMITS: readonly RuleId[] = ["we-1", "nelson-1"];

/** Rounds of trial limits (points beyond the limits settle in two or three in practice). */
const BASELINE_ITERATIONS = 10;
/** Fewest subgroups a default baseline may have. */
const MINIMUM_BASELINE = 5;

function capabilityBeforeAfter(
  input: VerifyFixInput,
  parameters: ChartParameters,
  windowData: ChartData,
  baseline: { start: number; end: number },
  window: { start: number; end: number; inControl: boolean },
  options: Parameters<typeof estimateParameters>[2],
): { before: TCapabilityResult; after: TCapabilityResult } {
  if (input.data.kind !== "variables" || windowData.kind !== "variables") throw new SpcInputError("capability needs measured values");
  const { values, offsets } = input.data;
  const specification = {
    ...(input.lsl !== undefined ? { lsl: input.lsl } : {}),
    ...(input.usl !== undefined ? { usl: input.usl } : {}),
  };
  const afterParameters = estimateParameters(input.chart, windowData, options);
  return {
    before: computeCapability({
      values: values.subarray(offsets[baseline.start]!, offsets[baseline.end]!),
      mean: parameters.center,
      withinSigma: parameters.sigma,
      subgroupCount: baseline.end - baseline.start,
      inControl: true,
      ...specification,
    }),
    after: computeCapability({
      values: values.subarray(offsets[window.start]!, offsets[window.end]!),
      mean: afterParameters.center,
      withinSigma: afterParameters.sigma,
      subgroupCount: window.end - window.start,
      inControl: window.inControl,
      ...specification,
    }),
  };
}
