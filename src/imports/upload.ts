/**
 * The HTTP side of the import (route handlers stay one line):
 * - POST /api/v1/characteristics/{id}/imports?options=<JSON of ZImportOptions>, the CSV file as the raw
 *   body. Path, options and characteristic are checked first (errors answer in the API's one error shape
 *   with their status). The body is then spooled to a temporary file (capped at MAX_IMPORT_BYTES), so the
 *   database's write lock is held only while the file is read from local disk, never while an upload
 *   crawls in. The answer streams NDJSON: `progress` lines ({ bytesRead, totalBytes, rowsRead }), then one
 *   `result` line (TImportResult) or one `error` line ({ status, error } as in src/api/problem.ts).
 * - GET /api/v1/characteristics/{id}/imports/{batchId}/rejected: the rejected-rows file of a batch.
 * Both answer only callers on this machine until API tokens exist (src/api/loopback.ts), like the rest of the API.
 */
import { createReadStream, createWriteStream } from "node:fs";
import { mkdtemp, rm, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import type { ReadableStream as NodeReadableStream } from "node:stream/web";
import { z } from "zod";
import { ZIdParams, type TApiError } from "@/shared/api";
import { apiDatabase } from "@/src/api/database";
import type { TRouteContext } from "@/src/api/handler";
import { loopbackRefusal } from "@/src/api/loopback";
import { ApiProblem, problemAnswer } from "@/src/api/problem";
import { getCharacteristic } from "@/src/characteristics/setup";
import { environment } from "@/src/config/env";
import { AppError, parseInput } from "@/src/errors";
import { importCsv, type TImportResult } from "./import-csv";
import { ZImportOptions } from "./options";
import { readRejectedRows } from "./rejected-rows";
import { openImportDatabase } from "./write";

/** Largest file accepted: 256 MiB, several million rows. */
export const MAX_IMPORT_BYTES = 256 * 1024 * 1024;

/** Least time between two progress lines, in milliseconds. */
const PROGRESS_INTERVAL_MS = 100;

export type TImportMessage =
  | { readonly type: "progress"; readonly bytesRead: number; readonly totalBytes: number; readonly rowsRead: number }
  | { readonly type: "result"; readonly result: TImportResult }
  | { readonly type: "error"; readonly status: number; readonly error: TApiError["error"] };

const ZRejectedPath = ZIdParams.extend({ batchId: ZIdParams.shape.id });

function refuseRemoteCallers(request: Request): void {
  const refusal = loopbackRefusal(request.headers);
  if (refusal !== undefined) throw new AppError("forbidden", `The API answers only callers on this machine until API tokens exist: ${refusal}.`);
}

function optionsFromQuery(url: URL): unknown {
  const text = url.searchParams.get("options");
  if (text === null) throw new AppError("invalid-input", 'The query parameter "options" (the column mapping and choices, as JSON) is required.', [{ path: "options", message: "is required" }]);
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new AppError("invalid-input", 'The query parameter "options" is not valid JSON.', [{ path: "options", message: "is not valid JSON" }]);
  }
}

const TOO_LARGE = `The file is larger than the limit of ${MAX_IMPORT_BYTES / 1024 / 1024} MiB.`;

/**
 * Refuses (413) a body whose declared length is over MAX_IMPORT_BYTES before any of it is read; a body
 * without a declared length (chunked) is measured as it is spooled.
 */
function refuseDeclaredOversize(request: Request): void {
  const declared = Number(request.headers.get("content-length") ?? Number.NaN);
  if (declared > MAX_IMPORT_BYTES) throw new ApiProblem(413, "payload-too-large", TOO_LARGE);
}

/** Writes the body to a new temporary file, refusing (413) past MAX_IMPORT_BYTES. */
async function spool(body: ReadableStream<Uint8Array>): Promise<{ directory: string; file: string }> {
  const directory = await mkdtemp(path.join(os.tmpdir(), "assignable-upload-"));
  const file = path.join(directory, "upload.csv");
  let bytes = 0;
  try {
    await pipeline(
      Readable.fromWeb(body as NodeReadableStream<Uint8Array>),
      async function* capped(source: AsyncIterable<Uint8Array>) {
        for await (const chunk of source) {
          bytes += chunk.byteLength;
          if (bytes > MAX_IMPORT_BYTES) throw new ApiProblem(413, "payload-too-large", TOO_LARGE);
          yield chunk;
        }
      },
      createWriteStream(file),
    );
  } catch (error) {
    await rm(directory, { recursive: true, force: true });
    throw error;
  }
  return { directory, file };
}

async function errorMessage(error: unknown): Promise<TImportMessage> {
  const answer = problemAnswer(error);
  const body = (await answer.json()) as TApiError;
  return { type: "error", status: answer.status, error: body.error };
}

export async function handleImportUpload(request: Request, context: TRouteContext): Promise<Response> {
  let characteristicId: number;
  let options: z.output<typeof ZImportOptions>;
  let upload: { directory: string; file: string };
  try {
    refuseRemoteCallers(request);
    characteristicId = parseInput(ZIdParams, await context.params, "path").id;
    options = parseInput(ZImportOptions, optionsFromQuery(new URL(request.url)), "import options");
    await getCharacteristic(await apiDatabase(), characteristicId);
    if (request.body === null) throw new AppError("invalid-input", "The request carries no file: send the CSV file as the request body.");
    refuseDeclaredOversize(request);
    upload = await spool(request.body);
  } catch (error) {
    return problemAnswer(error);
  }

  const encoder = new TextEncoder();
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (message: TImportMessage) => controller.enqueue(encoder.encode(`${JSON.stringify(message)}\n`));
      let sqlite: ReturnType<typeof openImportDatabase> | undefined;
      try {
        const totalBytes = (await stat(/*turbopackIgnore: true*/ upload.file)).size;
        let lastSent = 0;
        sqlite = openImportDatabase(environment().databaseFile);
        const result = await importCsv(await apiDatabase(), sqlite, {
          characteristicId,
          source: createReadStream(/*turbopackIgnore: true*/ upload.file),
          options,
          now: new Date(),
          onProgress: ({ bytesRead, rowsRead }) => {
            const now = Date.now();
            if (now - lastSent < PROGRESS_INTERVAL_MS && bytesRead < totalBytes) return;
            lastSent = now;
            send({ type: "progress", bytesRead, totalBytes, rowsRead });
          },
        });
        send({ type: "result", result });
      } catch (error) {
        send(await errorMessage(error));
      } finally {
        sqlite?.close();
        await rm(upload.directory, { recursive: true, force: true });
        controller.close();
      }
    },
  });
  // no-transform keeps the server's compression from holding back the progress lines.
  return new Response(stream, { headers: { "content-type": "application/x-ndjson; charset=utf-8", "cache-control": "no-store, no-transform" } });
}

export async function handleRejectedRowsDownload(request: Request, context: TRouteContext): Promise<Response> {
  try {
    refuseRemoteCallers(request);
    const { id, batchId } = parseInput(ZRejectedPath, await context.params, "path");
    const db = await apiDatabase();
    const batch = await db.importBatch.findFirst({ where: { id: batchId, characteristicId: id }, select: { fileName: true } });
    if (batch === null) throw new AppError("not-found", `Characteristic ${id} has no import ${batchId}.`);
    const csv = await readRejectedRows(environment().databaseFile, batchId);
    if (csv === undefined) throw new AppError("not-found", `Import ${batchId} rejected no rows, so it has no rejected-rows file.`);
    const name = `${path.basename(batch.fileName, path.extname(batch.fileName)).replace(/[^\w.-]+/g, "_")}-rejected.csv`;
    return new Response(csv, {
      headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${name}"`, "cache-control": "no-store" },
    });
  } catch (error) {
    return problemAnswer(error);
  }
}
