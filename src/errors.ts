/**
 * The one application error type. Services throw it for failures the caller must report to a person
 * (bad input, a missing record, a refused operation); route handlers and actions turn it into an answer
 * (`httpStatusOf` for the status code). Bugs stay ordinary errors.
 */
import type { z } from "zod";
import { describeIssues } from "@/shared/intake";

export const APP_ERROR_CODES = ["invalid-input", "not-found", "conflict", "forbidden", "refused", "busy"] as const;
export type TAppErrorCode = (typeof APP_ERROR_CODES)[number];

/** One problem with the input: a dotted field path ("subgroups.3.values") and what is wrong. */
export interface TIssue {
  /** Position of the offending item in a list input (e.g. the subgroup), when there is one. */
  readonly index?: number;
  readonly path: string;
  readonly message: string;
}

export class AppError extends Error {
  readonly code: TAppErrorCode;
  readonly issues: readonly TIssue[];

  constructor(code: TAppErrorCode, message: string, issues: readonly TIssue[] = []) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.issues = issues;
  }
}

/** An "invalid-input" error from a zod failure, its issues under `prefix` (e.g. "subgroups.3"). */
export function invalidInput(message: string, error: z.ZodError, prefix = ""): AppError {
  const issues = describeIssues(error).map(({ path, message: text }) => ({
    path: [prefix, path].filter((part) => part !== "").join("."),
    message: text,
  }));
  return new AppError("invalid-input", message, issues);
}

/** Parse `input` with `schema` or throw an "invalid-input" AppError naming every issue. */
export function parseInput<TSchema extends z.ZodType>(schema: TSchema, input: unknown, what: string): z.infer<TSchema> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) {
    throw invalidInput(`The ${what} is not valid: ${describeIssues(parsed.error).map(describeIssue).join("; ")}.`, parsed.error);
  }
  return parsed.data;
}

function describeIssue(issue: TIssue): string {
  return issue.path === "" ? issue.message : `${issue.path} ${issue.message}`;
}

const HTTP_STATUS: Record<TAppErrorCode, number> = {
  "invalid-input": 422,
  "not-found": 404,
  conflict: 409,
  forbidden: 403,
  refused: 422,
  busy: 503,
};

/** The HTTP status code for an application error. */
export function httpStatusOf(error: AppError): number {
  return HTTP_STATUS[error.code];
}

export function isAppError(error: unknown): error is AppError {
  return error instanceof AppError;
}
