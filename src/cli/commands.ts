/**
 * The commands of `npm run -s cli -- <command>`. To add one, write `src/cli/<name>.ts` exporting a
 * `Command` (see ./command.ts) and list it here: the runner gives it option parsing, `--help` and the
 * error-to-exit-code mapping.
 */
import { analyzeCommand } from "./analyze";
import type { Command } from "./command";
import { verifyCommand } from "./verify";

export const COMMANDS: readonly Command[] = [analyzeCommand, verifyCommand];
