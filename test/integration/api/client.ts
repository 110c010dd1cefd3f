/**
 * Calling route handlers in process, as Next.js would: a `Request` with the headers `next start` sets for
 * a caller on this machine, and the dynamic segments as a promise.
 */
import { expect } from "vitest";
import type { TRouteHandler } from "@/src/api/handler";

/** Headers `next start` gives a request from curl on the same machine (see src/api/loopback.ts). */
export const LOCAL_HEADERS = { host: "localhost:3000", "x-forwarded-for": "127.0.0.1" } as const;

export interface TCall {
  readonly path: string;
  readonly params?: Record<string, string>;
  /** A value to send as JSON, or a string sent as it is. */
  readonly body?: unknown;
  readonly headers?: Record<string, string>;
  readonly method?: "GET" | "POST";
}

export interface TAnswer {
  readonly status: number;
  // Answers are checked field by field in the tests; `any` keeps those checks short.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  readonly json: any;
}

export async function call(handler: TRouteHandler, request: TCall): Promise<TAnswer> {
  const method = request.method ?? (request.body === undefined ? "GET" : "POST");
  const headers: Record<string, string> = {
    ...LOCAL_HEADERS,
    ...(request.body === undefined ? {} : { "content-type": "application/json" }),
    ...request.headers,
  };
  const body = request.body === undefined ? undefined : typeof request.body === "string" ? request.body : JSON.stringify(request.body);
  const response = await handler(new Request(`http://localhost:3000${request.path}`, { method, headers, body }), {
    params: Promise.resolve(request.params ?? {}),
  });
  expect(response.headers.get("content-type")).toBe("application/json");
  return { status: response.status, json: await response.json() };
}
