/**
 * Every route of the HTTP API (version 1), declared once. The handlers under app/api/v1 take their
 * schemas from here and the OpenAPI document lists exactly these.
 */
import { z } from "zod";
import {
  ZCharacteristicChange,
  ZCharacteristicList,
  ZCharacteristicView,
  ZEventList,
  ZEventView,
  ZIdParams,
  ZLimitRevisionAnswer,
  ZLimitSetList,
  ZSequenceRangeQuery,
  ZSignalList,
  ZSubgroupsPostAnswer,
  ZTimeRangeQuery,
} from "@/shared/api";
import { INTAKE_LIMITS, ZCharacteristicInput, ZEventInput, ZLimitRevisionInput, ZSubgroupsPost } from "@/shared/intake";
import { chartDataRoute } from "@/src/chart-data/api-route";
import { ZImportOptions } from "@/src/imports/options";
import { MAX_IMPORT_BYTES } from "@/src/imports/upload";
import { defineApiRoute, type TApiRoute } from "./route-contract";

/** Statuses of a route that reads a JSON body: not JSON, too large, wrong media type, invalid. */
const BODY_ERRORS = [400, 413, 415, 422];

export const listCharacteristicsRoute = defineApiRoute({
  method: "get",
  path: "/characteristics",
  tag: "Characteristics",
  summary: "List every characteristic with its chart settings and the limits in force",
  answer: { status: 200, description: "Every characteristic, ordered by process and name.", schema: ZCharacteristicList },
  errors: [],
});

export const getCharacteristicRoute = defineApiRoute({
  method: "get",
  path: "/characteristics/{id}",
  tag: "Characteristics",
  summary: "One characteristic with its chart settings and the limits in force",
  params: ZIdParams,
  answer: { status: 200, description: "The characteristic.", schema: ZCharacteristicView },
  errors: [404, 422],
});

export const createCharacteristicRoute = defineApiRoute({
  method: "post",
  path: "/characteristics",
  tag: "Characteristics",
  summary: "Set up a characteristic: process, name, unit, chart type, subgroup size, specification, rule set",
  description:
    "The name must be new on its process (409 otherwise); an unknown process answers 404. The subgroup size must " +
    "fit the chart: 1 on an individuals chart, at least 2 on X-bar charts.",
  body: ZCharacteristicInput.meta({ id: "CharacteristicInput" }),
  answer: { status: 201, description: "The characteristic, with no subgroups and no limits yet.", schema: ZCharacteristicView },
  errors: [...BODY_ERRORS, 404, 409],
});

export const updateCharacteristicRoute = defineApiRoute({
  method: "post",
  path: "/characteristics/{id}",
  tag: "Characteristics",
  summary: "Change some of a characteristic's settings",
  description:
    "Fields left out keep their values; the result is checked whole, as on setup. Once subgroups are stored the " +
    "chart type, subgroup size and process cannot change (409). A changed rule set re-evaluates the stored " +
    "signals, recorded with `changedBy`.",
  params: ZIdParams,
  body: ZCharacteristicChange,
  answer: { status: 200, description: "The characteristic as changed.", schema: ZCharacteristicView },
  errors: [...BODY_ERRORS, 404, 409],
});

export const listLimitSetsRoute = defineApiRoute({
  method: "get",
  path: "/characteristics/{id}/limit-sets",
  tag: "Characteristics",
  summary: "Every limit version of a characteristic, oldest first, with the subgroups each applies to",
  params: ZIdParams,
  answer: { status: 200, description: "The limit versions.", schema: ZLimitSetList },
  errors: [404, 422],
});

export const reviseLimitsRoute = defineApiRoute({
  method: "post",
  path: "/characteristics/{id}/limit-sets",
  tag: "Characteristics",
  summary: "Compute a new limit version from a baseline of stored subgroups, freeze it and re-evaluate the signals",
  description:
    "The baseline is the stored subgroups with sequences baselineStart up to (not including) baselineEnd, minus the " +
    "excluded ones, each with its reason; a reason for the new version is required. The version applies from " +
    "baselineStart on; a baseline beyond the stored subgroups, or one too small or without variation, is refused (422).",
  params: ZIdParams,
  body: ZLimitRevisionInput.meta({ id: "LimitRevisionInput" }),
  answer: {
    status: 201,
    description: "The new frozen version with the subgroups it applies to, and the re-evaluation it caused.",
    schema: ZLimitRevisionAnswer,
  },
  errors: [...BODY_ERRORS, 404],
});

export const postSubgroupsRoute = defineApiRoute({
  method: "post",
  path: "/characteristics/{id}/subgroups",
  tag: "Characteristics",
  summary: "Store subgroups and evaluate them at once against the limits in force",
  description:
    `All or nothing: if any subgroup is invalid nothing is stored and every problem is named by its path ` +
    `(e.g. "subgroups.3.values.2"). Which fields a subgroup needs depends on the chart: values (exactly the ` +
    `subgroup size) for variables charts; count and size for p and np; count for c; count and units for u. ` +
    `At most ${INTAKE_LIMITS.subgroupsPerRequest} subgroups per request; timestamps must not go backwards. ` +
    `A subgroup may carry the line system's own \`key\` (unique within the request): one whose key is already ` +
    `stored on the characteristic is not stored again and is not checked against time order, so a post that ` +
    `timed out can be sent again as it was. A key already stored for a reading at another time is a conflict (409).`,
  params: ZIdParams,
  body: ZSubgroupsPost.meta({ id: "SubgroupsPost" }),
  answer: {
    status: 201,
    description:
      "At least one subgroup was stored: what became of each posted subgroup, the stored ones with their sequences, " +
      "and the signals they raised or extended.",
    schema: ZSubgroupsPostAnswer,
    alternative: {
      status: 200,
      description: "Every subgroup was posted with a key that is already stored: nothing was stored; the outcomes name the stored subgroups.",
    },
  },
  errors: [...BODY_ERRORS, 404, 409],
});

export const listSignalsRoute = defineApiRoute({
  method: "get",
  path: "/characteristics/{id}/signals",
  tag: "Characteristics",
  summary: "Stored signals of a characteristic, optionally those touching a range of sequences",
  params: ZIdParams,
  query: ZSequenceRangeQuery,
  answer: { status: 200, description: "The signals, in order of their first point.", schema: ZSignalList },
  errors: [404, 422],
});

export const postEventRoute = defineApiRoute({
  method: "post",
  path: "/processes/{id}/events",
  tag: "Processes",
  summary: "Record a process event (lot change, maintenance, setting change, ...)",
  params: ZIdParams,
  body: ZEventInput.meta({ id: "ProcessEventInput" }),
  answer: { status: 201, description: "The recorded event.", schema: ZEventView },
  errors: [...BODY_ERRORS, 404],
});

export const listEventsRoute = defineApiRoute({
  method: "get",
  path: "/processes/{id}/events",
  tag: "Processes",
  summary: "Events of a process, optionally within a time range",
  params: ZIdParams,
  query: ZTimeRangeQuery,
  answer: { status: 200, description: "The events, oldest first.", schema: ZEventList },
  errors: [404, 422],
});

export const postImportRoute = defineApiRoute({
  method: "post",
  path: "/characteristics/{id}/imports",
  tag: "Characteristics",
  summary: "Import a CSV file of measurements, streaming progress",
  description:
    `The CSV file is the raw body (at most ${MAX_IMPORT_BYTES / 1024 / 1024} MiB); \`options\` in the query is the ` +
    `column mapping and choices as JSON (schema ImportOptions). Path, options and characteristic are checked ` +
    `before the upload is read. The answer streams one JSON object per line: \`{"type":"progress",...}\` lines, ` +
    `then one \`{"type":"result","result":{...}}\` or \`{"type":"error","status":...,"error":{...}}\` (the Error shape).`,
  params: ZIdParams,
  query: z.object({
    options: z.string().meta({ description: "ImportOptions as JSON (URL-encoded).", example: '{"mapping":{...},"fileName":"week-48.csv"}' }),
  }),
  relatedSchemas: [ZImportOptions.meta({ id: "ImportOptions" })],
  body: z.string().meta({ description: "The CSV file." }),
  bodyMediaType: "text/csv",
  answer: {
    status: 200,
    description: "Newline-delimited JSON: progress lines, then the result or an error.",
    schema: z.string(),
    mediaType: "application/x-ndjson",
  },
  errors: [404, 413, 422],
});

export const getRejectedRowsRoute = defineApiRoute({
  method: "get",
  path: "/characteristics/{id}/imports/{batchId}/rejected",
  tag: "Characteristics",
  summary: "The rows a valid-rows-only import rejected, as CSV with a line and a reason",
  params: ZIdParams.extend({ batchId: ZIdParams.shape.id.meta({ description: "Import batch id", example: "1" }) }),
  answer: { status: 200, description: "The rejected rows.", schema: z.string(), mediaType: "text/csv" },
  errors: [404, 422],
});

export const openApiRoute = defineApiRoute({
  method: "get",
  path: "/openapi.json",
  tag: "Document",
  summary: "This API described as an OpenAPI 3.1 document",
  answer: {
    status: 200,
    description: "The OpenAPI document.",
    schema: z.looseObject({ openapi: z.string() }).meta({ id: "OpenApiDocument", description: "An OpenAPI 3.1 document." }),
  },
  errors: [],
});

export const API_ROUTES: readonly TApiRoute[] = [
  listCharacteristicsRoute,
  createCharacteristicRoute,
  getCharacteristicRoute,
  updateCharacteristicRoute,
  listLimitSetsRoute,
  reviseLimitsRoute,
  postSubgroupsRoute,
  listSignalsRoute,
  chartDataRoute,
  postEventRoute,
  listEventsRoute,
  postImportRoute,
  getRejectedRowsRoute,
  openApiRoute,
];
