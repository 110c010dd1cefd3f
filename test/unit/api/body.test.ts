// Reading JSON bodies: media type, size cap (declared and streamed), UTF-8 and JSON syntax.
import { describe, expect, test } from "vitest";
import { MAX_BODY_BYTES, readJsonBody } from "@/src/api/body";
import { ApiProblem } from "@/src/api/problem";

function post(body: BodyInit | null, headers: Record<string, string> = { "content-type": "application/json" }): Request {
  return new Request("http://localhost/api/v1/x", { method: "POST", body, headers, ...(body instanceof ReadableStream ? { duplex: "half" } : {}) });
}

async function problemOf(request: Request, limit?: number): Promise<ApiProblem> {
  const error = await readJsonBody(request, limit).then(
    () => undefined,
    (thrown: unknown) => thrown,
  );
  if (!(error instanceof ApiProblem)) throw new Error(`expected an ApiProblem, got ${String(error)}`);
  return error;
}

describe("readJsonBody", () => {
  test("parses JSON sent as application/json, with or without charset=utf-8", async () => {
    expect(await readJsonBody(post('{"a":[1,2]}'))).toEqual({ a: [1, 2] });
    expect(await readJsonBody(post("[]", { "content-type": "application/json; charset=UTF-8" }))).toEqual([]);
  });

  test.each([
    ["no content type", null],
    ["text/plain", "text/plain"],
    ["form data", "application/x-www-form-urlencoded"],
    ["another charset", "application/json; charset=latin1"],
  ])("refuses %s with 415", async (_label, contentType) => {
    const problem = await problemOf(post("{}", contentType === null ? {} : { "content-type": contentType }));
    expect(problem.status).toBe(415);
    expect(problem.code).toBe("unsupported-media-type");
    expect(problem.message).toContain('"Content-Type: application/json"');
  });

  test("refuses a declared length over the limit before reading, with the limit in the message", async () => {
    const problem = await problemOf(post("{}", { "content-type": "application/json", "content-length": String(MAX_BODY_BYTES + 1) }));
    expect([problem.status, problem.code]).toEqual([413, "payload-too-large"]);
    expect(problem.message).toBe(`The request body is larger than the limit of ${MAX_BODY_BYTES} bytes (2 MiB).`);
  });

  test("refuses a streamed body that passes the limit without declaring its length", async () => {
    const chunk = new TextEncoder().encode("[" + "1,".repeat(40));
    let sent = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        sent += 1;
        controller.enqueue(chunk);
        if (sent > 100) controller.close();
      },
    });
    const problem = await problemOf(post(stream), 1000);
    expect(problem.status).toBe(413);
    // It stopped reading soon after the limit instead of consuming the whole stream.
    expect(sent).toBeLessThan(20);
  });

  test.each([
    ["an empty body", "", "The request body is empty; a JSON object is expected."],
    ["broken JSON", '{"subgroups": [', "The request body is not valid JSON"],
    ["a trailing comma", '{"a": 1,}', "The request body is not valid JSON"],
  ])("refuses %s with 400", async (_label, body, message) => {
    const problem = await problemOf(post(body));
    expect([problem.status, problem.code]).toEqual([400, "invalid-json"]);
    expect(problem.message.startsWith(message)).toBe(true);
  });

  test("refuses bytes that are not UTF-8", async () => {
    const problem = await problemOf(post(new Uint8Array([0x7b, 0xff, 0x7d])));
    expect([problem.status, problem.message]).toEqual([400, "The request body is not valid UTF-8 text."]);
  });
});
