/**
 * Speed and memory of the CSV import on 1,000,000 rows (issue 5): a seeded individuals series
 * (timestamp,value; one subgroup per row) is written to a temporary file, then
 * 1. the real import path (`importCsv`: file stream → papaparse → zod row checks → the shared chart rules per
 *    subgroup → source keys → prepared-statement writes in one transaction → batch re-evaluation)
 *    runs into a fresh, migrated database, with the resident set size sampled every 20 ms;
 * 2. a bare better-sqlite3 insert of the same rows (the Subgroup and Measurement rows the import stored,
 *    read back from the first database beforehand) runs into a second fresh database, with the same
 *    prepared statements in one transaction and nothing else.
 * Both throughputs are printed with their ratio, in wall-clock and in CPU time. The target ratio (≥ 0.5) is
 * judged on CPU time: the machine is shared, and other processes' load inflates whichever run they overlap;
 * the CPU time of this process is what the import itself costs (both runs are single-threaded apart from
 * file reads). Peak RSS during the import must stay < 500 MB. Exits 1 if either fails. One run each (a
 * million rows take seconds, so timer noise is small).
 *
 * Run: npx tsx bench/import-1m.ts (IMPORT_BENCH_ROWS=200000 for a quicker check; the figure is judged on 1,000,000)
 */
import { createWriteStream, mkdtempSync, rmSync, statSync, createReadStream } from "node:fs";
import os from "node:os";
import path from "node:path";
import { once } from "node:events";
import { execFileSync } from "node:child_process";
import { createPrismaClient } from "../src/db/connect";
import { importCsv } from "../src/imports/import-csv";
import { openImportDatabase } from "../src/imports/write";
import { createRng } from "../src/spc/random";

const ROWS = Number(process.env.IMPORT_BENCH_ROWS ?? 1_000_000);
const MINIMUM_RATIO = 0.5;
const MAXIMUM_RSS_BYTES = 500 * 1024 * 1024;
const START = Date.UTC(2026, 0, 1);

/** User plus system CPU time of this process (all its threads), in milliseconds. */
function cpuMilliseconds(usage: NodeJS.CpuUsage): number {
  return (usage.user + usage.system) / 1000;
}

const directory = mkdtempSync(path.join(os.tmpdir(), "assignable-import-bench-"));

async function writeCsv(file: string): Promise<void> {
  const rng = createRng(20261202);
  const out = createWriteStream(file);
  out.write("timestamp,value\n");
  let buffer = "";
  for (let row = 0; row < ROWS; row += 1) {
    buffer += `${new Date(START + row * 60_000).toISOString()},${(18.2 + 0.06 * rng.normal()).toFixed(3)}\n`;
    if (buffer.length > 1 << 16) {
      if (!out.write(buffer)) await once(out, "drain");
      buffer = "";
    }
  }
  out.end(buffer);
  await once(out, "finish");
}

async function freshDatabase(name: string) {
  const databaseFile = path.join(directory, name);
  // Migrated by the project's script in a child process, so the migration engine's WebAssembly memory
  // does not count in this process's resident set.
  execFileSync("npm", ["run", "-s", "db:migrate"], { env: { ...process.env, DATABASE_URL: `file:${databaseFile}` }, stdio: "ignore" });
  const prisma = createPrismaClient(`file:${databaseFile}`);
  const site = await prisma.site.create({ data: { name: "Bench site" } });
  const area = await prisma.area.create({ data: { siteId: site.id, name: "Hall" } });
  const press = await prisma.process.create({ data: { areaId: area.id, name: "Press", kind: "injection-moulding press" } });
  const characteristic = await prisma.characteristic.create({
    data: { processId: press.id, name: "Cap height", unit: "mm", chartType: "imr", subgroupSize: 1, ruleSet: "nelson" },
  });
  return { databaseFile, prisma, characteristicId: characteristic.id };
}

try {
  const csvFile = path.join(directory, "readings.csv");
  await writeCsv(csvFile);
  const fileBytes = statSync(csvFile).size;

  // 1. The real import path.
  const real = await freshDatabase("real.db");
  const realSqlite = openImportDatabase(real.databaseFile);
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 20);
  const importCpu = process.cpuUsage();
  const importStarted = performance.now();
  const result = await importCsv(real.prisma, realSqlite, {
    characteristicId: real.characteristicId,
    source: createReadStream(csvFile),
    options: { fileName: "readings.csv", mapping: { timestamp: "timestamp", value: "value" } },
    now: new Date(),
  });
  const importMilliseconds = performance.now() - importStarted;
  const importCpuMilliseconds = cpuMilliseconds(process.cpuUsage(importCpu));
  clearInterval(sampler);
  peakRss = Math.max(peakRss, process.memoryUsage().rss);
  if (result.status !== "imported" || result.subgroupsAdded !== ROWS) throw new Error(`import did not add every row: ${JSON.stringify({ ...result, problems: result.problems.slice(0, 5) })}`);

  // 2. The bare insert of the same rows.
  const subgroups = realSqlite
    .prepare<[], [number, string, string, number, string]>('SELECT "sequence", "timestamp", "sourceKey", "mean", "createdAt" FROM "Subgroup" ORDER BY "sequence"')
    .raw()
    .all();
  const values = realSqlite.prepare<[], number>('SELECT "value" FROM "Measurement" ORDER BY "subgroupId"').pluck().all();
  realSqlite.close();
  await real.prisma.$disconnect();

  const bare = await freshDatabase("bare.db");
  await bare.prisma.$disconnect();
  const bareSqlite = openImportDatabase(bare.databaseFile);
  const insertSubgroup = bareSqlite.prepare(
    'INSERT INTO "Subgroup" ("characteristicId", "sequence", "timestamp", "count", "size", "sourceKey", "importBatchId", "mean", "spread", "createdAt") VALUES (?, ?, ?, NULL, NULL, ?, NULL, ?, NULL, ?)',
  );
  const insertMeasurement = bareSqlite.prepare('INSERT INTO "Measurement" ("subgroupId", "position", "value") VALUES (?, 0, ?)');
  const bareCpu = process.cpuUsage();
  const bareStarted = performance.now();
  bareSqlite.transaction(() => {
    subgroups.forEach(([sequence, timestamp, sourceKey, mean, createdAt], index) => {
      const { lastInsertRowid } = insertSubgroup.run(bare.characteristicId, sequence, timestamp, sourceKey, mean, createdAt);
      insertMeasurement.run(lastInsertRowid, values[index]);
    });
  })();
  const bareMilliseconds = performance.now() - bareStarted;
  const bareCpuMilliseconds = cpuMilliseconds(process.cpuUsage(bareCpu));
  bareSqlite.close();

  const rate = (milliseconds: number) => ROWS / (milliseconds / 1000);
  const line = (label: string, wall: number, cpu: number) =>
    `${label}: ${(wall / 1000).toFixed(2)} s wall (${Math.round(rate(wall)).toLocaleString("en")} rows/s), ${(cpu / 1000).toFixed(2)} s CPU (${Math.round(rate(cpu)).toLocaleString("en")} rows/s)`;
  const wallRatio = bareMilliseconds / importMilliseconds;
  const cpuRatio = bareCpuMilliseconds / importCpuMilliseconds;
  const peakMegabytes = peakRss / 1024 / 1024;
  console.log(`CSV: ${ROWS.toLocaleString("en")} rows, ${(fileBytes / 1024 / 1024).toFixed(1)} MB`);
  console.log(line("real import path", importMilliseconds, importCpuMilliseconds));
  console.log(line("bare insert     ", bareMilliseconds, bareCpuMilliseconds));
  console.log(`throughput ratio (import / bare): ${cpuRatio.toFixed(2)} on CPU time, ${wallRatio.toFixed(2)} on wall time (target >= ${MINIMUM_RATIO} on CPU time)`);
  console.log(`peak RSS during the import: ${peakMegabytes.toFixed(0)} MB (target < ${MAXIMUM_RSS_BYTES / 1024 / 1024} MB)`);
  if (cpuRatio < MINIMUM_RATIO || peakRss >= MAXIMUM_RSS_BYTES) {
    console.log("FAILED");
    process.exitCode = 1;
  }
} finally {
  rmSync(directory, { recursive: true, force: true });
}
