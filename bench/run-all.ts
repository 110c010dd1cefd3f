/**
 * Runs every benchmark in bench/ (each `*.ts` file other than this one), one after another so they do
 * not compete for the two cores, printing their output; exits 1 when any of them failed (over its budget).
 *
 * Run: npm run bench
 */
import { spawnSync } from "node:child_process";
import { readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const directory = path.dirname(fileURLToPath(import.meta.url));
const self = path.basename(fileURLToPath(import.meta.url));
const benchmarks = readdirSync(directory)
  .filter((name) => name.endsWith(".ts") && name !== self)
  .sort();

const failed: string[] = [];
for (const name of benchmarks) {
  console.log(`\n== ${name}`);
  const run = spawnSync(process.execPath, ["--import", "tsx", path.join(directory, name)], { stdio: "inherit" });
  if (run.status !== 0) failed.push(`${name} (exit ${run.status ?? run.signal})`);
}
console.log(`\n${benchmarks.length - failed.length} of ${benchmarks.length} benchmarks passed${failed.length > 0 ? `; failed: ${failed.join(", ")}` : ""}`);
if (failed.length > 0) process.exitCode = 1;
