/**
 * Refused requests, as the malformed-request tables describe them: what each case expects, a builder for
 * the common case of one field refused by its schema, and the check that the answer says exactly that
 * in the error contract and that nothing was written (row counts of every intake table before and after).
 */
import { expect } from "vitest";
import { ZApiError } from "@/shared/api";
import type { PrismaClient } from "@/src/db/connect";
import { rowCounts } from "@/test/integration/intake/database";
import type { TAnswer } from "./client";

export interface TRefusal {
  readonly request: () => Promise<TAnswer>;
  readonly status: number;
  readonly code: string;
  /** The whole message, or `expect.stringMatching(...)` where it quotes a library's wording. */
  readonly message: string;
  readonly issues: readonly { path: string; message: string }[];
}

/**
 * One field of the request body, query or path refused by its schema: 422 invalid-input, the issue at
 * `path`, and the message "The <part> is not valid: <path> <message>." that the API handler writes.
 */
export function invalidField(request: () => Promise<TAnswer>, part: "request body" | "query" | "path", path: string, message: string): TRefusal {
  return { request, status: 422, code: "invalid-input", message: `The ${part} is not valid: ${path} ${message}.`, issues: [{ path, message }] };
}

/** Sends the request and checks the refusal and that no row was written. */
export async function expectRefusedWithoutWriting(db: PrismaClient, expected: TRefusal): Promise<void> {
  const before = await rowCounts(db);
  const answer = await expected.request();
  expect(answer.status).toBe(expected.status);
  expect(ZApiError.parse(answer.json)).toEqual(answer.json);
  expect(answer.json.error).toEqual({ code: expected.code, message: expected.message, issues: expected.issues });
  expect(await rowCounts(db)).toEqual(before);
}
