/** The runner: help, unknown commands and options, option validation, and the error-to-exit-code mapping. */
import { describe, expect, test } from "vitest";
import type { Command } from "@/src/cli/command";
import { FIXTURES, runInProcess } from "./run-in-process";

describe("help", () => {
  test("--help lists the commands and exits 0", async () => {
    const run = await runInProcess(["--help"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("analyze");
    expect(run.stdout).toContain("Exit codes");
  });

  test("no command prints the help to stderr and exits 2", async () => {
    const run = await runInProcess([]);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain("Usage:");
  });

  test("analyze --help and -h show the command's options", async () => {
    for (const flag of ["--help", "-h"]) {
      const run = await runInProcess(["analyze", flag]);
      expect(run.code).toBe(0);
      expect(run.stdout).toContain("--subgroup-size N");
    }
  });
});

// [description, arguments, expected message fragment]; every one exits 2 with "error: ..." and no stack.
const usageMistakes: [string, string[], string][] = [
  ["unknown command", ["analyse"], 'unknown command "analyse" (commands: analyze'],
  ["unknown option", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--colour"], "error: Unknown option '--colour'. Run with --help for usage.\n"],
  ["option without its value", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart"], "Option '--chart <value>' argument missing"],
  ["no file", ["analyze", "--chart", "imr"], "analyze needs a CSV file"],
  ["two files", ["analyze", "a.csv", "b.csv", "--chart", "imr"], 'unexpected argument "b.csv"'],
  ["missing --chart", ["analyze", `${FIXTURES}/flow-rate.csv`], "--chart: is required"],
  ["unknown chart", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "xbar"], "--chart: must be one of imr, xbar-r"],
  ["non-numeric limit", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--usl", "high"], "--usl: must be a number"],
  ["crossed limits", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--lsl", "5", "--usl", "4"], "--usl: must be greater than --lsl"],
  ["ewma option on another chart", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--lambda", "0.2"], "--lambda: applies to the ewma chart only"],
  ["lambda above 1", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "ewma", "--lambda", "1.5"], "--lambda: Too big"],
  ["bad exclude list", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--exclude", "2;3"], "--exclude: must be a comma-separated list"],
  ["subgroup size out of range", ["analyze", `${FIXTURES}/piston-rings.csv`, "--chart", "xbar-r", "--subgroup-size", "30"], "--subgroup-size: Too big"],
  ["unknown format", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--format", "xml"], "--format: must be text or json"],
  ["unknown rule", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--rules", "nelson-9"], 'unknown rule "nelson-9"'],
  ["capability on a count chart", ["analyze", `${FIXTURES}/wafer-defects.csv`, "--chart", "c", "--usl", "30"], "--usl: capability applies to charts of measured values"],
  ["baseline larger than the data", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--baseline", "11"], "the data cannot be charted: the baseline of 11 subgroups is longer than the data (10 subgroups)"],
  ["exclusion outside the baseline", ["analyze", `${FIXTURES}/flow-rate.csv`, "--chart", "imr", "--baseline", "5", "--exclude", "7"], "excluded subgroup 7 is outside the baseline (subgroups 0–4)"],
  ["missing file", ["analyze", `${FIXTURES}/no-such-file.csv`, "--chart", "imr"], "no-such-file.csv: no such file"],
  ["file of the wrong layout", ["analyze", `${FIXTURES}/wafer-defects.csv`, "--chart", "imr"], 'line 1, column "value": missing column'],
];

describe("usage and input mistakes exit 2 with one clear message", () => {
  test.each(usageMistakes)("%s", async (_description, argv, fragment) => {
    const run = await runInProcess(argv);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe("");
    expect(run.stderr.startsWith("error: ")).toBe(true);
    expect(run.stderr).toContain(fragment);
    expect(run.stderr).not.toMatch(/\n\s+at /);
  });
});

describe("unexpected errors", () => {
  const failing: Command = {
    name: "fail",
    summary: "always fails",
    help: "fail",
    options: {},
    run: () => Promise.reject(new Error("disk on fire")),
  };

  test("exit 1 with one line and a hint, no stack", async () => {
    const run = await runInProcess(["fail"], { commands: [failing] });
    expect(run.code).toBe(1);
    expect(run.stderr).toBe("unexpected error: disk on fire\nSet ASSIGNABLE_DEBUG=1 to print the stack trace.\n");
  });

  test("ASSIGNABLE_DEBUG prints the stack", async () => {
    const run = await runInProcess(["fail"], { commands: [failing], debug: true });
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/unexpected error: disk on fire\nError: disk on fire\n\s+at /);
  });
});
