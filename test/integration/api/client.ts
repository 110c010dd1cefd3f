/**
 * Calling route handlers in process, as Next.js would: a `Request` with the headers `next start` sets for
 * a caller on this machine, and the dynamic segments as a promise. Most answers are JSON (`call`); the CSV
 * import streams NDJSON (`ndjsonLines`) and its rejected-rows file is CSV (read from `send`'s Response).
 */
import { expect } from "vitest";
import type { TRouteHandler } from "@/src/api/handler";

/** Headers `next start` gives a request from curl on the same machine (see src/api/loopback.ts). */
export const LOCAL_HEADERS = { host: "localhost:3000", "x-forwarded-for": "127.0.0.1" } as const;

export interface TCall {
  readonly path: string;
  readonly params?: Record<string, string>;
  /** A value to send as JSON, or a string, bytes or a stream sent as they are. */
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

function isRawBody(body: unknown): body is string | Uint8Array | ReadableStream<Uint8Array> {
  return typeof body === "string" || body instanceof Uint8Array || body instanceof ReadableStream;
}

/** The Request `call` sends (built apart so a test can look at it afterwards, e.g. whether its body was read). */
export function buildRequest(request: TCall): Request {
  const method = request.method ?? (request.body === undefined ? "GET" : "POST");
  const headers: Record<string, string> = {
    ...LOCAL_HEADERS,
    ...(request.body === undefined ? {} : { "content-type": "application/json" }),
    ...request.headers,
  };
  const body = request.body === undefined ? undefined : isRawBody(request.body) ? request.body : JSON.stringify(request.body);
  // A stream body must say that the request is sent while the answer may already come (fetch's half duplex).
  return new Request(`http://localhost:3000${request.path}`, { method, headers, body: body as BodyInit | undefined, duplex: "half" } as RequestInit);
}

/** Hands `request` to the handler with the path's dynamic segments and returns its Response as it is. */
export function send(handler: TRouteHandler, request: Request, params: Record<string, string> = {}): Promise<Response> {
  return handler(request, { params: Promise.resolve(params) });
}

/** A JSON answer: its status and parsed body. */
export async function jsonAnswer(response: Response): Promise<TAnswer> {
  expect(response.headers.get("content-type")).toBe("application/json");
  return { status: response.status, json: await response.json() };
}

export async function call(handler: TRouteHandler, request: TCall): Promise<TAnswer> {
  return jsonAnswer(await send(handler, buildRequest(request), request.params));
}

/** An NDJSON answer read to its end: one parsed value per line, every line ended by a line break. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export async function ndjsonLines(response: Response): Promise<any[]> {
  expect(response.headers.get("content-type")).toBe("application/x-ndjson; charset=utf-8");
  const text = await response.text();
  expect(text.endsWith("\n")).toBe(true);
  return text
    .slice(0, -1)
    .split("\n")
    .map((line) => JSON.parse(line) as unknown);
}
