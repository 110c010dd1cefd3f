// The API's error answer for application errors: the status of each code, and the Retry-After header a
// "busy" refusal carries (RFC 9110, section 10.2.3: the seconds a client should wait before a new request).
import { describe, expect, test } from "vitest";
import { BUSY_RETRY_AFTER_SECONDS, problemAnswer } from "@/src/api/problem";
import { AppError } from "@/src/errors";

describe("error answers", () => {
  test("a busy database answers 503 with Retry-After and the error body", async () => {
    const response = problemAnswer(new AppError("busy", "The database is busy"));
    expect(response.status).toBe(503);
    expect(response.headers.get("Retry-After")).toBe(String(BUSY_RETRY_AFTER_SECONDS));
    expect(await response.json()).toEqual({ error: { code: "busy", message: "The database is busy", issues: [] } });
  });

  test("other application errors carry no Retry-After", () => {
    const response = problemAnswer(new AppError("conflict", "Already used", [{ path: "name", message: "is already used" }]));
    expect(response.status).toBe(409);
    expect(response.headers.get("Retry-After")).toBeNull();
  });
});
