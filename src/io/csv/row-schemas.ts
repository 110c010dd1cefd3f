/**
 * zod schemas for one CSV row of each chart input, over the row's trimmed text cells.
 *
 * Layouts (column names are matched without regard to case; other columns are ignored):
 * - measured values, one per row: `value`, optional `timestamp` (imr, ewma, cusum);
 * - measured values in subgroups: `subgroup`, `value`, several rows per subgroup (xbar-r, xbar-s);
 * - defectives in samples: `defectives`, `size` (p, np);
 * - defects per sample: `count` (c);
 * - defects over inspection units: `count`, `units` (u).
 */
import { z } from "zod";
import type { ChartType } from "../../../shared/constants";

export type InputLayout = "values" | "subgroups" | "defectives" | "defects" | "defects-per-unit";

export const CHART_INPUT_LAYOUT: Record<ChartType, InputLayout> = {
  imr: "values",
  ewma: "values",
  cusum: "values",
  "xbar-r": "subgroups",
  "xbar-s": "subgroups",
  p: "defectives",
  np: "defectives",
  c: "defects",
  u: "defects-per-unit",
};

export const LAYOUT_COLUMNS: Record<InputLayout, { required: readonly string[]; optional: readonly string[] }> = {
  values: { required: ["value"], optional: ["timestamp"] },
  subgroups: { required: ["subgroup", "value"], optional: [] },
  defectives: { required: ["defectives", "size"], optional: [] },
  defects: { required: ["count"], optional: [] },
  "defects-per-unit": { required: ["count", "units"], optional: [] },
};

// A plain decimal number: digits with an optional fraction and exponent. No thousands separators,
// no "Infinity", no hexadecimal: what Number() would also accept but a person did not mean.
export const DECIMAL_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A cell holding a number. With `decimalComma`, one comma may stand for the decimal point. */
export function numberCell(decimalComma: boolean) {
  return z.string().transform((text, context) => {
    if (text === "") {
      context.addIssue("is empty: a number is required");
      return z.NEVER;
    }
    const mixedMarks = text.includes(",") && text.includes(".");
    const normalized = decimalComma && !mixedMarks ? text.replace(",", ".") : text;
    if (!DECIMAL_NUMBER.test(normalized)) {
      const hint = !decimalComma && text.includes(",") ? " (a decimal comma needs semicolon-separated columns)" : "";
      context.addIssue(`"${text}" is not a number${hint}`);
      return z.NEVER;
    }
    const value = Number(normalized);
    if (!Number.isFinite(value)) {
      context.addIssue(`"${text}" is too large to be a number`);
      return z.NEVER;
    }
    return value;
  });
}

const notWhole = (issue: { input?: unknown }) => `${String(issue.input)} is not a whole number`;

export function countCell(decimalComma: boolean) {
  return numberCell(decimalComma).pipe(
    z
      .number()
      .int({ error: notWhole })
      .nonnegative({ error: (issue) => `${String(issue.input)} is negative: a count cannot be negative` }),
  );
}

export function positiveCell(decimalComma: boolean, wholeNumber: boolean) {
  const positive = z
    .number()
    .positive({ error: (issue) => `${String(issue.input)} is not a valid size: it must be greater than zero` });
  return numberCell(decimalComma).pipe(wholeNumber ? positive.int({ error: notWhole }) : positive);
}

const timestampCell = z
  .string()
  .refine((text) => text === "" || z.union([z.iso.date(), z.iso.datetime({ offset: true, local: true })]).safeParse(text).success, {
    error: "must be an ISO 8601 date or date-time, e.g. 2024-03-01 or 2024-03-01T08:30",
  });

/** The row schemas for a file, given whether it uses decimal commas. */
export function rowSchemas(decimalComma: boolean) {
  return {
    values: z.object({ value: numberCell(decimalComma), timestamp: timestampCell.optional() }),
    subgroups: z.object({ subgroup: z.string().min(1, "is empty: a subgroup id is required"), value: numberCell(decimalComma) }),
    defectives: z
      .object({ defectives: countCell(decimalComma), size: positiveCell(decimalComma, true) })
      .refine((row) => row.defectives <= row.size, {
        path: ["defectives"],
        error: (issue) => {
          const row = issue.input as { defectives: number; size: number };
          return `${row.defectives} defectives is more than the sample size ${row.size}`;
        },
      }),
    defects: z.object({ count: countCell(decimalComma) }),
    "defects-per-unit": z.object({ count: countCell(decimalComma), units: positiveCell(decimalComma, false) }),
  } satisfies Record<InputLayout, z.ZodType>;
}
