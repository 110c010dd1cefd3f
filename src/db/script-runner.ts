/**
 * Runs the body of a database script and turns the failures a person can fix (bad settings, an unusable
 * database file, a migration the engine refuses) into a one-paragraph message on stderr and exit code 1.
 * Anything else is a bug and keeps its stack trace.
 */
import { ZodError } from "zod";
import { EnvironmentError } from "@/src/config/env";
import { DatabaseFileError } from "@/src/db/database-file";
import { SchemaEngineError } from "@/src/db/migrations/engine";

function explain(error: unknown): string | undefined {
  if (error instanceof EnvironmentError || error instanceof DatabaseFileError) return error.message;
  if (error instanceof SchemaEngineError) return `The schema engine refused: ${error.message}`;
  if (error instanceof ZodError) return `Invalid input: ${error.issues.map((issue) => issue.message).join("; ")}.`;
  return undefined;
}

export async function runScript(body: () => Promise<void>): Promise<void> {
  try {
    await body();
  } catch (error) {
    const message = explain(error);
    if (message === undefined) throw error;
    console.error(message);
    process.exitCode = 1;
  }
}
