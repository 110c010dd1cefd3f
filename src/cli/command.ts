/**
 * What a command of the `assignable` command line is. Commands register in ./commands.ts; the runner
 * (./run.ts) parses their options with node:util parseArgs (strict), answers `--help`, and maps errors
 * to exit codes, so a command only validates its option values and does its work.
 */
import type { ParseArgsConfig } from "node:util";

/** Where a command writes. Injected so tests can capture output without a child process. */
export interface CliOutput {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
}

export type CommandOptions = NonNullable<ParseArgsConfig["options"]>;

export interface ParsedArguments {
  readonly values: Readonly<Record<string, string | boolean | undefined>>;
  readonly positionals: readonly string[];
}

export interface Command {
  /** The word typed after the program name. */
  readonly name: string;
  /** One line shown in the program's help. */
  readonly summary: string;
  /** The full help text shown by `<command> --help`. */
  readonly help: string;
  /** Options as node:util parseArgs declares them (all long names; `--help` is added by the runner). */
  readonly options: CommandOptions;
  /** Does the work; returns the exit code. Throws for bad input (see ./run.ts for the mapping). */
  readonly run: (parsed: ParsedArguments, output: CliOutput) => Promise<number>;
}

/** A mistake in how the command was called (missing file argument, bad option value): exit code 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}
