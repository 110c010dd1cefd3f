/**
 * The command-line runner: picks the command, parses its options, and turns every failure into a clear
 * message and an exit code, never a stack trace for a user's mistake.
 *
 * Exit codes: 0 success; 2 bad usage or bad input (unknown command or option, invalid option value, CSV
 * problems, data the engine cannot compute on); 1 an unexpected failure (a bug), printed as one line,
 * with the stack only when the environment variable ASSIGNABLE_DEBUG=1 is set.
 */
import { parseArgs } from "node:util";
import { ZodError } from "zod";
import { CsvInputError, InputFileError } from "../io/csv";
import { SpcInputError } from "../spc/types";
import { UsageError, type CliOutput, type Command } from "./command";
import { COMMANDS } from "./commands";

export const EXIT_OK = 0;
export const EXIT_UNEXPECTED = 1;
export const EXIT_BAD_INPUT = 2;

const PROGRAM = "npm run -s cli --";

export interface RunOptions {
  /** Print stacks of unexpected errors (ASSIGNABLE_DEBUG=1). */
  readonly debug?: boolean;
  /** The commands to offer; the registered table unless a test passes its own. */
  readonly commands?: readonly Command[];
}

export async function runCli(argv: readonly string[], output: CliOutput, options: RunOptions = {}): Promise<number> {
  const commands = options.commands ?? COMMANDS;
  try {
    return await dispatch(argv, output, commands);
  } catch (error) {
    return report(error, output, options.debug ?? false);
  }
}

async function dispatch(argv: readonly string[], output: CliOutput, commands: readonly Command[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined) {
    output.stderr(programHelp(commands));
    return EXIT_BAD_INPUT;
  }
  if (name === "--help" || name === "-h" || name === "help") {
    output.stdout(programHelp(commands));
    return EXIT_OK;
  }
  const command = commands.find((candidate) => candidate.name === name);
  if (command === undefined) {
    const known = commands.map((candidate) => candidate.name).join(", ");
    throw new UsageError(`unknown command "${name}" (commands: ${known}). Run with --help for usage.`);
  }
  const parsed = parseArgs({
    args: [...rest],
    options: { ...command.options, help: { type: "boolean", short: "h" } },
    allowPositionals: true,
    strict: true,
  });
  if (parsed.values.help === true) {
    output.stdout(command.help);
    return EXIT_OK;
  }
  return command.run({ values: parsed.values, positionals: parsed.positionals }, output);
}

function programHelp(commands: readonly Command[]): string {
  const width = Math.max(...commands.map((command) => command.name.length));
  const lines = commands.map((command) => `  ${command.name.padEnd(width)}  ${command.summary}`);
  return [
    `Usage: ${PROGRAM} <command> [options]`,
    "",
    "Commands:",
    ...lines,
    "",
    `Run ${PROGRAM} <command> --help for a command's options.`,
    "Exit codes: 0 success, 2 bad usage or input, 1 unexpected error (ASSIGNABLE_DEBUG=1 prints its stack).",
    "",
  ].join("\n");
}

/** node:util parseArgs reports usage mistakes as TypeErrors carrying these codes. */
const PARSE_ARGS_CODES = new Set([
  "ERR_PARSE_ARGS_UNKNOWN_OPTION",
  "ERR_PARSE_ARGS_INVALID_OPTION_VALUE",
  "ERR_PARSE_ARGS_UNEXPECTED_POSITIONAL",
]);

function report(error: unknown, output: CliOutput, debug: boolean): number {
  const message = expectedErrorMessage(error);
  if (message !== undefined) {
    output.stderr(`error: ${message}\n`);
    return EXIT_BAD_INPUT;
  }
  const text = error instanceof Error ? error.message : String(error);
  output.stderr(`unexpected error: ${text}\n`);
  if (debug && error instanceof Error && error.stack !== undefined) output.stderr(`${error.stack}\n`);
  else output.stderr("Set ASSIGNABLE_DEBUG=1 to print the stack trace.\n");
  return EXIT_UNEXPECTED;
}

/** The message for an error caused by the user's input, or undefined for anything else. */
function expectedErrorMessage(error: unknown): string | undefined {
  if (error instanceof UsageError || error instanceof CsvInputError || error instanceof InputFileError) return error.message;
  if (error instanceof SpcInputError) return `the data cannot be charted: ${error.message}`;
  if (error instanceof ZodError) {
    // The option is the first path element; deeper elements (a list item's position) add nothing.
    return error.issues.map((issue) => `${issue.path.length > 0 ? `--${String(issue.path[0])}: ` : ""}${issue.message}`).join("\n");
  }
  const code = (error as { code?: unknown } | null)?.code;
  if (error instanceof TypeError && typeof code === "string" && PARSE_ARGS_CODES.has(code)) {
    // Node adds advice about positionals starting with "-" after the first sentence; it does not apply here.
    return `${error.message.split(". ")[0]}. Run with --help for usage.`;
  }
  return undefined;
}
