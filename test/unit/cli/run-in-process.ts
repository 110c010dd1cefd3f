/** Runs the command line in this process with captured output (the child-process tests cover the entry). */
import { runCli, type RunOptions } from "@/src/cli/run";

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export async function runInProcess(argv: readonly string[], options: RunOptions = {}): Promise<CliRun> {
  let stdout = "";
  let stderr = "";
  const code = await runCli(argv, { stdout: (text) => (stdout += text), stderr: (text) => (stderr += text) }, options);
  return { code, stdout, stderr };
}

export const FIXTURES = "test/fixtures/analyze";
