/**
 * Detection power and false-alarm probability of a set of run rules, by simulation.
 *
 * Each run draws m standardised subgroup means z_i ~ N(δ√n, 1) (the mean of n independent values
 * after a shift of δ individual-value sigmas, in units of its own sigma, which is exact), builds the
 * plotted series with centre 0, sigma 1 and limits ±3, and asks the rule evaluator whether any rule
 * fires within the m subgroups. The shift is present from the first subgroup (zero-state, as in
 * Champ & Woodall 1987, Technometrics 29, 393–399), which is the situation of a verification window
 * that starts just after an adjustment. With δ = 0 the result is the false-alarm probability of the
 * rule set over m in-control subgroups.
 *
 * The estimate is the fraction of runs with a signal; its standard error √(p(1 − p)/runs) is returned
 * so callers can state the precision. Cost: runs × one evaluation of m points.
 */
import type { Rng } from "../random";
import { SpcInputError, type RuleId, type Signal, type StatisticSeries } from "../types";
import { SHEWHART_LIMIT_WIDTH } from "./shewhart";

/** The rules engine, passed in (src/spc/rules `evaluateRules` fits this shape). */
export type RuleEvaluator = (series: StatisticSeries, rules: readonly RuleId[]) => { readonly signals: readonly Signal[] };

export interface SimulationOptions {
  /** Shift in individual-value sigma units (0 for false alarms). */
  readonly delta: number;
  /** Subgroup size. */
  readonly n: number;
  /** Subgroups in the window. */
  readonly m: number;
  readonly rules: readonly RuleId[];
  readonly evaluate: RuleEvaluator;
  readonly rng: Rng;
  /** Number of simulated windows (default 10 000). */
  readonly runs?: number;
}

export interface SimulatedProbability {
  readonly probability: number;
  readonly standardError: number;
  readonly runs: number;
}

/** Estimated P(some rule fires within m subgroups) after a shift of delta sigma. */
export function simulateSignalProbability(options: SimulationOptions): SimulatedProbability {
  const { delta, n, m, rules, evaluate, rng, runs = 10_000 } = options;
  if (!Number.isFinite(delta)) throw new SpcInputError(`delta must be a finite number, got ${delta}`);
  for (const [name, value] of [["n", n], ["m", m], ["runs", runs]] as const) {
    if (!(Number.isInteger(value) && value >= 1)) throw new SpcInputError(`${name} must be a positive integer, got ${value}`);
  }
  const offset = delta * Math.sqrt(n);
  const points = new Float64Array(m);
  const series: StatisticSeries = {
    key: n === 1 ? "x" : "xbar",
    points,
    center: 0,
    ucl: new Float64Array(m).fill(SHEWHART_LIMIT_WIDTH),
    lcl: new Float64Array(m).fill(-SHEWHART_LIMIT_WIDTH),
    sigma: new Float64Array(m).fill(1),
    floor: -Infinity,
    zoneRulesByDefault: true,
  };
  let signalled = 0;
  for (let run = 0; run < runs; run++) {
    for (let index = 0; index < m; index++) points[index] = offset + rng.normal();
    if (evaluate(series, rules).signals.length > 0) signalled++;
  }
  const probability = signalled / runs;
  return { probability, standardError: Math.sqrt((probability * (1 - probability)) / runs), runs };
}

/** Estimated P(some rule fires by chance within m in-control subgroups). */
export function simulateFalseAlarmProbability(options: Omit<SimulationOptions, "delta" | "n">): SimulatedProbability {
  return simulateSignalProbability({ ...options, delta: 0, n: 1 });
}
