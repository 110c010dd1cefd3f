/**
 * The chart view: what the characteristic page and `GET /api/v1/characteristics/{id}/chart-data` hand to
 * the chart. Plain JSON (times as ISO 8601 text, "no value" as null), declared once in zod so the route's
 * answer, the OpenAPI document and the browser component share one shape. Depends on zod and shared/ only.
 */
import { z } from "zod";
import { CAUSE_CATEGORIES, CHART_TYPES, EVENT_KINDS, RULE_IDS, STATISTIC_KEYS, type StatisticKey } from "@/shared/constants";
import { PATTERN_KINDS } from "@/shared/patterns";

/** Default and largest number of points per statistic the server sends for the visible range. */
export const DEFAULT_MAX_POINTS = 2000;
export const LARGEST_MAX_POINTS = 10_000;
/** Signals listed in the view, the latest first: the points of all of them are marked anyway. */
export const LISTED_SIGNALS = 100;

/** What each plotted statistic is, in words. */
export const STATISTIC_LABELS: Record<StatisticKey, string> = {
  x: "Individual value",
  mr: "Moving range",
  xbar: "Subgroup mean",
  r: "Subgroup range",
  s: "Subgroup standard deviation",
  p: "Fraction defective",
  np: "Number defective",
  c: "Defects per sample",
  u: "Defects per unit",
  ewma: "EWMA of the subgroup means",
  "cusum-upper": "Upper CUSUM",
  "cusum-lower": "Lower CUSUM",
};

/** Limits at one point: centre, action (3σ, or the chart's own width) and warning (2σ) limits. */
export const ZPointLimits = z.object({
  center: z.number(),
  ucl: z.number(),
  lcl: z.number(),
  /** Null where zones are meaningless (CUSUM). */
  upperWarning: z.number().nullable(),
  lowerWarning: z.number().nullable(),
});
export type TPointLimits = z.infer<typeof ZPointLimits>;

/** One correction of a value of this subgroup; the first one's `recorded` is the value as recorded. */
export const ZPointCorrection = z.object({
  field: z.string(),
  /** Position of the measurement within the subgroup, for corrected measured values. */
  position: z.number().int().nullable(),
  recorded: z.number(),
  corrected: z.number(),
  reason: z.string(),
  correctedBy: z.string(),
  correctedAt: z.string(),
});
export type TPointCorrection = z.infer<typeof ZPointCorrection>;

/**
 * One drawn point. Compact, since a long history sends tens of thousands: what a point does not have is
 * left out (no limits of its own, no rule fired, not a bucket extreme, never corrected), never sent as
 * null or an empty list; a null bucket or original value, or an empty list, is still accepted and means the same.
 */
export const ZChartPoint = z.object({
  sequence: z.number().int(),
  timestamp: z.string(),
  /** The plotted value; null where undefined by definition (first moving range of a segment). */
  value: z.number().nullable(),
  /** Limit version in force for this point, or null before the first limit set applies. */
  version: z.number().int().nullable(),
  /**
   * The limits at this point, present only where they vary within its segment (p and u charts with
   * varying sizes, EWMA exact limits). Absent: the segment's `constantLimits` apply (none outside every
   * segment, before the first limit set); null: no limits at this point.
   */
  limits: ZPointLimits.nullish(),
  /** Rules that fire at this point (any statistic's signal: the point is marked on every panel); absent: none. */
  firedRules: z.array(z.enum(RULE_IDS)).optional(),
  /** Where decimated: the lowest and highest value of the bucket of points this one stands for. */
  bucket: z.object({ from: z.number().int(), to: z.number().int(), min: z.number(), max: z.number() }).nullish(),
  /** The plotted statistic as recorded, before corrections, where it can be computed; absent otherwise. */
  originalValue: z.number().nullish(),
  /** The corrections of this subgroup; absent when it was never corrected. */
  corrections: z.array(ZPointCorrection).optional(),
});
export type TChartPoint = z.infer<typeof ZChartPoint>;

/** One limit version over the points of the range it applies to (sequences inclusive). */
export const ZLimitSegment = z.object({
  version: z.number().int(),
  limitSetId: z.number().int(),
  fromSequence: z.number().int(),
  toSequence: z.number().int(),
  /** The limits where they are the same at every point of the segment (its points then carry none); null where they vary per point. */
  constantLimits: ZPointLimits.nullable(),
});
export type TLimitSegment = z.infer<typeof ZLimitSegment>;

export const ZStatisticView = z.object({
  key: z.enum(STATISTIC_KEYS),
  label: z.string(),
  points: z.array(ZChartPoint),
  segments: z.array(ZLimitSegment),
  /** Points in the range before decimation, and whether some were dropped. */
  pointsInRange: z.number().int(),
  decimated: z.boolean(),
});
export type TStatisticView = z.infer<typeof ZStatisticView>;

export const ZChartSignal = z.object({
  id: z.number().int(),
  rule: z.enum(RULE_IDS),
  /** The rule in words. */
  ruleText: z.string(),
  statistic: z.enum(STATISTIC_KEYS),
  startSequence: z.number().int(),
  endSequence: z.number().int(),
  /** How many points fired (each is kept and carries the rule in its `firedRules`). */
  firingCount: z.number().int(),
  side: z.enum(["above", "below"]).nullable(),
  pattern: z.enum(PATTERN_KINDS).nullable(),
  status: z.string(),
  limitSetVersion: z.number().int(),
  detectedAt: z.string(),
  /** Time of the last firing point. */
  lastFiringAt: z.string().nullable(),
});
export type TChartSignal = z.infer<typeof ZChartSignal>;

export const ZChartEvent = z.object({
  id: z.number().int(),
  occurredAt: z.string(),
  kind: z.enum(EVENT_KINDS),
  causeCategory: z.enum(CAUSE_CATEGORIES).nullable(),
  description: z.string(),
  value: z.number().nullable(),
  unit: z.string().nullable(),
  /** Where the marker goes on the sequence axis: half a step before the first subgroup at or after it. */
  position: z.number(),
});
export type TChartEvent = z.infer<typeof ZChartEvent>;

export const ZChartView = z.object({
  characteristicId: z.number().int(),
  chartType: z.enum(CHART_TYPES),
  unit: z.string(),
  /** The whole history (null when empty) and the range shown (sequences inclusive). */
  history: z.object({ first: z.number().int(), last: z.number().int() }).nullable(),
  range: z.object({ from: z.number().int(), to: z.number().int() }).nullable(),
  maxPoints: z.number().int(),
  /** The plotted statistic first, then the spread statistic where the chart has one. */
  statistics: z.array(ZStatisticView),
  /** Signals touching the range: how many, how many still open ("new"), and the latest ones (by last point). */
  signalCounts: z.object({ total: z.number().int(), open: z.number().int() }),
  signals: z.array(ZChartSignal),
  events: z.array(ZChartEvent),
});
export type TChartView = z.infer<typeof ZChartView>;

const ZSequenceText = z
  .string()
  .regex(/^(0|[1-9]\d*)$/, { error: "must be a whole number (a subgroup sequence)" })
  .transform(Number)
  .refine(Number.isSafeInteger, { error: "is too large" });

/** The query of the chart-data route (sequences inclusive) and the options of `loadChartView`. */
export const ZChartRangeQuery = z
  .object({
    from: ZSequenceText.optional().meta({ description: "First subgroup sequence shown (inclusive)", example: "0" }),
    to: ZSequenceText.optional().meta({ description: "Last subgroup sequence shown (inclusive)", example: "999" }),
    maxPoints: z
      .string()
      .regex(/^[1-9]\d*$/, { error: "must be a positive whole number" })
      .transform(Number)
      .refine((points) => points >= 10 && points <= LARGEST_MAX_POINTS, { error: `must be between 10 and ${LARGEST_MAX_POINTS}` })
      .optional()
      .meta({ description: `Points per statistic before signal points are added (default ${DEFAULT_MAX_POINTS})`, example: "2000" }),
  })
  .strict()
  .refine((query) => query.from === undefined || query.to === undefined || query.from <= query.to, {
    path: ["to"],
    error: "must not be before from",
  });
