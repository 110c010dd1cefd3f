// DATABASE_URL handling: the default, relative paths from the working directory (the repository root),
// and refusals that name the variable.
import path from "node:path";
import { describe, expect, test } from "vitest";
import { DEFAULT_DATABASE_URL, EnvironmentError, parseEnvironment } from "@/src/config/env";

describe("environment", () => {
  test("without DATABASE_URL the database is data/assignable.db under the working directory", () => {
    const settings = parseEnvironment({});
    expect(DEFAULT_DATABASE_URL).toBe("file:./data/assignable.db");
    expect(settings.databaseFile).toBe(path.join(process.cwd(), "data", "assignable.db"));
    expect(settings.databaseUrl).toBe(`file:${settings.databaseFile}`);
  });

  test("an empty DATABASE_URL counts as unset; absolute paths are kept", () => {
    expect(parseEnvironment({ DATABASE_URL: "" }).databaseFile).toBe(path.join(process.cwd(), "data", "assignable.db"));
    expect(parseEnvironment({ DATABASE_URL: "file:/srv/plant.db" }).databaseFile).toBe("/srv/plant.db");
  });

  test.each([
    ["postgres://localhost/assignable", /DATABASE_URL must be a SQLite file URL/],
    ["file:", /DATABASE_URL names no file/],
    ["file:./data/a.db?mode=ro", /DATABASE_URL must not carry query parameters/],
    ["file::memory:", /DATABASE_URL must name a file/],
  ])("DATABASE_URL=%s is refused", (url, message) => {
    expect(() => parseEnvironment({ DATABASE_URL: url })).toThrow(EnvironmentError);
    expect(() => parseEnvironment({ DATABASE_URL: url })).toThrow(message);
  });
});
