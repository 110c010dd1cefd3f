/**
 * What a person chooses for a CSV import: which file columns hold what (the column mapping), how to
 * read times written without a zone (at a fixed UTC offset, or as wall-clock time in the site's zone),
 * how to read slash dates, and whether rows with problems stop the whole import. zod only, so the
 * browser form and the server check the same schema.
 */
import { z } from "zod";
import { VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import { INTAKE_LIMITS } from "@/shared/intake";

export const IMPORT_MODES = ["all-or-nothing", "valid-only"] as const;
export type TImportMode = (typeof IMPORT_MODES)[number];

/** How to read a slash date such as 03/04/2026; with no choice such dates are refused, never guessed. */
export const DAY_MONTH_ORDERS = ["day-first", "month-first"] as const;
export type TDayMonthOrder = (typeof DAY_MONTH_ORDERS)[number];

/** A fixed UTC offset: "Z" or ±HH:MM from -12:00 to +14:00. */
export const UTC_OFFSET_PATTERN = /^(?:Z|[+-](?:0\d|1[0-4]):[0-5]\d)$/;

/** The measurement roles a file column can play (tags are listed separately). */
export const COLUMN_ROLES = ["timestamp", "subgroup", "value", "count", "size", "units"] as const;
export type TColumnRole = (typeof COLUMN_ROLES)[number];

/** Plain words for each role, in messages and form labels. */
export const COLUMN_ROLE_WORDS: Record<TColumnRole, string> = {
  timestamp: "timestamp",
  subgroup: "subgroup id",
  value: "measured value",
  count: "count (defectives or defects)",
  size: "sample size",
  units: "inspection units",
};

/** The measurement roles a chart reads from a file; every other one is refused (subgroup and timestamp aside). */
export function measurementRolesFor(chart: ChartType): readonly ("value" | "count" | "size" | "units")[] {
  if (VARIABLES_CHART_TYPES.includes(chart)) return ["value"];
  if (chart === "p" || chart === "np") return ["count", "size"];
  if (chart === "u") return ["count", "units"];
  return ["count"];
}

const ZColumnName = z.string().trim().min(1, { error: "names no column" }).max(200);

export const ZColumnMapping = z
  .object({
    timestamp: ZColumnName,
    subgroup: ZColumnName.optional(),
    value: ZColumnName.optional(),
    count: ZColumnName.optional(),
    size: ZColumnName.optional(),
    units: ZColumnName.optional(),
    /** File columns read as stratification tags, each under a tag name. */
    tags: z
      .array(
        z
          .object({
            column: ZColumnName,
            tag: z
              .string()
              .max(INTAKE_LIMITS.tagKeyLength)
              .regex(/^[a-z][a-z0-9-]*$/, { error: "tag names are lower-case letters, digits and hyphens" }),
          })
          .strict(),
      )
      .max(INTAKE_LIMITS.tagsPerSubgroup, { error: `at most ${INTAKE_LIMITS.tagsPerSubgroup} tag columns` })
      .default([]),
  })
  .strict()
  .superRefine((mapping, context) => {
    const used = new Map<string, string>();
    const claim = (column: string, role: string, path: (string | number)[]) => {
      const key = column.toLowerCase();
      const earlier = used.get(key);
      if (earlier !== undefined) context.addIssue({ code: "custom", path, message: `column "${column}" is already mapped to ${earlier}` });
      used.set(key, role);
    };
    for (const role of COLUMN_ROLES) {
      const column = mapping[role];
      if (column !== undefined) claim(column, role, [role]);
    }
    const tagNames = new Set<string>();
    mapping.tags.forEach(({ column, tag }, index) => {
      claim(column, `tag "${tag}"`, ["tags", index, "column"]);
      if (tagNames.has(tag)) context.addIssue({ code: "custom", path: ["tags", index, "tag"], message: `tag "${tag}" is given twice` });
      tagNames.add(tag);
    });
  });
export type TColumnMapping = z.infer<typeof ZColumnMapping>;

export const ZImportOptions = z
  .object({
    mapping: ZColumnMapping,
    mode: z.enum(IMPORT_MODES).default("all-or-nothing"),
    /** Offset of times written without a zone; without it (or siteZone) such times are refused. */
    utcOffset: z.string().regex(UTC_OFFSET_PATTERN, { error: 'must be "Z" or an offset like +01:00 or -05:00' }).optional(),
    /** Times written without a zone are wall-clock time in the site's time zone, summer time included. */
    siteZone: z.boolean().default(false),
    dayMonthOrder: z.enum(DAY_MONTH_ORDERS).optional(),
    fileName: z.string().trim().min(1, { error: "is required" }).max(200),
    /** Check everything and report what would happen, writing nothing. */
    dryRun: z.boolean().default(false),
  })
  .strict()
  .refine((options) => !(options.siteZone && options.utcOffset !== undefined), {
    path: ["siteZone"],
    error: "choose either the site's time zone or a fixed UTC offset for times without a zone, not both",
  });
export type TImportOptions = z.infer<typeof ZImportOptions>;
export type TImportOptionsInput = z.input<typeof ZImportOptions>;
