import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, test } from "vitest";
import { createRng } from "@/src/spc/random";
import { runInProcess } from "./run-in-process";

// Invented data: 40 subgroups of 5 at 10, 20 shifted to 12, then the adjustment at 60.
function writeStory(directory: string, name: string, afterLevel: number, after: number, seed: number): string {
  const rng = createRng(seed);
  const rows = ["subgroup,value"];
  const levels = [...Array<number>(40).fill(10), ...Array<number>(20).fill(12), ...Array<number>(after).fill(afterLevel)];
  levels.forEach((level, subgroup) => {
    for (let position = 0; position < 5; position++) rows.push(`${subgroup},${(level + rng.normal()).toFixed(3)}`);
  });
  const file = join(directory, name);
  writeFileSync(file, `${rows.join("\n")}\n`);
  return file;
}

let fixed = "";
let notFixed = "";
let short = "";
beforeAll(() => {
  const directory = mkdtempSync(join(tmpdir(), "verify-"));
  fixed = writeStory(directory, "fixed.csv", 10, 15, 1);
  notFixed = writeStory(directory, "not-fixed.csv", 12, 15, 13);
  short = writeStory(directory, "short.csv", 10, 4, 5);
});

describe("verify command", () => {
  test("a fix that worked: JSON verdict passed with the contract's fields", async () => {
    const run = await runInProcess(["verify", fixed, "--chart", "xbar-r", "--adjusted-at", "60", "--rules", "we", "--format", "json"]);
    expect(run.code).toBe(0);
    const report = JSON.parse(run.stdout);
    expect(report.verdict).toBe("passed");
    expect(report.reasons).toEqual([]);
    expect(report.subgroupsAfter).toBe(15);
    expect(report.subgroupsNeeded).toBe(10);
    expect(report.signals).toEqual([]);
    expect(report.tests.meanEquivalence.equivalent).toBe(true);
    expect(report.capability).toBeNull();
  });

  test("a fix that did not work: failed with reasons", async () => {
    const run = await runInProcess(["verify", notFixed, "--chart", "xbar-r", "--adjusted-at", "60", "--rules", "we", "--format", "json"]);
    const report = JSON.parse(run.stdout);
    expect(report.verdict).toBe("failed");
    expect(report.reasons.length).toBeGreaterThan(0);
    expect(report.signals.length).toBeGreaterThan(0);
  });

  test("too short: insufficient data, and the text says how many more are needed", async () => {
    const run = await runInProcess(["verify", short, "--chart", "xbar-r", "--adjusted-at", "60", "--rules", "we"]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain("Verdict: insufficient-data");
    expect(run.stdout).toContain("6 more needed");
  });

  test("specification limits add capability before and after", async () => {
    const run = await runInProcess(["verify", fixed, "--chart", "xbar-r", "--adjusted-at", "60", "--rules", "we", "--lsl", "6", "--usl", "14", "--format", "json"]);
    const report = JSON.parse(run.stdout);
    expect(report.capability.before.status).toBe("computed");
    expect(report.capability.after.status).toBe("computed");
  });

  test.each([
    { name: "a missing --adjusted-at", args: ["--chart", "xbar-r"] },
    { name: "an adjustment past the data", args: ["--chart", "xbar-r", "--adjusted-at", "500"] },
    { name: "a power of 1", args: ["--chart", "xbar-r", "--adjusted-at", "60", "--power", "1"] },
    { name: "an unknown rule", args: ["--chart", "xbar-r", "--adjusted-at", "60", "--rules", "we-9"] },
  ])("exit 2 without a stack trace on $name", async ({ args }) => {
    const run = await runInProcess(["verify", fixed, ...args]);
    expect(run.code).toBe(2);
    expect(run.stderr).not.toMatch(/\bat .+:\d+:\d+/);
  });

  test("a missing file is bad input", async () => {
    const run = await runInProcess(["verify", "no-such-file.csv", "--chart", "imr", "--adjusted-at", "5"]);
    expect(run.code).toBe(2);
  });
});
