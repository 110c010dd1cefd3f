/**
 * What the HTTP API answers, as zod schemas: the route handlers shape every answer through these (unknown
 * fields are dropped, a wrong answer is a bug caught before it leaves the server), and the OpenAPI
 * document (src/api/openapi.ts) is generated from them. Request schemas live in shared/intake.ts, except
 * those only the API takes (path ids, query ranges, a change of settings), which build on them here.
 * Depends on zod and shared/ only; `.meta({ id })` names each schema in the document's components.
 */
import { z } from "zod";
import { CAUSE_CATEGORIES, CHART_TYPES, EVENT_KINDS, RULE_IDS, STATISTIC_KEYS } from "./constants";
import { ZCharacteristicInput, ZLimitRevisionInput, ZTimestamp } from "./intake";
import { PATTERN_KINDS } from "./patterns";

/** Error codes the API answers with: the application's codes, then the HTTP layer's own. */
export const API_ERROR_CODES = [
  "invalid-input",
  "not-found",
  "conflict",
  "forbidden",
  "refused",
  "busy",
  "invalid-json",
  "unsupported-media-type",
  "payload-too-large",
  "internal",
] as const;
export type TApiErrorCode = (typeof API_ERROR_CODES)[number];

export const ZApiError = z
  .object({
    error: z.object({
      code: z.enum(API_ERROR_CODES),
      message: z.string(),
      issues: z.array(
        z.object({
          path: z.string().meta({ description: 'Dotted path of the offending field, e.g. "subgroups.3.values.2"; empty for the whole body.' }),
          message: z.string(),
        }),
      ),
    }),
  })
  .meta({ id: "Error", description: "Every failure answers with this shape." });
export type TApiError = z.infer<typeof ZApiError>;

/** Largest id the database stores (Prisma `Int` is 32-bit). */
const MAX_ID = 2_147_483_647;
const WHOLE_NUMBER_TEXT = /^(0|[1-9]\d*)$/;

/** A record id in a URL path: digits only, no sign, no leading zeros. */
export const ZIdParams = z
  .object({
    id: z
      .string()
      .regex(/^[1-9]\d*$/, { error: "must be a positive whole number" })
      .transform(Number)
      .refine((id) => id <= MAX_ID, { error: `must be at most ${MAX_ID}` })
      .meta({ description: "Record id", example: "1" }),
  })
  .strict();

const ZSequenceText = z
  .string()
  .regex(WHOLE_NUMBER_TEXT, { error: "must be a whole number (a subgroup sequence)" })
  .transform(Number)
  .refine(Number.isSafeInteger, { error: "is too large" });

/** `?from=&to=` on signals: subgroup sequences, both inclusive. */
export const ZSequenceRangeQuery = z
  .object({
    from: ZSequenceText.optional().meta({ description: "First subgroup sequence (inclusive)", example: "0" }),
    to: ZSequenceText.optional().meta({ description: "Last subgroup sequence (inclusive)", example: "99" }),
  })
  .strict()
  .refine((range) => range.from === undefined || range.to === undefined || range.from <= range.to, {
    error: "must not be before from",
    path: ["to"],
  });

/** `?from=&to=` on events: ISO 8601 instants, both inclusive. */
export const ZTimeRangeQuery = z
  .object({
    from: ZTimestamp.optional().meta({ description: "Earliest time (inclusive)", example: "2026-03-01T00:00:00Z" }),
    to: ZTimestamp.optional().meta({ description: "Latest time (inclusive)", example: "2026-03-02T00:00:00Z" }),
  })
  .strict()
  .refine((range) => range.from === undefined || range.to === undefined || Date.parse(range.from) <= Date.parse(range.to), {
    error: "must not be before from",
    path: ["to"],
  });

/** An instant in an answer: ISO 8601 in UTC. */
const ZInstant = z.iso.datetime();

export const ZLimitsInForce = z
  .object({
    version: z.number().int(),
    center: z.number().meta({ description: "Process centre: mean of individual values, p-bar, c-bar or u-bar." }),
    sigma: z.number().nullable().meta({ description: "Within-subgroup sigma of one value; null for attributes charts." }),
    subgroupSize: z.number().int(),
    ewmaLambda: z.number().nullable().meta({ description: "EWMA charts: smoothing weight lambda." }),
    ewmaWidth: z.number().nullable().meta({ description: "EWMA charts: limit width L in sigmas." }),
    cusumK: z.number().nullable().meta({ description: "CUSUM charts: reference value k in sigmas." }),
    cusumH: z.number().nullable().meta({ description: "CUSUM charts: decision interval h in sigmas." }),
    appliesFrom: z.number().int().meta({ description: "First subgroup sequence this version applies to." }),
    baselineStart: z.number().int(),
    baselineEnd: z.number().int().meta({ description: "End of the baseline window (exclusive)." }),
    baselineUsed: z.number().int().meta({ description: "Baseline subgroups used (window minus exclusions)." }),
    exclusions: z.array(z.object({ sequence: z.number().int(), reason: z.string() })),
    reason: z.string(),
    approvedBy: z.string(),
    createdAt: ZInstant,
  })
  .meta({ id: "LimitsInForce", description: "The frozen limit version that judges newly arriving subgroups." });

export const ZCharacteristicView = z
  .object({
    id: z.number().int(),
    name: z.string(),
    unit: z.string(),
    process: z.object({ id: z.number().int(), name: z.string() }),
    chartType: z.enum(CHART_TYPES),
    subgroupSize: z.number().int(),
    target: z.number().nullable(),
    lowerSpecLimit: z.number().nullable(),
    upperSpecLimit: z.number().nullable(),
    ruleSet: z.string(),
    safetyRelated: z.boolean(),
    description: z.string().nullable(),
    subgroupCount: z.number().int().meta({ description: "Subgroups stored so far; the next one gets this sequence." }),
    limitsInForce: ZLimitsInForce.nullable().meta({ description: "null until a first limit version is set." }),
  })
  .meta({ id: "Characteristic" });

const SETTINGS = ZCharacteristicInput.shape;

/**
 * A change of a characteristic's settings: any of the setup fields (each validated as on setup), and who
 * changes them. The fields left out keep their values; the result is validated whole again by the domain
 * (a lower specification limit raised above the upper one is refused there). Defaults are removed so
 * that a field left out is not reset, and the optional fields accept null to clear them. `.partial()`
 * cannot be used: zod refuses it on a schema with cross-field checks.
 */
export const ZCharacteristicChange = z
  .object({
    processId: SETTINGS.processId.optional(),
    name: SETTINGS.name.optional(),
    unit: SETTINGS.unit.optional(),
    chartType: SETTINGS.chartType.optional(),
    subgroupSize: SETTINGS.subgroupSize.optional(),
    target: SETTINGS.target.unwrap().nullable().optional(),
    lowerSpecLimit: SETTINGS.lowerSpecLimit.unwrap().nullable().optional(),
    upperSpecLimit: SETTINGS.upperSpecLimit.unwrap().nullable().optional(),
    ruleSet: SETTINGS.ruleSet.removeDefault().optional(),
    safetyRelated: SETTINGS.safetyRelated.removeDefault().optional(),
    description: SETTINGS.description.unwrap().nullable().optional(),
    changedBy: ZLimitRevisionInput.shape.approvedBy.meta({
      description: "Who makes the change (recorded with the re-evaluation a changed rule set causes); accounts come later.",
    }),
  })
  .strict()
  .meta({ id: "CharacteristicChange", description: "The settings to change; null clears an optional one." });
export type TCharacteristicChange = z.infer<typeof ZCharacteristicChange>;

export const ZCharacteristicList = z
  .object({ characteristics: z.array(ZCharacteristicView) })
  .meta({ id: "CharacteristicList" });

export const ZStoredSubgroup = z
  .object({
    id: z.number().int(),
    sequence: z.number().int().meta({ description: "Position on the chart, 0-based." }),
    timestamp: ZInstant,
    values: z.array(z.number()).nullable().meta({ description: "Variables charts: the measured values; null otherwise." }),
    count: z.number().nullable().meta({ description: "Attributes charts: defectives (p, np) or defects (c, u)." }),
    size: z.number().nullable().meta({ description: "Attributes charts: number inspected (p, np), inspection units (u), 1 (c)." }),
    mean: z.number().nullable().meta({ description: "Variables charts: mean of the values." }),
    spread: z.number().nullable().meta({ description: "X-bar charts: range (X-bar and R) or standard deviation (X-bar and S)." }),
    tags: z.record(z.string(), z.string()),
    firedRules: z.array(z.enum(RULE_IDS)).meta({ description: "Rules that fired at this point; empty when none did (or no limits yet)." }),
  })
  .meta({ id: "StoredSubgroup" });

export const ZSignalView = z
  .object({
    id: z.number().int(),
    rule: z.enum(RULE_IDS),
    ruleDescription: z.string().meta({ description: "The rule in words." }),
    statistic: z.enum(STATISTIC_KEYS),
    limitSetVersion: z.number().int(),
    startSequence: z.number().int(),
    endSequence: z.number().int(),
    firing: z.array(z.number().int()).meta({ description: "Sequences at which the rule fired." }),
    side: z.enum(["above", "below"]).nullable(),
    pattern: z.enum(PATTERN_KINDS).nullable(),
    status: z.string(),
    detectedAt: ZInstant,
    updatedAt: ZInstant,
  })
  .meta({ id: "Signal" });

export const ZSignalList = z.object({ signals: z.array(ZSignalView) }).meta({ id: "SignalList" });

export const ZSubgroupsPostAnswer = z
  .object({
    outcomes: z
      .array(
        z.object({
          key: z.string().nullable().meta({ description: "The key posted with the subgroup; null when it had none." }),
          status: z.enum(["stored", "already-present"]).meta({
            description: '"stored": stored by this request; "already-present": a subgroup with this key was stored earlier and was not stored again.',
          }),
          id: z.number().int().meta({ description: "The stored subgroup: the new one, or the one stored earlier under the key." }),
          sequence: z.number().int(),
        }),
      )
      .meta({ description: "One per posted subgroup, in the order posted." }),
    stored: z.array(ZStoredSubgroup).meta({ description: "The subgroups this request stored (not those already present), with the rules that fired at each." }),
    signals: z
      .array(
        ZSignalView.extend({
          change: z.enum(["created", "extended"]).meta({ description: "Whether this request opened the signal or extended one." }),
        }),
      )
      .meta({ description: "Signals the subgroups stored by this request raised or extended; subgroups already present raise nothing." }),
    limits: z
      .object({ version: z.number().int() })
      .nullable()
      .meta({ description: "The limit version the new subgroups were judged against; null when the characteristic has no limits yet." }),
    notes: z.array(z.string()).meta({ description: 'Remarks on the evaluation, e.g. "no limits yet".' }),
  })
  .meta({ id: "SubgroupsPostAnswer" });

export const ZEventView = z
  .object({
    id: z.number().int(),
    processId: z.number().int(),
    occurredAt: ZInstant,
    kind: z.enum(EVENT_KINDS),
    causeCategory: z.enum(CAUSE_CATEGORIES).nullable(),
    description: z.string(),
    value: z.number().nullable(),
    unit: z.string().nullable(),
  })
  .meta({ id: "ProcessEvent" });

export const ZEventList = z.object({ events: z.array(ZEventView) }).meta({ id: "ProcessEventList" });

export const ZLimitSetView = ZLimitsInForce.extend({
  appliesTo: z
    .object({
      from: z.number().int().meta({ description: "First subgroup sequence judged against this version." }),
      to: z.number().int().nullable().meta({ description: "End (exclusive); null while new subgroups join this version." }),
    })
    .nullable()
    .meta({ description: "The subgroups this version applies to; null when later versions supersede it everywhere." }),
}).meta({ id: "LimitSet", description: "One frozen limit version and the subgroups it applies to." });

export const ZLimitSetList = z.object({ limitSets: z.array(ZLimitSetView) }).meta({ id: "LimitSetList" });

export const ZLimitRevisionAnswer = z
  .object({
    limitSet: ZLimitSetView,
    reevaluation: z
      .object({
        id: z.number().int(),
        at: ZInstant,
        signalsBefore: z.number().int(),
        signalsAfter: z.number().int(),
      })
      .meta({ description: "The re-evaluation of the stored signals the new version caused, recorded with it." }),
  })
  .meta({ id: "LimitRevisionAnswer" });
