/**
 * Input schemas for data intake: characteristics, subgroups, process events, limit revisions and
 * corrections. Used by the HTTP API, the forms and the CSV import alike, so a value accepted in one
 * place is accepted everywhere. Depends on zod and shared/constants only.
 */
import { z } from "zod";
import {
  CAUSE_CATEGORIES,
  CHART_TYPES,
  EVENT_KINDS,
  RULE_IDS,
  RULE_SET_NAMES,
  VARIABLES_CHART_TYPES,
  type ChartType,
} from "./constants";

/** Limits shared by schemas and forms. */
export const INTAKE_LIMITS = {
  nameLength: 100,
  unitLength: 20,
  textLength: 2000,
  reasonMinLength: 3,
  reasonLength: 500,
  tagKeyLength: 40,
  tagValueLength: 100,
  tagsPerSubgroup: 10,
  /** Variables charts: values per subgroup (the tabulated constants stop at 25). */
  maxVariablesSubgroupSize: 25,
  /** Subgroups accepted in one API request. */
  subgroupsPerRequest: 1000,
  /** A line system's own key for a subgroup: room for a UUID or a compound reading id. */
  subgroupKeyLength: 100,
} as const;

const ZName = z.string().trim().min(1, { error: "is required" }).max(INTAKE_LIMITS.nameLength);
const ZReason = z
  .string()
  .trim()
  .min(INTAKE_LIMITS.reasonMinLength, { error: `must say why, in at least ${INTAKE_LIMITS.reasonMinLength} characters` })
  .max(INTAKE_LIMITS.reasonLength);
const ZFinite = z.number({ error: "must be a number" }).refine(Number.isFinite, { error: "must be a finite number" });

/** ISO 8601 date-time with an explicit offset or Z (a reading without a zone would be ambiguous). */
export const ZTimestamp = z.iso.datetime({ offset: true, error: "must be an ISO 8601 date-time with a zone, e.g. 2026-03-01T06:00:00Z" });

/**
 * The time zones a site can be set to: the IANA names the runtime's Intl knows, and "UTC" (which
 * `Intl.supportedValuesOf` leaves out because it is an alias there, yet Intl formats with it).
 */
export const TIME_ZONES: readonly string[] = ["UTC", ...Intl.supportedValuesOf("timeZone").filter((zone) => zone !== "UTC")];
const KNOWN_TIME_ZONES = new Set(TIME_ZONES);

/** A site's time zone: an IANA name such as "Europe/London", or "UTC". */
export const ZTimeZone = z
  .string({ error: "must be text" })
  .trim()
  .refine((zone) => KNOWN_TIME_ZONES.has(zone), { error: 'must be an IANA time zone name such as "Europe/London", or "UTC"' });

export const ZSiteZoneInput = z.object({ siteId: z.number().int().positive(), zone: ZTimeZone }).strict();
export type TSiteZoneInput = z.infer<typeof ZSiteZoneInput>;

/**
 * A wall-clock time as a datetime-local field sends it, "2026-03-01T06:00" (seconds optional), without a
 * zone: the site's zone gives it one. A day or hour that no calendar has (30 Feb, 24:00) is refused here;
 * a time the zone's clocks skip or show twice is judged when the zone is applied.
 */
export const ZLocalDateTime = z
  .string({ error: "must be text" })
  .trim()
  .regex(/^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d)?$/, { error: "must be a date and time such as 2026-03-01T06:00" })
  .refine((text) => {
    const stamp = text.length === 16 ? `${text}:00` : text;
    const parsed = Date.parse(`${stamp}Z`);
    return Number.isFinite(parsed) && new Date(parsed).toISOString().slice(0, 19) === stamp;
  }, { error: "is not a date and time on the calendar" });

/** A rule set: a named set or a comma-separated list of rule ids. */
export const ZRuleSet = z
  .string()
  .trim()
  .refine(
    (text) =>
      (RULE_SET_NAMES as readonly string[]).includes(text) ||
      (text.length > 0 && text.split(",").every((id) => (RULE_IDS as readonly string[]).includes(id.trim()))),
    { error: `must be "we", "nelson" or a comma-separated list of ${RULE_IDS.join(", ")}` },
  );

/** Stratification tags: lower-case keys (cavity, lot, operator, shift, ...) to short text values. */
export const ZTags = z
  .record(
    z
      .string()
      .max(INTAKE_LIMITS.tagKeyLength)
      .regex(/^[a-z][a-z0-9-]*$/, { error: "tag names are lower-case letters, digits and hyphens" }),
    z.string().trim().min(1).max(INTAKE_LIMITS.tagValueLength),
  )
  .refine((tags) => Object.keys(tags).length <= INTAKE_LIMITS.tagsPerSubgroup, {
    error: `at most ${INTAKE_LIMITS.tagsPerSubgroup} tags per subgroup`,
  });

export const ZCharacteristicInput = z
  .object({
    processId: z.number().int().positive(),
    name: ZName,
    unit: z.string().trim().min(1, { error: "is required" }).max(INTAKE_LIMITS.unitLength),
    chartType: z.enum(CHART_TYPES),
    subgroupSize: z.number().int().min(1),
    target: ZFinite.optional(),
    lowerSpecLimit: ZFinite.optional(),
    upperSpecLimit: ZFinite.optional(),
    ruleSet: ZRuleSet.default("nelson"),
    safetyRelated: z.boolean().default(false),
    description: z.string().trim().max(INTAKE_LIMITS.textLength).optional(),
  })
  .strict()
  .superRefine((input, context) => {
    const variables = VARIABLES_CHART_TYPES.includes(input.chartType);
    if (variables && input.subgroupSize > INTAKE_LIMITS.maxVariablesSubgroupSize) {
      context.addIssue({
        code: "custom",
        path: ["subgroupSize"],
        message: `must be at most ${INTAKE_LIMITS.maxVariablesSubgroupSize} for a variables chart`,
      });
    }
    if (input.chartType === "imr" && input.subgroupSize !== 1) {
      context.addIssue({ code: "custom", path: ["subgroupSize"], message: "must be 1 for an individuals chart" });
    }
    if ((input.chartType === "xbar-r" || input.chartType === "xbar-s") && input.subgroupSize < 2) {
      context.addIssue({ code: "custom", path: ["subgroupSize"], message: "must be at least 2 for an X-bar chart" });
    }
    const { lowerSpecLimit: lsl, upperSpecLimit: usl, target } = input;
    if (lsl !== undefined && usl !== undefined && !(lsl < usl)) {
      context.addIssue({ code: "custom", path: ["upperSpecLimit"], message: "must be above the lower specification limit" });
    }
    if (target !== undefined && ((lsl !== undefined && target < lsl) || (usl !== undefined && target > usl))) {
      context.addIssue({ code: "custom", path: ["target"], message: "must lie within the specification limits" });
    }
  });
export type TCharacteristicInput = z.infer<typeof ZCharacteristicInput>;

/**
 * One subgroup as posted by a line system, typed at the press or read from a file. Which fields are
 * required depends on the chart: see `subgroupSchemaFor`.
 */
export const ZSubgroupInput = z
  .object({
    timestamp: ZTimestamp,
    /** Variables charts: the measured values. */
    values: z.array(ZFinite).min(1).max(INTAKE_LIMITS.maxVariablesSubgroupSize).optional(),
    /** Attributes charts: defectives (p, np) or defects (c, u). */
    count: z.number().int({ error: "must be a whole number" }).nonnegative({ error: "must not be negative" }).optional(),
    /** p and np charts: number inspected. */
    size: z.number().int({ error: "must be a whole number" }).positive({ error: "must be positive" }).optional(),
    /** u charts: inspection units (may be fractional, e.g. 2.5 hundred closures). */
    units: ZFinite.refine((units) => units > 0, { error: "must be positive" }).optional(),
    tags: ZTags.optional(),
  })
  .strict();
export type TSubgroupInput = z.infer<typeof ZSubgroupInput>;

/** The measurement fields of a subgroup that the chart rules look at. */
export interface TSubgroupMeasurements {
  readonly values?: readonly number[];
  readonly count?: number;
  readonly size?: number;
  readonly units?: number;
}

/** A broken chart rule: the subgroup field it concerns and why. */
export interface TSubgroupProblem {
  readonly path: "values" | "count" | "size" | "units";
  readonly message: string;
}

const NO_SUBGROUP_PROBLEMS: readonly TSubgroupProblem[] = Object.freeze([]);

/** Per chart, each measurement field and whether the chart needs it (true) or cannot use it (false), in message order. */
type TFieldRules = readonly (readonly [TSubgroupProblem["path"], boolean])[];
const VARIABLES_FIELDS: TFieldRules = [["values", true], ["count", false], ["size", false], ["units", false]];
const DEFECTIVES_FIELDS: TFieldRules = [["values", false], ["count", true], ["size", true], ["units", false]];
const DEFECTS_PER_UNIT_FIELDS: TFieldRules = [["values", false], ["count", true], ["units", true], ["size", false]];
const DEFECTS_FIELDS: TFieldRules = [["values", false], ["count", true], ["size", false], ["units", false]];

/**
 * The chart rules for one subgroup whose fields are already valid on their own (`ZSubgroupInput`): which
 * fields the chart needs and which it cannot use, the subgroup size, counts within sample sizes, the np
 * sample size. The one definition of these rules: `subgroupSchemaFor` applies it after zod's field checks,
 * and the CSV import, whose cells zod has already checked, calls it on each assembled subgroup directly.
 * Written without closures or allocations when nothing is wrong: the import calls it a million times.
 */
export function subgroupProblems(chartType: ChartType, subgroupSize: number, input: TSubgroupMeasurements): readonly TSubgroupProblem[] {
  const variables = VARIABLES_CHART_TYPES.includes(chartType);
  const fields = variables ? VARIABLES_FIELDS : chartType === "p" || chartType === "np" ? DEFECTIVES_FIELDS : chartType === "u" ? DEFECTS_PER_UNIT_FIELDS : DEFECTS_FIELDS;
  let problems: TSubgroupProblem[] | undefined;
  for (const [field, needed] of fields) {
    if (needed !== (input[field] !== undefined)) {
      (problems ??= []).push({ path: field, message: `${needed ? "is required" : "is not used"} on a ${chartType} chart` });
    }
  }
  if (variables && input.values && input.values.length !== subgroupSize) {
    (problems ??= []).push({
      path: "values",
      message: `must hold exactly ${subgroupSize} value${subgroupSize === 1 ? "" : "s"} (the subgroup size of this characteristic)`,
    });
  }
  if (fields === DEFECTIVES_FIELDS && input.count !== undefined && input.size !== undefined && input.count > input.size) {
    (problems ??= []).push({ path: "count", message: "must not exceed the number inspected (size)" });
  }
  if (chartType === "np" && input.size !== undefined && input.size !== subgroupSize) {
    (problems ??= []).push({ path: "size", message: `must equal the characteristic's sample size ${subgroupSize} on an np chart` });
  }
  return problems ?? NO_SUBGROUP_PROBLEMS;
}

/** The subgroup schema for one characteristic: the fields its chart needs, and no others. */
export function subgroupSchemaFor(chartType: ChartType, subgroupSize: number) {
  return ZSubgroupInput.superRefine((input, context) => {
    for (const problem of subgroupProblems(chartType, subgroupSize, input)) {
      context.addIssue({ code: "custom", path: [problem.path], message: problem.message });
    }
  });
}

/**
 * A line system's own key for one reading (its record id, say). Compared exactly, so a retried post with
 * the same key is recognised and stores nothing twice; hence no trimming, and no spaces at either end
 * (a stray one would make a retry look like a new reading).
 */
export const ZSubgroupKey = z
  .string({ error: "must be text" })
  .min(1, { error: "must not be empty" })
  .max(INTAKE_LIMITS.subgroupKeyLength, { error: `must be at most ${INTAKE_LIMITS.subgroupKeyLength} characters` })
  .refine((key) => key.trim() === key, { error: "must not begin or end with a space" })
  .meta({
    description:
      "The line system's own key for this reading (e.g. its record id). A subgroup whose key is already stored " +
      "on the characteristic is not stored again: a retried post is safe.",
    example: "press4-2026-03-01-000127",
  });

/** One subgroup in an API post: the subgroup and, optionally, the caller's key for it. */
export const ZPostedSubgroup = ZSubgroupInput.extend({ key: ZSubgroupKey.optional() });
export type TPostedSubgroup = z.infer<typeof ZPostedSubgroup>;

export const ZSubgroupsPost = z
  .object({
    subgroups: z
      .array(ZPostedSubgroup)
      .min(1, { error: "must hold at least one subgroup" })
      .max(INTAKE_LIMITS.subgroupsPerRequest)
      .superRefine((subgroups, context) => {
        const firstWith = new Map<string, number>();
        subgroups.forEach(({ key }, index) => {
          if (key === undefined) return;
          const first = firstWith.get(key);
          if (first === undefined) firstWith.set(key, index);
          else context.addIssue({ code: "custom", path: [index, "key"], message: `repeats the key of subgroup ${first}` });
        });
      }),
  })
  .strict();
export type TSubgroupsPost = z.infer<typeof ZSubgroupsPost>;

export const ZEventInput = z
  .object({
    occurredAt: ZTimestamp,
    kind: z.enum(EVENT_KINDS),
    causeCategory: z.enum(CAUSE_CATEGORIES).optional(),
    description: z.string().trim().min(1, { error: "is required" }).max(INTAKE_LIMITS.textLength),
    value: ZFinite.optional(),
    unit: z.string().trim().min(1).max(INTAKE_LIMITS.unitLength).optional(),
  })
  .strict()
  .superRefine((event, context) => {
    if (event.unit !== undefined && event.value === undefined) {
      context.addIssue({ code: "custom", path: ["value"], message: "is required when a unit is given" });
    }
  });
export type TEventInput = z.infer<typeof ZEventInput>;

/** A new limit version, computed from a baseline window of subgroup sequences (end exclusive). */
export const ZLimitRevisionInput = z
  .object({
    baselineStart: z.number().int().nonnegative(),
    baselineEnd: z.number().int().positive(),
    exclusions: z
      .array(z.object({ sequence: z.number().int().nonnegative(), reason: ZReason }).strict())
      .default([]),
    reason: ZReason,
    approvedBy: ZName,
  })
  .strict()
  .superRefine((input, context) => {
    if (input.baselineEnd <= input.baselineStart) {
      context.addIssue({ code: "custom", path: ["baselineEnd"], message: "must be after the baseline start" });
    }
    input.exclusions.forEach((exclusion, index) => {
      if (exclusion.sequence < input.baselineStart || exclusion.sequence >= input.baselineEnd) {
        context.addIssue({
          code: "custom",
          path: ["exclusions", index, "sequence"],
          message: "must lie inside the baseline window",
        });
      }
    });
  });
export type TLimitRevisionInput = z.infer<typeof ZLimitRevisionInput>;

/** Correcting a recording mistake: the original stays on record. */
export const ZCorrectionInput = z
  .object({
    newValue: ZFinite,
    reason: ZReason,
    correctedBy: ZName,
  })
  .strict();
export type TCorrectionInput = z.infer<typeof ZCorrectionInput>;

/** Turns zod issues into `{ path, message }` pairs for API answers and form messages. */
export function describeIssues(error: z.ZodError): { path: string; message: string }[] {
  // An unknown field is named by its own path ("subgroups.0.colour"), rather than by zod's one issue on the
  // object that holds it, so the caller sees which field to remove.
  return error.issues.flatMap((issue) =>
    issue.code === "unrecognized_keys"
      ? issue.keys.map((key) => ({ path: [...issue.path, key].map(String).join("."), message: "is not a known field" }))
      : [{ path: issue.path.map(String).join("."), message: issue.message }],
  );
}
