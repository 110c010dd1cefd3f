/**
 * Runs a benchmark as the application ships its code: bundled by esbuild and run by plain node, without
 * tsx's loader hooks and source maps. Under tsx every function made at run time is wrapped in a call that
 * defines its name (esbuild's keepNames), and plain loops measured up to twice as slow, which flatters or
 * spoils a ratio depending on which side carries more of it. The bundle keeps npm packages external (native
 * addons such as better-sqlite3 load from node_modules as usual), so it is written inside node_modules.
 *
 * Call at the top of a benchmark: `await runBundled(import.meta.url)`. In the first process it builds the
 * bundle, runs it in a child and exits with the child's status; in the child it returns at once.
 */
import { spawnSync } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const BUNDLED = "ASSIGNABLE_BENCH_BUNDLED";

export async function runBundled(entryUrl: string): Promise<void> {
  if (process.env[BUNDLED] !== undefined) return;
  const entry = fileURLToPath(entryUrl);
  const directory = path.join(path.dirname(entry), "..", "node_modules", ".cache", "assignable-bench");
  mkdirSync(directory, { recursive: true });
  const outfile = path.join(directory, `${path.basename(entry, ".ts")}-${process.pid}.mjs`);
  const { buildSync } = await import("esbuild");
  buildSync({ entryPoints: [entry], bundle: true, platform: "node", format: "esm", packages: "external", outfile, logLevel: "warning" });
  const child = spawnSync(process.execPath, [outfile], { stdio: "inherit", env: { ...process.env, [BUNDLED]: "1" } });
  rmSync(outfile);
  process.exit(child.status ?? 1);
}

/** How the measured code was loaded, for the benchmark's report. */
export function loadedAs(): string {
  return `an esbuild bundle of the benchmark run by plain node ${process.version}`;
}
