// Malformed requests against a real SQLite file: each answers with the expected status, error code,
// field paths and messages, and writes nothing (row counts of every intake table before and after).
import path from "node:path";
import { beforeAll, describe, expect, test, vi } from "vitest";
import { GET as getCharacteristic } from "@/app/api/v1/characteristics/[id]/route";
import { POST as postSubgroups } from "@/app/api/v1/characteristics/[id]/subgroups/route";
import { GET as listSignals } from "@/app/api/v1/characteristics/[id]/signals/route";
import { GET as listEvents, POST as postEvent } from "@/app/api/v1/processes/[id]/events/route";
import { MAX_BODY_BYTES } from "@/src/api/body";
import { setApiDatabaseForTests } from "@/src/api/database";
import { createPrismaClient } from "@/src/db/connect";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";
import { call } from "./client";
import { minutesIn, registerApiFixture, wallSubgroup, type TApiFixture } from "./fixture";
import { expectRefusedWithoutWriting, invalidField, type TRefusal } from "./refusal";

const openFixture = registerApiFixture("api-malformed");
let fixture: TApiFixture;

beforeAll(async () => {
  fixture = await openFixture();
  // A stored subgroup, so that "timestamps go backwards" has something to go back from.
  const answer = await call(postSubgroups, {
    path: `/api/v1/characteristics/${fixture.wallId}/subgroups`,
    params: { id: String(fixture.wallId) },
    body: { subgroups: [wallSubgroup(0, minutesIn(60))] },
  });
  expect(answer.status).toBe(201);
});

const good = wallSubgroup(1, minutesIn(90));
const wall = (body: unknown, headers?: Record<string, string>) => () =>
  call(postSubgroups, { path: `/api/v1/characteristics/${fixture.wallId}/subgroups`, params: { id: String(fixture.wallId) }, body, ...(headers ? { headers } : {}) });
const shortShots = (subgroup: Record<string, unknown>) => () =>
  call(postSubgroups, {
    path: `/api/v1/characteristics/${fixture.shortShotsId}/subgroups`,
    params: { id: String(fixture.shortShotsId) },
    body: { subgroups: [{ timestamp: minutesIn(0), ...subgroup }] },
  });
const event = (body: Record<string, unknown>, processId?: string) => () => {
  const id = processId ?? String(fixture.processId);
  return call(postEvent, { path: `/api/v1/processes/${id}/events`, params: { id }, body });
};
const validEvent = { occurredAt: minutesIn(0), kind: "maintenance", description: "Nozzle cleaned" };

const cases: Record<string, TRefusal> = {
  "a body that is not JSON": {
    request: wall('{"subgroups": [{"timestamp": '),
    status: 400,
    code: "invalid-json",
    message: expect.stringMatching(/^The request body is not valid JSON: /) as string,
    issues: [],
  },
  "a body sent as text/plain": {
    request: wall(JSON.stringify({ subgroups: [good] }), { "content-type": "text/plain" }),
    status: 415,
    code: "unsupported-media-type",
    message: 'The request body must be JSON sent with "Content-Type: application/json"; it came as "text/plain".',
    issues: [],
  },
  "a body over the size limit": {
    request: wall(JSON.stringify({ subgroups: [{ ...good, tags: { note: "x" } }], padding: " ".repeat(MAX_BODY_BYTES) })),
    status: 413,
    code: "payload-too-large",
    message: `The request body is larger than the limit of ${MAX_BODY_BYTES} bytes (2 MiB).`,
    issues: [],
  },
  "an unknown field in a subgroup": invalidField(wall({ subgroups: [{ ...good, colour: "red" }] }), "request body", "subgroups.0.colour", "is not a known field"),
  "an unknown field beside the subgroups": invalidField(wall({ subgroups: [good], batch: 7 }), "request body", "batch", "is not a known field"),
  "a variables subgroup without values": {
    request: wall({ subgroups: [{ timestamp: minutesIn(90) }] }),
    status: 422,
    code: "invalid-input",
    message: "1 of 1 subgroups are not valid; nothing was stored",
    issues: [{ path: "subgroups.0.values", message: "is required on a xbar-r chart" }],
  },
  "a subgroup of the wrong size": {
    request: wall({ subgroups: [good, { ...good, values: [2.01, 2.0, 1.99] }] }),
    status: 422,
    code: "invalid-input",
    message: "1 of 2 subgroups are not valid; nothing was stored",
    issues: [{ path: "subgroups.1.values", message: "must hold exactly 5 values (the subgroup size of this characteristic)" }],
  },
  "a value given as text": invalidField(wall({ subgroups: [good, good, good, { ...good, values: [2, 2, "2.01", 2, 2] }] }), "request body", "subgroups.3.values.2", "must be a number"),
  "a value beyond the range of a double (1e400 parses as Infinity)": invalidField(wall('{"subgroups":[{"timestamp":"2026-03-01T07:30:00Z","values":[2,2,1e400,2,2]}]}'), "request body", "subgroups.0.values.2", "must be a number"),
  "a count above the number inspected": {
    request: shortShots({ count: 201, size: 200 }),
    status: 422,
    code: "invalid-input",
    message: "1 of 1 subgroups are not valid; nothing was stored",
    issues: [{ path: "subgroups.0.count", message: "must not exceed the number inspected (size)" }],
  },
  "a negative count": invalidField(shortShots({ count: -1, size: 200 }), "request body", "subgroups.0.count", "must not be negative"),
  "a timestamp without a zone": invalidField(wall({ subgroups: [{ ...good, timestamp: "2026-03-01T07:30:00" }] }), "request body", "subgroups.0.timestamp", "must be an ISO 8601 date-time with a zone, e.g. 2026-03-01T06:00:00Z"),
  "a timestamp before the last stored subgroup": {
    request: wall({ subgroups: [{ ...good, timestamp: "2026-03-01T06:30:00Z" }] }),
    status: 422,
    code: "invalid-input",
    message: "Timestamps go backwards; nothing was stored",
    issues: [
      {
        path: "subgroups.0.timestamp",
        message: "2026-03-01T06:30:00Z is earlier than the last stored subgroup (sequence 0) at 2026-03-01T07:00:00.000Z; subgroups must arrive in time order",
      },
    ],
  },
  "more subgroups than one request takes": invalidField(wall({ subgroups: Array.from({ length: 1001 }, (_, index) => wallSubgroup(index, minutesIn(90 + index))) }), "request body", "subgroups", "Too big: expected array to have <=1000 items"),
  "no subgroups at all": invalidField(wall({ subgroups: [] }), "request body", "subgroups", "must hold at least one subgroup"),
  "an empty key": invalidField(wall({ subgroups: [{ ...good, key: "" }] }), "request body", "subgroups.0.key", "must not be empty"),
  "a key longer than 100 characters": invalidField(wall({ subgroups: [good, { ...good, key: "r".repeat(101) }] }), "request body", "subgroups.1.key", "must be at most 100 characters"),
  "a key given as a number": invalidField(wall({ subgroups: [{ ...good, key: 127 }] }), "request body", "subgroups.0.key", "must be text"),
  "a key ending in a space": invalidField(wall({ subgroups: [{ ...good, key: "press4-0127 " }] }), "request body", "subgroups.0.key", "must not begin or end with a space"),
  "the same key on two subgroups of one post": invalidField(wall({ subgroups: [{ ...good, key: "press4-0127" }, { ...good, key: "press4-0128" }, { ...good, key: "press4-0127" }] }), "request body", "subgroups.2.key", "repeats the key of subgroup 0"),
  "a non-numeric characteristic id": invalidField(() => call(postSubgroups, { path: "/api/v1/characteristics/wall/subgroups", params: { id: "wall" }, body: { subgroups: [good] } }), "path", "id", "must be a positive whole number"),
  "an unknown characteristic": {
    request: () => call(postSubgroups, { path: "/api/v1/characteristics/999/subgroups", params: { id: "999" }, body: { subgroups: [good] } }),
    status: 404,
    code: "not-found",
    message: "Characteristic 999 does not exist",
    issues: [],
  },
  "an event for an unknown process": {
    request: event(validEvent, "999"),
    status: 404,
    code: "not-found",
    message: "Process 999 does not exist",
    issues: [],
  },
  "an event of an unknown kind": {
    request: event({ ...validEvent, kind: "coffee-break" }),
    status: 422,
    code: "invalid-input",
    message: expect.stringMatching(/^The request body is not valid: kind Invalid option: expected one of "lot-change"\|"maintenance"/) as string,
    issues: [
      {
        path: "kind",
        message: 'Invalid option: expected one of "lot-change"|"maintenance"|"setting-change"|"operator-change"|"shift-change"|"calibration"|"environment"',
      },
    ],
  },
  "an event reading with a unit but no value": invalidField(event({ ...validEvent, kind: "environment", unit: "°C" }), "request body", "value", "is required when a unit is given"),
  "a caller on another machine": {
    request: wall({ subgroups: [good] }, { "x-forwarded-for": "192.168.10.20" }),
    status: 403,
    code: "forbidden",
    message: "The API answers only callers on this machine until API tokens exist: the caller 192.168.10.20 is not on this machine.",
    issues: [],
  },
  "a signal range that ends before it starts": invalidField(() => call(listSignals, { path: `/api/v1/characteristics/${fixture.wallId}/signals?from=5&to=2`, params: { id: String(fixture.wallId) } }), "query", "to", "must not be before from"),
  "a signal range given as text": invalidField(() => call(listSignals, { path: `/api/v1/characteristics/${fixture.wallId}/signals?from=first`, params: { id: String(fixture.wallId) } }), "query", "from", "must be a whole number (a subgroup sequence)"),
  "a query parameter given twice": {
    request: () => call(listSignals, { path: `/api/v1/characteristics/${fixture.wallId}/signals?from=1&from=2`, params: { id: String(fixture.wallId) } }),
    status: 422,
    code: "invalid-input",
    message: 'The query parameter "from" is given more than once.',
    issues: [{ path: "from", message: "is given more than once" }],
  },
  "an events range without a zone": invalidField(() => call(listEvents, { path: `/api/v1/processes/${fixture.processId}/events?from=2026-03-01`, params: { id: String(fixture.processId) } }), "query", "from", "must be an ISO 8601 date-time with a zone, e.g. 2026-03-01T06:00:00Z"),
  "an id beyond the database's range": invalidField(() => call(getCharacteristic, { path: "/api/v1/characteristics/99999999999", params: { id: "99999999999" } }), "path", "id", "must be at most 2147483647"),
};

describe("malformed requests are refused with a reason and write nothing", () => {
  test.each(Object.entries(cases))("%s", async (_label, expected) => {
    await expectRefusedWithoutWriting(fixture.db, expected);
  });

  test(`there are at least 25 cases (${Object.keys(cases).length})`, () => {
    expect(Object.keys(cases).length).toBeGreaterThanOrEqual(25);
  });
});

describe("a failure the API did not expect", () => {
  const temporaryDirectory = registerTemporaryDirectories();

  test("answers 500 with a short message and no stack, and logs the details on the server", async () => {
    // A database file without the tables: every query fails inside Prisma.
    const broken = createPrismaClient(`file:${path.join(temporaryDirectory("api-broken"), "empty.db")}`);
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    setApiDatabaseForTests(broken);
    try {
      const answer = await call(getCharacteristic, { path: "/api/v1/characteristics/1", params: { id: "1" } });
      expect(answer.status).toBe(500);
      expect(answer.json).toEqual({
        error: { code: "internal", message: "The server failed to handle this request; the details are in the server log.", issues: [] },
      });
      expect(log).toHaveBeenCalledTimes(1);
    } finally {
      setApiDatabaseForTests(fixture.db);
      log.mockRestore();
      await broken.$disconnect();
    }
  });
});
