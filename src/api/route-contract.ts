/**
 * The shape of one API route, declared once: its method and path, and the zod schemas of its path
 * parameters, query, body and answer. The route handler validates with these schemas and the OpenAPI
 * document is generated from the same objects, so the two cannot drift apart.
 */
import type { z } from "zod";

export interface TApiRoute {
  readonly method: "get" | "post";
  /** OpenAPI path under /api/v1, parameters in braces: "/characteristics/{id}/subgroups". */
  readonly path: string;
  readonly summary: string;
  readonly description?: string;
  readonly tag: "Characteristics" | "Processes" | "Document";
  readonly params?: z.ZodObject;
  readonly query?: z.ZodObject;
  readonly body?: z.ZodType;
  /** Media type of the body when it is not JSON (e.g. "text/csv"; its schema is then z.string()). */
  readonly bodyMediaType?: string;
  readonly answer: {
    readonly status: 200 | 201;
    readonly description: string;
    readonly schema: z.ZodType;
    /** Media type of the answer when it is not JSON (e.g. "application/x-ndjson", "text/csv"). */
    readonly mediaType?: string;
    /**
     * A second success status with the same answer schema, which the handler chooses by returning a
     * `StatusAnswer` (src/api/handler.ts): e.g. 200 for a retried post that stored nothing new.
     */
    readonly alternative?: { readonly status: 200 | 201; readonly description: string };
  };
  /**
   * Schemas the route uses where OpenAPI cannot point at them (JSON inside a query parameter); the
   * document lists them in its components so the description can name them.
   */
  readonly relatedSchemas?: readonly z.ZodType[];
  /** Error statuses this route can answer with, besides 403 (not local) and 500 (a bug). */
  readonly errors: readonly number[];
}

/** Declares a route, keeping the literal types of its schemas for the handler. */
export function defineApiRoute<const TRoute extends TApiRoute>(route: TRoute): TRoute {
  return route;
}
