/**
 * Reading a JSON request body safely: the media type is checked first, the size is capped while the body
 * streams in (a missing or lying Content-Length cannot get past the cap), and bad JSON becomes an
 * answer naming the problem instead of an exception.
 */
import { ApiProblem } from "./problem";

/**
 * Largest body accepted, in bytes. The biggest valid request, 1,000 subgroups of 25 values with ten tags
 * each, is about 1 MB of JSON; 2 MiB leaves room for whitespace without inviting abuse.
 */
export const MAX_BODY_BYTES = 2 * 1024 * 1024;

/** `application/json`, with no parameter or `charset=utf-8` (JSON is UTF-8, RFC 8259 §8.1). */
function isJsonMediaType(contentType: string | null): boolean {
  if (contentType === null) return false;
  const [mediaType, ...parameters] = contentType.split(";").map((part) => part.trim().toLowerCase());
  if (mediaType !== "application/json") return false;
  return parameters.every((parameter) => ["", "charset=utf-8"].includes(parameter.replace(/[\s"]/g, "")));
}

/** The body's bytes, refusing with 413 as soon as they pass `limit`. */
async function readCapped(request: Request, limit: number): Promise<Uint8Array> {
  const tooLarge = () =>
    new ApiProblem(413, "payload-too-large", `The request body is larger than the limit of ${limit} bytes (${limit / 1024 / 1024} MiB).`);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limit) throw tooLarge();
  if (request.body === null) return new Uint8Array();
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let length = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    length += value.byteLength;
    if (length > limit) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(length);
  let offset = 0;
  for (const chunk of chunks) {
    bytes.set(chunk, offset);
    offset += chunk.byteLength;
  }
  return bytes;
}

/** Parses the request body as JSON, or throws an ApiProblem (415, 413 or 400) that says why not. */
export async function readJsonBody(request: Request, limit: number = MAX_BODY_BYTES): Promise<unknown> {
  const contentType = request.headers.get("content-type");
  if (!isJsonMediaType(contentType)) {
    throw new ApiProblem(
      415,
      "unsupported-media-type",
      `The request body must be JSON sent with "Content-Type: application/json"; it came as ${contentType === null ? "no content type" : `"${contentType}"`}.`,
    );
  }
  const bytes = await readCapped(request, limit);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    throw new ApiProblem(400, "invalid-json", "The request body is not valid UTF-8 text.");
  }
  if (text.trim() === "") throw new ApiProblem(400, "invalid-json", "The request body is empty; a JSON object is expected.");
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    const detail = error instanceof SyntaxError ? `: ${error.message}` : "";
    throw new ApiProblem(400, "invalid-json", `The request body is not valid JSON${detail}.`);
  }
}
