/**
 * Entry of the command line: `npm run -s cli -- <command> [options]`. Reads the process's arguments and
 * environment once, runs, and sets the exit code (see ./run.ts for the codes).
 */
import { runCli } from "./run";

const exitCode = await runCli(
  process.argv.slice(2),
  { stdout: (text) => process.stdout.write(text), stderr: (text) => process.stderr.write(text) },
  { debug: process.env.ASSIGNABLE_DEBUG === "1" },
);
process.exitCode = exitCode;
