/**
 * The one module that reads environment variables. Everything else imports the parsed values from here, so
 * the accepted settings, their defaults and their validation live in one place.
 *
 * Relative paths are resolved against the working directory, which is the repository root for every way
 * the project is run (`npm run ...`, `next dev|start`, vitest).
 */
import path from "node:path";
import { z } from "zod";

/** The SQLite file used when DATABASE_URL is not set (the `data/` directory is git-ignored). */
export const DEFAULT_DATABASE_URL = "file:./data/assignable.db";

/** Raised when an environment variable has a value we cannot use; the message names the variable. */
export class EnvironmentError extends Error {
  override name = "EnvironmentError";
}

const ZDatabaseUrl = z
  .string()
  .trim()
  .startsWith("file:", { abort: true, error: 'must be a SQLite file URL starting with "file:", e.g. file:./data/assignable.db' })
  .refine((url) => url.slice("file:".length).length > 0, { error: "names no file after file:" })
  .refine((url) => !url.includes("?"), { error: "must not carry query parameters (the driver ignores them)" })
  .refine((url) => url !== "file::memory:", { error: "must name a file: an in-memory database would lose every write" });

const ZEnvironment = z.object({
  DATABASE_URL: ZDatabaseUrl.default(DEFAULT_DATABASE_URL),
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
});

export type TEnvironment = {
  /** Absolute path of the SQLite database file. */
  databaseFile: string;
  /** `file:` URL with the absolute path, as the Prisma driver adapter and prisma.config.ts expect it. */
  databaseUrl: string;
  nodeEnv: "development" | "production" | "test";
};

/** Turns a `file:` URL into an absolute file path, relative paths taken from the working directory. */
export function databaseFileFromUrl(url: string): string {
  const parsed = ZDatabaseUrl.safeParse(url);
  if (!parsed.success) {
    throw new EnvironmentError(
      `DATABASE_URL "${url}" ${parsed.error.issues.map((issue) => issue.message).join("; ")}. Correct it, or unset it to use the default (${DEFAULT_DATABASE_URL}).`,
    );
  }
  // The path is only known at run time: tell Turbopack not to trace the project folder into the build output.
  return path.resolve(/*turbopackIgnore: true*/ process.cwd(), parsed.data.slice("file:".length));
}

/** Parses an environment (process.env by default); throws EnvironmentError naming the bad variable. */
export function parseEnvironment(source: Readonly<Record<string, string | undefined>> = process.env): TEnvironment {
  // An empty variable counts as unset, as shells and .env files often leave them.
  const present = Object.fromEntries(Object.entries(source).filter(([, value]) => value !== undefined && value !== ""));
  const parsed = ZEnvironment.safeParse(present);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join(".")} ${issue.message}`);
    throw new EnvironmentError(
      `Invalid environment: ${problems.join("; ")}. Correct the variable, or unset it to use the default (DATABASE_URL=${DEFAULT_DATABASE_URL}).`,
    );
  }
  const databaseFile = databaseFileFromUrl(parsed.data.DATABASE_URL);
  return { databaseFile, databaseUrl: `file:${databaseFile}`, nodeEnv: parsed.data.NODE_ENV };
}

let cached: TEnvironment | undefined;

/** The process environment, parsed once on first use. */
export function environment(): TEnvironment {
  cached ??= parseEnvironment();
  return cached;
}
