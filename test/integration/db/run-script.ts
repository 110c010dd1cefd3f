/** Runs one of the repository's database scripts as a separate process, as npm would. */
import { execFile } from "node:child_process";

export type TScriptOutcome = { exitCode: number; stdout: string; stderr: string };

export function runDatabaseScript(script: string, databaseUrl: string, args: string[] = []): Promise<TScriptOutcome> {
  return new Promise((resolve) => {
    execFile(
      process.execPath,
      ["--import", "tsx", script, ...args],
      { cwd: process.cwd(), env: { ...process.env, DATABASE_URL: databaseUrl }, timeout: 110_000 },
      (error, stdout, stderr) => {
        const exitCode = error === null ? 0 : typeof error.code === "number" ? error.code : -1;
        resolve({ exitCode, stdout, stderr });
      },
    );
  });
}
