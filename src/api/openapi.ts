/**
 * The OpenAPI 3.1 document of the HTTP API, generated with @asteasolutions/zod-to-openapi from the same
 * route declarations (routes.ts) and zod schemas (shared/intake.ts, shared/api.ts) the handlers validate
 * with. Built once per server process.
 */
import { OpenAPIRegistry, OpenApiGeneratorV31 } from "@asteasolutions/zod-to-openapi";
import { ZApiError } from "@/shared/api";
import { MAX_BODY_BYTES } from "./body";
import { API_ROUTES } from "./routes";

/** Base path of version 1; route paths in routes.ts are relative to it. */
export const API_BASE_PATH = "/api/v1";

const JSON_MEDIA_TYPE = "application/json";

const ERROR_DESCRIPTIONS: Record<number, string> = {
  400: "The body is not JSON.",
  403: "The caller is not on this machine (the API works on loopback only until API tokens exist).",
  404: "No record with that id.",
  409: "The request conflicts with what is stored.",
  413: `The body is larger than ${MAX_BODY_BYTES} bytes.`,
  415: 'The body was not sent as "application/json".',
  422: "The input is not valid (every problem named by its field path), or the request was refused.",
  500: "A bug: the details are in the server log.",
  503: "The database stayed busy with another change (a large import) for 30 s; nothing was written. Send it again after Retry-After seconds.",
};

function buildDocument() {
  const registry = new OpenAPIRegistry();
  for (const route of API_ROUTES) {
    // Any write may wait for the database's other writers and give up (503).
    const errorStatuses = [...new Set([403, ...route.errors, 500, ...(route.method === "post" ? [503] : [])])].sort((a, b) => a - b);
    registry.registerPath({
      method: route.method,
      path: `${API_BASE_PATH}${route.path}`,
      summary: route.summary,
      ...(route.description === undefined ? {} : { description: route.description }),
      tags: [route.tag],
      request: {
        ...(route.params ? { params: route.params } : {}),
        ...(route.query ? { query: route.query } : {}),
        ...(route.body ? { body: { required: true, content: { [route.bodyMediaType ?? JSON_MEDIA_TYPE]: { schema: route.body } } } } : {}),
      },
      responses: {
        ...Object.fromEntries(
          [route.answer, ...(route.answer.alternative ? [route.answer.alternative] : [])].map(({ status, description }) => [
            status,
            { description, content: { [route.answer.mediaType ?? JSON_MEDIA_TYPE]: { schema: route.answer.schema } } },
          ]),
        ),
        ...Object.fromEntries(
          errorStatuses.map((status) => [
            status,
            { description: ERROR_DESCRIPTIONS[status] ?? "Error.", content: { [JSON_MEDIA_TYPE]: { schema: ZApiError } } },
          ]),
        ),
      },
    });
  }
  // Wrapped as definitions: a bare zod 4 schema has its own `type` field, which the generator would misread.
  const related = API_ROUTES.flatMap((route) => route.relatedSchemas ?? []).map((schema) => ({ type: "schema" as const, schema }));
  return new OpenApiGeneratorV31([...registry.definitions, ...related]).generateDocument({
    openapi: "3.1.0",
    info: {
      title: "Assignable API",
      version: "1.0.0",
      description:
        "Measurements in, signals out, for line systems. JSON in and out. Until API tokens arrive with " +
        "accounts, only callers on the same machine (loopback) are answered.",
    },
  });
}

let cached: ReturnType<typeof buildDocument> | undefined;

/** The OpenAPI document (built on first use). */
export function openApiDocument(): ReturnType<typeof buildDocument> {
  cached ??= buildDocument();
  return cached;
}
