/**
 * The JSON report of `analyze` (the command line's `--format json`): a contract other programs rely on.
 * Indices are 0-based subgroup positions. Numbers that do not exist at a point (the first moving range;
 * a lower zone boundary below the statistic's floor) are null.
 *
 * Contract fields: `chart`, `charts` (per statistic: `center`, `ucl`, `lcl`, `points`), `signals`,
 * `capability`, `patterns`, `changePoints`. Additive fields (documented in docs/cli.md): per statistic `warning` limits and `zones`;
 * `rules`, `parameters`, `labels`, `notes`.
 */
import { z } from "zod";
import { CAUSE_CATEGORIES, CHART_STATISTIC_KEYS, CHART_TYPES, RULE_IDS, STATISTIC_KEYS } from "./constants";
import { PATTERN_KINDS } from "./patterns";

const ZMaybeNumber = z.number().nullable();

/** A scalar when the limit is the same at every point, else one value per point. */
export const ZLimit = z.union([ZMaybeNumber, z.array(ZMaybeNumber)]);

export const ZStatisticReport = z.object({
  center: z.number(),
  ucl: ZLimit,
  lcl: ZLimit,
  points: z.array(ZMaybeNumber),
  /** Warning limits at center ± 2σ of the plotted statistic; null where undefined (no σ, or below the floor). */
  warning: z.object({ upper: ZLimit, lower: ZLimit }),
  /**
   * Signed zone of each point: ±1 within 1σ (zone C), ±2 within 2σ (B), ±3 within 3σ (A), ±4 beyond 3σ;
   * the sign is the side of the centre line, 0 exactly on it; null where the point or its σ is undefined.
   */
  zones: z.array(z.number().int().min(-4).max(4).nullable()),
});

export const ZSignalReport = z.object({
  rule: z.enum(RULE_IDS),
  chart: z.enum(STATISTIC_KEYS),
  start: z.number().int().nonnegative(),
  end: z.number().int().nonnegative(),
  firing: z.array(z.number().int().nonnegative()).min(1),
  side: z.enum(["above", "below"]).optional(),
});

/** An index with its confidence interval. */
const ZIndexEstimate = z.object({ value: z.number(), lower: z.number(), upper: z.number() });

export const ZCapabilityReport = z.discriminatedUnion("status", [
  z.object({
    status: z.literal("computed"),
    sides: z.enum(["two-sided", "upper-only", "lower-only"]),
    lsl: ZMaybeNumber,
    usl: ZMaybeNumber,
    confidence: z.number().gt(0).lt(1),
    /** Mean of the baseline values. */
    mean: z.number(),
    withinSigma: z.number().positive(),
    overallSigma: z.number().positive(),
    /** Number of values the indices were computed from (the baseline's). */
    valueCount: z.number().int().positive(),
    withinDegreesOfFreedom: z.number().positive(),
    /** Cp and Pp need both specification limits: null with one. */
    cp: ZIndexEstimate.nullable(),
    /** Cpk (or the one-sided Cpu / Cpl when only one limit is given). */
    cpk: ZIndexEstimate,
    cpu: ZMaybeNumber,
    cpl: ZMaybeNumber,
    pp: ZIndexEstimate.nullable(),
    ppk: ZIndexEstimate,
    ppu: ZMaybeNumber,
    ppl: ZMaybeNumber,
  }),
  z.object({
    status: z.literal("refused"),
    code: z.enum(["not-in-control", "too-few-values", "no-specification", "no-variation"]),
    reason: z.string().min(1),
  }),
]);

/** A change point as the pattern reader reports it: the last in-control subgroup and its window. */
const ZChangePoint = z.object({
  model: z.enum(["step", "drift", "poisson", "binomial"]),
  index: z.number().int().min(-1),
  window: z.object({ start: z.number().int(), end: z.number().int(), level: z.number() }),
});

/** One pattern read from a run of signals (src/spc/patterns); `evidence` holds the numbers behind it. */
export const ZPatternReport = z.object({
  kind: z.enum(PATTERN_KINDS),
  chart: z.enum(STATISTIC_KEYS),
  start: z.number().int().nonnegative(),
  end: z.number().int().nonnegative(),
  changePoint: ZChangePoint.optional(),
  period: z.number().positive().optional(),
  evidence: z.looseObject({
    rules: z.array(z.enum(RULE_IDS)),
    /** An odd reading one keying slip away from its neighbours' level, with the likely intended values. */
    recordingSlip: z
      .object({
        printed: z.string(),
        valueIndex: z.number().int().nonnegative(),
        candidates: z.array(z.object({ slip: z.string(), text: z.string(), value: z.number(), distance: z.number() })),
      })
      .optional(),
  }),
  causes: z.array(z.object({ category: z.enum(CAUSE_CATEGORIES), reason: z.string().min(1) })),
});
export type TPatternReport = z.infer<typeof ZPatternReport>;

export const ZAnalyzeReport = z
  .object({
    chart: z.enum(CHART_TYPES),
    charts: z.partialRecord(z.enum(STATISTIC_KEYS), ZStatisticReport),
    signals: z.array(ZSignalReport),
    /** null when no specification limit was given. */
    capability: ZCapabilityReport.nullable(),
    /** What kind of change each run of signals looks like, with the causes to check first. */
    patterns: z.array(ZPatternReport),
    /** The change points of those patterns, listed on their own for searching the event log. */
    changePoints: z.array(ZChangePoint.extend({ chart: z.enum(STATISTIC_KEYS), kind: z.enum(PATTERN_KINDS) })),
    /** The rules evaluated (before the per-statistic skips listed in `notes`). */
    rules: z.array(z.enum(RULE_IDS)),
    parameters: z.object({
      center: z.number(),
      /** σ of one individual value (variables charts); null for attributes charts. */
      sigma: ZMaybeNumber,
      subgroupSize: z.number().int().positive(),
      baseline: z.object({
        start: z.number().int().nonnegative(),
        end: z.number().int().nonnegative(),
        excluded: z.array(z.number().int().nonnegative()),
        used: z.number().int().positive(),
      }),
      ewma: z.object({ lambda: z.number(), L: z.number() }).optional(),
      cusum: z.object({ k: z.number(), h: z.number() }).optional(),
    }),
    /** One label per subgroup (subgroup ids, or timestamps) when the input had them. */
    labels: z.array(z.string()).optional(),
    notes: z.array(z.string()),
  })
  .superRefine((report, context) => {
    const expected = CHART_STATISTIC_KEYS[report.chart];
    const actual = Object.keys(report.charts);
    if (actual.length !== expected.length || expected.some((key) => !actual.includes(key))) {
      context.addIssue({ code: "custom", path: ["charts"], message: `${report.chart} reports ${expected.join(", ")}; found ${actual.join(", ")}` });
    }
  });

export type TAnalyzeReport = z.infer<typeof ZAnalyzeReport>;
export type TStatisticReport = z.infer<typeof ZStatisticReport>;
export type TSignalReport = z.infer<typeof ZSignalReport>;
export type TCapabilityReport = z.infer<typeof ZCapabilityReport>;
