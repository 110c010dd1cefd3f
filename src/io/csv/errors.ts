/**
 * Errors found while reading a CSV file. A file is rejected as a whole: every problem found is
 * collected (not only the first) so a person can fix the file in one pass.
 */

/** One problem in the file. `line` counts physical lines from 1; the header is line 1. */
export interface CsvProblem {
  readonly line: number;
  /** The column the problem is in, when it concerns one cell. */
  readonly column?: string;
  readonly message: string;
}

/** How many problems the message lists; the total is always given. */
export const MAX_PROBLEMS_SHOWN = 20;

/** Thrown when a CSV file cannot become chart data. `problems` holds every problem found, in file order. */
export class CsvInputError extends Error {
  readonly problems: readonly CsvProblem[];
  constructor(problems: readonly CsvProblem[]) {
    const inFileOrder = [...problems].sort((first, second) => first.line - second.line);
    super(formatProblems(inFileOrder));
    this.name = "CsvInputError";
    this.problems = inFileOrder;
  }
}

/** "1 value", "3 values" */
export function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? "" : "s"}`;
}

/** "line 7, column "value": "abc" is not a number" */
export function formatProblem(problem: CsvProblem): string {
  const where = problem.column === undefined ? `line ${problem.line}` : `line ${problem.line}, column "${problem.column}"`;
  return `${where}: ${problem.message}`;
}

function formatProblems(problems: readonly CsvProblem[]): string {
  const shown = problems.slice(0, MAX_PROBLEMS_SHOWN).map((problem) => `  ${formatProblem(problem)}`);
  const count = plural(problems.length, "problem");
  const more = problems.length > MAX_PROBLEMS_SHOWN ? [`  ... and ${problems.length - MAX_PROBLEMS_SHOWN} more`] : [];
  return [`The CSV file has ${count}:`, ...shown, ...more].join("\n");
}
