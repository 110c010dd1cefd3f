/**
 * The real entry (`src/cli/main.ts`, as `npm run -s cli` starts it) in a child process: exit codes and
 * the absence of stack traces for a representative subset; the rest is covered in process (run.test.ts).
 */
import { execFile } from "node:child_process";
import { mkdtemp, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, test } from "vitest";
import { FIXTURES } from "./run-in-process";

function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, ["--import", "tsx", "src/cli/main.ts", ...args], (error, stdout, stderr) => {
      resolve({ code: error === null ? 0 : Number(error.code), stdout, stderr });
    });
  });
}

async function csvFile(content: string | Buffer): Promise<string> {
  const directory = await mkdtemp(path.join(tmpdir(), "analyze-"));
  const file = path.join(directory, "input.csv");
  await writeFile(file, content);
  return file;
}

describe("the command line as a process", () => {
  test("a published example exits 0 with the table", async () => {
    const run = await cli(["analyze", `${FIXTURES}/piston-rings.csv`, "--chart", "xbar-r"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("X-bar and R chart: 25 subgroups of 5");
  });

  test("a CSV with several bad rows exits 2, naming every row and column", async () => {
    const file = await csvFile("defectives,size\n3,50\n51,50\nx,50\n");
    const run = await cli(["analyze", file, "--chart", "p"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(
      'error: The CSV file has 2 problems:\n  line 3, column "defectives": 51 defectives is more than the sample size 50\n  line 4, column "defectives": "x" is not a number\n',
    );
  });

  test("a file that is not UTF-8 exits 2", async () => {
    const file = await csvFile(Buffer.concat([Buffer.from("value\n"), Buffer.from([0xff, 0xfe, 0x0a])]));
    const run = await cli(["analyze", file, "--chart", "imr"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain("it is not UTF-8 text");
  });

  test("an unknown option exits 2 without a stack", async () => {
    const run = await cli(["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--verbose"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe("error: Unknown option '--verbose'. Run with --help for usage.\n");
  });

  test("ragged subgroups exit 2 naming the subgroup's line", async () => {
    const file = await csvFile("subgroup;value\n1;1,5\n1;2,5\n2;3,5\n");
    const run = await cli(["analyze", file, "--chart", "xbar-s"]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('line 4, column "subgroup": subgroup "2" has 1 value');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  });
});
