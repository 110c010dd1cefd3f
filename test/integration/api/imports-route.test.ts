// The CSV import over HTTP, its route handlers called in process on a real, migrated SQLite file: the
// NDJSON answer of an import (progress lines, then the result), the refusals answered before the file is
// read (options, characteristic, caller), the size limit, a refused file, a valid-rows-only import and the
// download of its rejected rows, and a second import waiting at the write gate for the first.
import { createHash } from "node:crypto";
import { readdir } from "node:fs/promises";
import os from "node:os";
import { describe, expect, test } from "vitest";
import { POST as postImport } from "@/app/api/v1/characteristics/[id]/imports/route";
import { GET as getRejectedRows } from "@/app/api/v1/characteristics/[id]/imports/[batchId]/rejected/route";
import { importCsv } from "@/src/imports/import-csv";
import { MAX_IMPORT_BYTES } from "@/src/imports/upload";
import { createTestCharacteristic, NOW, tableCounts } from "@/test/integration/imports/harness";
import { buildRequest, jsonAnswer, ndjsonLines, send } from "./client";
import { registerImportRoutesDatabase } from "./fixture";
import { expectRefusedWithoutWriting, type TRefusal } from "./refusal";

const harness = registerImportRoutesDatabase("import-routes");

const MAPPING = { timestamp: "timestamp", value: "value" };
const encoder = new TextEncoder();

/** An individuals file of `count` rows, one minute apart from `start`, values invented around 18.2. */
function readings(count: number, start = Date.UTC(2026, 5, 1)): string {
  const rows = Array.from({ length: count }, (_, index) => `${new Date(start + index * 60_000).toISOString()},${(18 + (index % 50) / 100).toFixed(2)}`);
  return ["timestamp,value", ...rows, ""].join("\n");
}

/** The import request: the file as the raw body, the options as JSON in the query (a text as it is; none when undefined). */
function importRequest(characteristicId: number, body: string | ReadableStream<Uint8Array>, options: unknown, headers: Record<string, string> = {}): Request {
  const query = options === undefined ? "" : `?options=${encodeURIComponent(typeof options === "string" ? options : JSON.stringify(options))}`;
  return buildRequest({ path: `/api/v1/characteristics/${characteristicId}/imports${query}`, body, headers: { "content-type": "text/csv", ...headers } });
}

const upload = (characteristicId: number, request: Request) => send(postImport, request, { id: String(characteristicId) });

function rejectedRowsOf(characteristicId: number, batchId: number, headers: Record<string, string> = {}) {
  const request = buildRequest({ path: `/api/v1/characteristics/${characteristicId}/imports/${batchId}/rejected`, headers });
  return send(getRejectedRows, request, { id: String(characteristicId), batchId: String(batchId) });
}

/** A body that notes whether anything read it: it is pulled only on a read (no chunk is queued ahead). */
function watchedBody(text: string) {
  const watch = { pulled: false };
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        watch.pulled = true;
        controller.enqueue(encoder.encode(text));
        controller.close();
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, watch };
}

/** The upload's temporary directories now present (the route removes its own in every case). */
async function uploadDirectories(): Promise<string[]> {
  return (await readdir(os.tmpdir())).filter((name) => name.startsWith("assignable-upload-"));
}

/** Progress lines, then exactly one last line: checks the progress lines against the file and returns the last. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
function lastAfterProgress(lines: any[], file: string, rows: number) {
  const progress = lines.slice(0, -1);
  expect(progress.length).toBeGreaterThanOrEqual(1);
  const totalBytes = encoder.encode(file).byteLength;
  for (const [index, line] of progress.entries()) {
    expect(line).toEqual({ type: "progress", bytesRead: expect.any(Number), totalBytes, rowsRead: expect.any(Number) });
    const previous = progress[index - 1];
    if (previous !== undefined) {
      expect(line.bytesRead).toBeGreaterThanOrEqual(previous.bytesRead);
      expect(line.rowsRead).toBeGreaterThanOrEqual(previous.rowsRead);
    }
  }
  expect(progress.at(-1)).toEqual({ type: "progress", bytesRead: totalBytes, totalBytes, rowsRead: rows });
  return lines.at(-1);
}

describe("a successful import", () => {
  test("streams progress lines up to the file's size, then the result; the rows and the batch are stored", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    // 3,000 rows, about 80 KB: more than one 64 KiB chunk of the spooled file, so progress counts up.
    const file = readings(3_000);
    const directoriesBefore = await uploadDirectories();
    const response = await upload(id, importRequest(id, file, { mapping: MAPPING, fileName: "press 4 june.csv" }));
    expect(response.status).toBe(200);
    expect(response.headers.get("cache-control")).toBe("no-store, no-transform");
    const lines = await ndjsonLines(response);
    const last = lastAfterProgress(lines, file, 3_000);
    expect(lines[0].bytesRead).toBeLessThan(encoder.encode(file).byteLength);
    const fileHash = createHash("sha256").update(file).digest("hex");
    expect(last).toEqual({
      type: "result",
      result: {
        status: "imported",
        mode: "all-or-nothing",
        fileName: "press 4 june.csv",
        fileHash,
        separator: ",",
        decimalMark: ".",
        rowsRead: 3_000,
        rowsRejected: 0,
        subgroupsAdded: 3_000,
        subgroupsAlreadyPresent: 0,
        addedSequences: [0, 2_999],
        problems: [],
        problemCount: 0,
        batchId: expect.any(Number),
        hasRejectedRowsFile: false,
        // No limits yet, so the re-evaluation after the commit (recorded below) can find no signal.
        signalsRaised: 0,
      },
    });

    const stored = await harness.prisma.subgroup.findMany({
      where: { characteristicId: id },
      orderBy: { sequence: "asc" },
      select: { timestamp: true, importBatchId: true, measurements: { select: { value: true } } },
    });
    expect(stored).toHaveLength(3_000);
    expect(stored.every((subgroup) => subgroup.importBatchId === last.result.batchId)).toBe(true);
    // Row 1 and row 3,000 of the file (index 2,999: 18 + 49/100).
    expect([stored[0]?.timestamp.toISOString(), stored[0]?.measurements.map((measurement) => measurement.value)]).toEqual(["2026-06-01T00:00:00.000Z", [18]]);
    expect([stored[2_999]?.timestamp.toISOString(), stored[2_999]?.measurements.map((measurement) => measurement.value)]).toEqual(["2026-06-03T01:59:00.000Z", [18.49]]);
    const batch = await harness.prisma.importBatch.findUniqueOrThrow({ where: { id: last.result.batchId } });
    expect(batch).toMatchObject({ characteristicId: id, fileName: "press 4 june.csv", fileHash, rowsRead: 3_000, subgroupsAdded: 3_000, rowsRejected: 0 });
    const evaluations = await harness.prisma.signalEvaluation.findMany({ where: { characteristicId: id }, select: { trigger: true, reason: true, signalsAfter: true } });
    expect(evaluations).toEqual([{ trigger: "import", reason: `import #${last.result.batchId} of press 4 june.csv: 3000 subgroups added`, signalsAfter: 0 }]);
    expect(await uploadDirectories()).toEqual(directoriesBefore);

    // This import rejected nothing, so it has no rejected-rows file to download.
    const download = await jsonAnswer(await rejectedRowsOf(id, last.result.batchId));
    expect(download).toEqual({
      status: 404,
      json: { error: { code: "not-found", message: `Import ${last.result.batchId} rejected no rows, so it has no rejected-rows file.`, issues: [] } },
    });
  });
});

describe("refused before the file is read, with nothing written", () => {
  const file = readings(3);
  const validOptions = { mapping: MAPPING, fileName: "readings.csv" };
  const optionsMessage = (detail: string) => `The import options is not valid: ${detail}.`;
  type TCase = Omit<TRefusal, "request"> & { readonly target?: number; readonly options?: unknown; readonly withoutOptions?: true; readonly headers?: Record<string, string> };
  const cases: Record<string, (id: number) => TCase> = {
    "options that are not JSON": () => ({
      options: "{mapping:",
      status: 422,
      code: "invalid-input",
      message: 'The query parameter "options" is not valid JSON.',
      issues: [{ path: "options", message: "is not valid JSON" }],
    }),
    "no options": () => ({
      withoutOptions: true,
      status: 422,
      code: "invalid-input",
      message: 'The query parameter "options" (the column mapping and choices, as JSON) is required.',
      issues: [{ path: "options", message: "is required" }],
    }),
    "the site's zone together with a fixed UTC offset": () => ({
      options: { ...validOptions, siteZone: true, utcOffset: "+01:00" },
      status: 422,
      code: "invalid-input",
      message: optionsMessage("siteZone choose either the site's time zone or a fixed UTC offset for times without a zone, not both"),
      issues: [{ path: "siteZone", message: "choose either the site's time zone or a fixed UTC offset for times without a zone, not both" }],
    }),
    "one file column mapped to two roles": () => ({
      options: { ...validOptions, mapping: { timestamp: "timestamp", value: "Timestamp" } },
      status: 422,
      code: "invalid-input",
      message: optionsMessage('mapping.value column "Timestamp" is already mapped to timestamp'),
      issues: [{ path: "mapping.value", message: 'column "Timestamp" is already mapped to timestamp' }],
    }),
    "a UTC offset beyond +14:00": () => ({
      options: { ...validOptions, utcOffset: "+15:00" },
      status: 422,
      code: "invalid-input",
      message: optionsMessage('utcOffset must be "Z" or an offset like +01:00 or -05:00'),
      issues: [{ path: "utcOffset", message: 'must be "Z" or an offset like +01:00 or -05:00' }],
    }),
    "an unknown characteristic": (id) => ({
      target: id + 1_000,
      status: 404,
      code: "not-found",
      message: `Characteristic ${id + 1_000} does not exist`,
      issues: [],
    }),
    "a caller on another machine": () => ({
      headers: { "x-forwarded-for": "192.168.10.20" },
      status: 403,
      code: "forbidden",
      message: "The API answers only callers on this machine until API tokens exist: the caller 192.168.10.20 is not on this machine.",
      issues: [],
    }),
    "a declared length over the 256 MiB limit": () => ({
      headers: { "content-length": String(MAX_IMPORT_BYTES + 1) },
      status: 413,
      code: "payload-too-large",
      message: "The file is larger than the limit of 256 MiB.",
      issues: [],
    }),
    "a page elsewhere calling through a local browser (another host name)": () => ({
      headers: { host: "plant-dashboard.example:3000" },
      status: 403,
      code: "forbidden",
      message: "The API answers only callers on this machine until API tokens exist: the host name plant-dashboard.example:3000 is not this machine.",
      issues: [],
    }),
  };

  /** Sends the case's request with a watched body, checks the refusal and that nothing was written or read. */
  async function expectRefusedUnread(build: (id: number) => TCase): Promise<void> {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const { target = id, options = validOptions, withoutOptions, headers = {}, ...expected } = build(id);
    const { stream, watch } = watchedBody(file);
    const request = importRequest(target, stream, withoutOptions ? undefined : options, headers);
    const before = await tableCounts(harness.prisma);
    await expectRefusedWithoutWriting(harness.prisma, { ...expected, request: async () => jsonAnswer(await upload(target, request)) });
    expect(await tableCounts(harness.prisma)).toEqual(before);
    expect(request.bodyUsed).toBe(false);
    expect(watch.pulled).toBe(false);
  }

  test.each(Object.entries(cases))("%s", (_, build) => expectRefusedUnread(build));

  test("option errors are worded as on every other route: an unknown field named by its own path", () =>
    expectRefusedUnread(() => ({
      options: { ...validOptions, mapping: { ...MAPPING, colour: "shade" } },
      status: 422,
      code: "invalid-input",
      message: "The import options is not valid: mapping.colour is not a known field.",
      issues: [{ path: "mapping.colour", message: "is not a known field" }],
    })),
  );
});

describe("the size limit", () => {
  // The limit (256 MiB) is a constant of src/imports/upload.ts, not a setting, so the check is met the
  // smallest honest way: the body's real first chunk (a valid file's start) and then one chunk that takes
  // the count one byte past the limit. That chunk is a zero-filled buffer the route only measures and never
  // writes (it refuses before passing it on), so its pages are never touched and the test stays small (the
  // process's resident memory did not grow over this test when measured, 2026-12-02).
  test("a body one byte over the limit answers 413 after reading to that byte; the spooled start is removed and nothing is written", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const start = encoder.encode(readings(3));
    const chunks = [start, new Uint8Array(MAX_IMPORT_BYTES + 1 - start.byteLength)];
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        const chunk = chunks.shift();
        if (chunk === undefined) controller.close();
        else controller.enqueue(chunk);
      },
    });
    const directoriesBefore = await uploadDirectories();
    await expectRefusedWithoutWriting(harness.prisma, {
      request: async () => jsonAnswer(await upload(id, importRequest(id, body, { mapping: MAPPING, fileName: "huge.csv" }))),
      status: 413,
      code: "payload-too-large",
      message: "The file is larger than the limit of 256 MiB.",
      issues: [],
    });
    expect(await harness.prisma.importBatch.count({ where: { characteristicId: id } })).toBe(0);
    expect(await uploadDirectories()).toEqual(directoriesBefore);
  });
});

describe("files with bad rows", () => {
  const BAD_FILE = ["timestamp,value", "2026-03-01T06:00:00Z,18.2", "2026-03-01T07:00:00Z,abc", "2026-03-01T08:00:00Z,18.3", ""].join("\n");
  const BAD_ROW_PROBLEM = { line: 3, column: "value", message: '"abc" is not a number' };

  test("all or nothing: the result line says rejected, names the line and column, and nothing is written", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const before = await tableCounts(harness.prisma);
    const response = await upload(id, importRequest(id, BAD_FILE, { mapping: MAPPING, fileName: "readings.csv" }));
    expect(response.status).toBe(200);
    const last = lastAfterProgress(await ndjsonLines(response), BAD_FILE, 3);
    expect(last).toEqual({
      type: "result",
      result: expect.objectContaining({
        status: "rejected",
        mode: "all-or-nothing",
        rowsRead: 3,
        rowsRejected: 1,
        subgroupsAdded: 0,
        addedSequences: null,
        problems: [BAD_ROW_PROBLEM],
        problemCount: 1,
        batchId: null,
        hasRejectedRowsFile: false,
        signalsRaised: null,
      }),
    });
    expect(await tableCounts(harness.prisma)).toEqual(before);
  });

  test("valid rows only: the others are stored, and the rejected rows download as CSV with their line and reason", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const response = await upload(id, importRequest(id, BAD_FILE, { mapping: MAPPING, mode: "valid-only", fileName: "line 4 (June).csv" }));
    const last = lastAfterProgress(await ndjsonLines(response), BAD_FILE, 3);
    expect(last.result).toMatchObject({
      status: "imported",
      mode: "valid-only",
      rowsRead: 3,
      rowsRejected: 1,
      subgroupsAdded: 2,
      addedSequences: [0, 1],
      problems: [BAD_ROW_PROBLEM],
      hasRejectedRowsFile: true,
    });
    const stored = await harness.prisma.subgroup.findMany({ where: { characteristicId: id }, orderBy: { sequence: "asc" }, select: { measurements: { select: { value: true } } } });
    expect(stored.map((subgroup) => subgroup.measurements.map((measurement) => measurement.value))).toEqual([[18.2], [18.3]]);

    const download = await rejectedRowsOf(id, last.result.batchId);
    expect(download.status).toBe(200);
    expect(Object.fromEntries(["content-type", "content-disposition", "cache-control"].map((name) => [name, download.headers.get(name)]))).toEqual({
      "content-type": "text/csv; charset=utf-8",
      // The file name without its extension, every run of other characters than letters, digits, "." and "-" made "_".
      "content-disposition": 'attachment; filename="line_4_June_-rejected.csv"',
      "cache-control": "no-store",
    });
    // The row as written, then its line and the reason, quotes doubled (RFC 4180), CRLF line ends.
    expect(await download.text()).toBe('timestamp,value,line,reason\r\n2026-03-01T07:00:00Z,abc,3,"column ""value"": ""abc"" is not a number"');
  });

  test("the rejected-rows file of an import that does not exist, or of another characteristic, answers 404; a remote caller 403", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    const other = await createTestCharacteristic(harness.prisma, "imr", 1);
    const imported = lastAfterProgress(await ndjsonLines(await upload(id, importRequest(id, BAD_FILE, { mapping: MAPPING, mode: "valid-only", fileName: "readings.csv" }))), BAD_FILE, 3);
    const batchId: number = imported.result.batchId;
    const refusal = (code: string, message: string) => ({ error: { code, message, issues: [] } });
    expect(await jsonAnswer(await rejectedRowsOf(id, batchId + 1_000))).toEqual({ status: 404, json: refusal("not-found", `Characteristic ${id} has no import ${batchId + 1_000}.`) });
    expect(await jsonAnswer(await rejectedRowsOf(other, batchId))).toEqual({ status: 404, json: refusal("not-found", `Characteristic ${other} has no import ${batchId}.`) });
    expect(await jsonAnswer(await rejectedRowsOf(id, batchId, { "x-forwarded-for": "10.0.0.7" }))).toEqual({
      status: 403,
      json: refusal("forbidden", "The API answers only callers on this machine until API tokens exist: the caller 10.0.0.7 is not on this machine."),
    });
  });
});

describe("the write gate", () => {
  test("an import request made while another import's transaction is open waits for its commit, then succeeds after it", async () => {
    const id = await createTestCharacteristic(harness.prisma, "imr", 1);
    // The first import, run directly so the test decides when its file ends: it opens its transaction on
    // the first chunk and holds it until `release`.
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    let started!: () => void;
    const inTransaction = new Promise<void>((resolve) => (started = resolve));
    async function* heldFile(): AsyncGenerator<Uint8Array> {
      yield encoder.encode(readings(10, Date.UTC(2026, 2, 1, 6)));
      started();
      await released;
    }
    const first = importCsv(harness.prisma, harness.sqlite, { characteristicId: id, source: heldFile(), options: { mapping: MAPPING, fileName: "first.csv" }, now: NOW });
    await inTransaction;
    expect(harness.sqlite.inTransaction).toBe(true);

    // The second file's times follow the first's, so it can only be stored after it.
    const secondFile = readings(5, Date.UTC(2026, 2, 1, 12));
    const response = await upload(id, importRequest(id, secondFile, { mapping: MAPPING, fileName: "second.csv" }));
    expect(response.status).toBe(200);
    let answered = false;
    const secondLines = ndjsonLines(response).finally(() => (answered = true));
    // 300 ms: far longer than a 5-row import takes on its own (a few milliseconds), so an answer by then
    // would mean it did not wait.
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(answered).toBe(false);
    expect(await harness.prisma.subgroup.count({ where: { characteristicId: id } })).toBe(0);

    release();
    expect(await first).toMatchObject({ status: "imported", subgroupsAdded: 10, addedSequences: [0, 9] });
    const last = lastAfterProgress(await secondLines, secondFile, 5);
    expect(last.result).toMatchObject({ status: "imported", fileName: "second.csv", subgroupsAdded: 5, addedSequences: [10, 14] });
    expect(await harness.prisma.subgroup.count({ where: { characteristicId: id } })).toBe(15);
  });
});
