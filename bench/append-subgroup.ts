/**
 * Live detection cost against history length: one X-bar/R subgroup of 5 (Nelson's eight tests) appended
 * through `appendSubgroups` (validation, insert of the subgroup, its measurements and summaries, live
 * evaluation against the frozen limit set, signal merge and write, one transaction) to a characteristic
 * with 1,000 and one with 100,000 subgroups of history, on a temporary SQLite file with the app's
 * connection settings (src/db/sqlite-adapter.ts: WAL; better-sqlite3's SQLite then defaults to
 * synchronous = NORMAL, printed below: no disk flush at every commit). Median wall time and median CPU
 * time of this process over 250 appends each, interleaved so that both see the same machine load; the
 * machine's load average is printed beside them. Budget 5 ms (wall) at 100,000. Runs as the shipped bundle
 * (./support/bundled.ts).
 *
 * Not timed: building the histories. Their rows are written directly with better-sqlite3 in one
 * transaction, with the summaries computed by the service's own `summarize`, then limits are frozen from
 * subgroups 0-99 through `reviseLimits` (which re-evaluates, and stores the signals of, the whole history).
 *
 * Run: npx tsx bench/append-subgroup.ts   (exit code 1 when the median at 100,000 is over the budget)
 */
import { mkdtempSync, rmSync } from "node:fs";
import { loadavg } from "node:os";
import os from "node:os";
import Database from "better-sqlite3";
import path from "node:path";
import type { TSubgroupInput } from "../shared/intake";
import { createCharacteristic } from "../src/characteristics/setup";
import { createPrismaClient } from "../src/db/connect";
import { applyMigrations } from "../src/db/migrations/apply-migrations";
import { storedTimeOf } from "../src/db/stored-time";
import { reviseLimits } from "../src/limits";
import { createRng } from "../src/spc/random";
import { appendSubgroups, summarize } from "../src/subgroups";
import { loadedAs, runBundled } from "./support/bundled";

await runBundled(import.meta.url);

const HISTORIES = [1_000, 100_000] as const;
const TIMED_APPENDS = 250;
const WARM_UP_APPENDS = 50;
const BUDGET_MILLISECONDS = 5;
const START = Date.parse("2020-01-01T00:00:00Z");
const MINUTE = 60_000;
const NOW = new Date("2026-12-01T00:00:00Z");

const rng = createRng(20261201);
const subgroup = (index: number): TSubgroupInput => ({
  timestamp: new Date(START + index * MINUTE).toISOString(),
  values: Array.from({ length: 5 }, () => Math.round((74 + 0.01 * rng.normal()) * 10_000) / 10_000),
});

const directory = mkdtempSync(path.join(os.tmpdir(), "assignable-bench-append-"));
const databaseFile = path.join(directory, "bench.db");
await applyMigrations({ databaseFile });
const db = createPrismaClient(`file:${databaseFile}`);
try {
  const site = await db.site.create({
    data: { name: "Bench", areas: { create: { name: "Bench", processes: { create: { name: "Bench press", kind: "press" } } } } },
    select: { areas: { select: { processes: { select: { id: true } } } } },
  });
  const processId = site.areas[0]!.processes[0]!.id;
  const characteristics: { id: number; history: number; next: number; wall: number[]; cpu: number[] }[] = [];
  for (const history of HISTORIES) {
    const built = performance.now();
    const { id } = await createCharacteristic(db, { processId, name: `History ${history}`, unit: "mm", chartType: "xbar-r", subgroupSize: 5, ruleSet: "nelson" });
    writeHistory(id, history);
    await reviseLimits(db, id, { baselineStart: 0, baselineEnd: 100, reason: "benchmark baseline", approvedBy: "Benchmark" }, NOW);
    const signals = await db.signal.count({ where: { characteristicId: id } });
    console.log(`history of ${history.toLocaleString("en")} subgroups (${signals} signals) built in ${((performance.now() - built) / 1000).toFixed(1)} s`);
    characteristics.push({ id, history, next: history, wall: [], cpu: [] });
  }

  const LEVELS = ["OFF", "NORMAL", "FULL", "EXTRA"];
  const [{ synchronous: level }] = await db.$queryRawUnsafe<[{ synchronous: number | bigint }]>("PRAGMA synchronous");
  for (let round = 0; round < WARM_UP_APPENDS + TIMED_APPENDS; round++) {
    for (const characteristic of characteristics) {
      const input = subgroup(characteristic.next++);
      const cpu = process.cpuUsage();
      const started = performance.now();
      await appendSubgroups(db, characteristic.id, [input], { source: "api", now: NOW });
      const wall = performance.now() - started;
      const used = process.cpuUsage(cpu);
      if (round >= WARM_UP_APPENDS) {
        characteristic.wall.push(wall);
        characteristic.cpu.push((used.user + used.system) / 1000);
      }
    }
  }
  const medians = characteristics.map((characteristic) => ({ wall: median(characteristic.wall), cpu: median(characteristic.cpu) }));
  console.log(`loaded as: ${loadedAs()}`);
  console.log(`synchronous = ${LEVELS[Number(level)] ?? String(level)}, load average ${loadavg()[0]!.toFixed(1)} on ${os.cpus().length} cores:`);
  for (const [index, characteristic] of characteristics.entries()) {
    console.log(
      `  ${characteristic.history.toLocaleString("en").padStart(7)} subgroups of history: median ${medians[index]!.wall.toFixed(2)} ms wall, ` +
        `${medians[index]!.cpu.toFixed(2)} ms CPU (${TIMED_APPENDS} appends)`,
    );
  }
  console.log(`  ratio 100,000 / 1,000: ${(medians[1]!.wall / medians[0]!.wall).toFixed(2)} wall, ${(medians[1]!.cpu / medians[0]!.cpu).toFixed(2)} CPU`);
  if (medians[1]!.wall > BUDGET_MILLISECONDS) {
    console.log(`  OVER BUDGET: ${BUDGET_MILLISECONDS} ms at 100,000`);
    process.exitCode = 1;
  }
} finally {
  await db.$disconnect();
  rmSync(directory, { recursive: true, force: true });
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/** Subgroups 0..count-1 with their measurements and cached summaries, in one transaction. */
function writeHistory(characteristicId: number, count: number): void {
  const raw = new Database(databaseFile);
  try {
    const insertSubgroup = raw.prepare(
      `INSERT INTO "Subgroup" ("characteristicId", "sequence", "timestamp", "mean", "spread", "createdAt") VALUES (?, ?, ?, ?, ?, ?)`,
    );
    const insertMeasurement = raw.prepare(`INSERT INTO "Measurement" ("subgroupId", "position", "value") VALUES (?, ?, ?)`);
    raw.transaction(() => {
      for (let index = 0; index < count; index++) {
        const input = subgroup(index);
        const { mean, spread } = summarize("xbar-r", input);
        const { lastInsertRowid } = insertSubgroup.run(characteristicId, index, storedTimeOf(Date.parse(input.timestamp)), mean, spread, storedTimeOf(NOW.getTime()));
        input.values!.forEach((value, position) => insertMeasurement.run(lastInsertRowid, position, value));
      }
    })();
  } finally {
    raw.close();
  }
}
