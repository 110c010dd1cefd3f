/**
 * Turning any failure into the API's one error answer, `{ "error": { code, message, issues } }`.
 *
 * Status codes: application errors keep the mapping of src/errors.ts (`httpStatusOf`: invalid-input and
 * refused 422, not-found 404, conflict 409, forbidden 403, busy 503 with a Retry-After header). Failures before the input reaches a schema
 * have their own codes here: a body that is not JSON 400, the wrong media type 415, a body over the size
 * limit 413. Anything else is a bug: 500 with a short message, the details only in the server log.
 */
import { APP_ERROR_CODES, httpStatusOf, isAppError, type TIssue } from "@/src/errors";
import type { TApiError, TApiErrorCode } from "@/shared/api";

// Every application error code is also a documented API error code (checked by the compiler).
APP_ERROR_CODES satisfies readonly TApiErrorCode[];

/** A failure of the HTTP layer itself (not of the domain), with its status. */
export class ApiProblem extends Error {
  constructor(
    readonly status: number,
    readonly code: Exclude<TApiErrorCode, (typeof APP_ERROR_CODES)[number]>,
    message: string,
  ) {
    super(message);
    this.name = "ApiProblem";
  }
}

/** Seconds a caller is asked to wait before sending a write the busy database refused (RFC 9110, 10.2.3). */
export const BUSY_RETRY_AFTER_SECONDS = 5;

function answer(status: number, code: TApiErrorCode, message: string, issues: readonly TIssue[] = []): Response {
  // Only path and message leave the server: services may add fields for their own callers (e.g. an index).
  const body: TApiError = { error: { code, message, issues: issues.map(({ path, message: text }) => ({ path, message: text })) } };
  return Response.json(body, { status, headers: code === "busy" ? { "Retry-After": String(BUSY_RETRY_AFTER_SECONDS) } : {} });
}

/** The error answer for anything a handler threw. */
export function problemAnswer(error: unknown): Response {
  if (isAppError(error)) return answer(httpStatusOf(error), error.code, error.message, error.issues);
  if (error instanceof ApiProblem) return answer(error.status, error.code, error.message);
  console.error("API request failed unexpectedly:", error);
  return answer(500, "internal", "The server failed to handle this request; the details are in the server log.");
}
