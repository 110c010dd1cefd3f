/**
 * Calibration of the pattern reader by seeded simulation: generate series of every kind over a grid of
 * subgroup sizes, lengths and effect sizes (simulate.ts), run them through the chart (Phase I limits from
 * the in-control baseline, Phase II on everything), the run rules and `readPatterns`, and count what was
 * reported against what was planted. Shared by scripts/calibrate-patterns.ts (large runs, the docs table)
 * and the unit tests (small runs, the asserted minimums).
 *
 * The reported kind of one series is the kind of the pattern that overlaps most subgroups of the
 * affected stretch (from the onset to the end; the onset subgroup alone for an outlier; for in-control
 * series the whole monitoring stretch), or "none" when no pattern overlaps it. Cost: O(series × length).
 */
import { PATTERN_KINDS } from "../../../shared/patterns";
import { estimateParameters, evaluateChart } from "../charts";
import { createRng } from "../random";
import { evaluateRules, resolveRuleSet } from "../rules";
import type { ChartType, Signal } from "../types";
import { readPatterns } from "./read-patterns";
import { simulatePattern, type SimulatedKind, type SimulationSpec } from "./simulate";

export const SIMULATED_KINDS: readonly SimulatedKind[] = ["none", ...PATTERN_KINDS];

/** Effect sizes per kind, in the units of simulate.ts, from barely readable to obvious. */
export const EFFECT_SIZES: Record<SimulatedKind, readonly number[]> = {
  none: [0, 0, 0],
  shift: [1.5, 2, 3],
  trend: [0.1, 0.2, 0.3],
  cycle: [1.5, 2, 3],
  mixture: [1.5, 2, 2.5],
  stratification: [0.2, 0.3, 0.4],
  outlier: [5, 6, 8],
  spread: [1.8, 2.5, 3],
};

const CYCLE_PERIODS = [6, 8, 12] as const;

export interface CalibrationDesign {
  readonly seed: number;
  /** Series per cell (kind × subgroup size × length × effect size). */
  readonly replicates: number;
  readonly subgroupSizes: readonly number[];
  readonly monitoringLengths: readonly number[];
  readonly baseline: number;
  readonly rules: string;
  /** Planted kinds to simulate (default: all, "none" included); rows not simulated stay at zero. */
  readonly kinds?: readonly SimulatedKind[];
}

export const DEFAULT_CALIBRATION_DESIGN: CalibrationDesign = {
  seed: 20260401,
  replicates: 20,
  subgroupSizes: [1, 5],
  monitoringLengths: [40, 80],
  baseline: 40,
  rules: "nelson",
};

export type ConfusionMatrix = Record<SimulatedKind, Record<SimulatedKind, number>>;

export interface CalibrationResult {
  readonly design: CalibrationDesign;
  readonly matrix: ConfusionMatrix;
  /** Share of each true kind read correctly. */
  readonly accuracy: Record<SimulatedKind, number>;
}

export function calibratePatterns(design: CalibrationDesign = DEFAULT_CALIBRATION_DESIGN): CalibrationResult {
  const rng = createRng(design.seed);
  const rules = resolveRuleSet(design.rules);
  const matrix = Object.fromEntries(
    SIMULATED_KINDS.map((kind) => [kind, Object.fromEntries(SIMULATED_KINDS.map((reported) => [reported, 0]))]),
  ) as ConfusionMatrix;
  for (const kind of design.kinds ?? SIMULATED_KINDS) {
    for (const subgroupSize of design.subgroupSizes) {
      for (const monitoring of design.monitoringLengths) {
        for (const size of EFFECT_SIZES[kind]) {
          for (let replicate = 0; replicate < design.replicates; replicate++) {
            const spec: SimulationSpec = {
              kind,
              subgroupSize,
              baseline: design.baseline,
              monitoring,
              onset: design.baseline + 5,
              size,
              period: CYCLE_PERIODS[replicate % CYCLE_PERIODS.length]!,
              alternating: replicate % 2 === 1,
            };
            matrix[kind][readSeries(spec, rules, rng)] += 1;
          }
        }
      }
    }
  }
  const accuracy = Object.fromEntries(
    SIMULATED_KINDS.map((kind) => {
      const row = matrix[kind];
      const total = SIMULATED_KINDS.reduce((sum, reported) => sum + row[reported], 0);
      return [kind, total === 0 ? Number.NaN : row[kind] / total];
    }),
  ) as Record<SimulatedKind, number>;
  return { design, matrix, accuracy };
}

function readSeries(spec: SimulationSpec, rules: ReturnType<typeof resolveRuleSet>, rng: ReturnType<typeof createRng>): SimulatedKind {
  const { data } = simulatePattern(spec, rng);
  const chart: ChartType = spec.subgroupSize === 1 ? "imr" : "xbar-r";
  const parameters = estimateParameters(chart, data, { baseline: { end: spec.baseline } });
  const result = evaluateChart(data, parameters);
  const signals: Signal[] = result.statistics.flatMap((series) => evaluateRules(series, rules).signals);
  const patterns = readPatterns(result, signals, data);
  const regionStart = spec.kind === "none" ? spec.baseline : spec.onset;
  // An outlier affects one subgroup; a chance episode elsewhere in the series must not outvote it.
  const regionEnd = spec.kind === "outlier" ? spec.onset : spec.baseline + spec.monitoring - 1;
  let best: SimulatedKind = "none";
  let bestOverlap = 0;
  for (const pattern of patterns) {
    const overlap = Math.min(pattern.end, regionEnd) - Math.max(pattern.start, regionStart) + 1;
    if (overlap > bestOverlap) {
      best = pattern.kind;
      bestOverlap = overlap;
    }
  }
  return best;
}

/** The confusion matrix as a Markdown table (rows: planted kind; columns: reported kind), with accuracy. */
export function confusionTable(result: CalibrationResult): string {
  const header = `| planted \\ reported | ${SIMULATED_KINDS.join(" | ")} | accuracy |`;
  const rule = `|${" --- |".repeat(SIMULATED_KINDS.length + 2)}`;
  const rows = SIMULATED_KINDS.map(
    (kind) =>
      `| ${kind} | ${SIMULATED_KINDS.map((reported) => result.matrix[kind][reported]).join(" | ")} | ${(100 * result.accuracy[kind]).toFixed(1)} % |`,
  );
  return [header, rule, ...rows].join("\n");
}
