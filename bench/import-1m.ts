/**
 * Speed and memory of the CSV import on 1,000,000 rows (issue 5): a seeded individuals series
 * (timestamp,value; one subgroup per row) is written to a temporary file, then, in the same run:
 * - the real import path (`importCsv`: file stream → papaparse → zod row checks → the shared chart rules
 *   per subgroup → source keys → prepared-statement writes in one transaction → batch re-evaluation) into a
 *   fresh, migrated database, with the resident set size sampled every 20 ms;
 * - the bare insert the issue names: the same Subgroup and Measurement rows (read back from the first
 *   import's database, batch column included), one prepared single-row statement per row, in one
 *   transaction, nothing else;
 * - for comparison only, the same bare insert with 64-row statements (`ROWS_PER_STATEMENT`) and explicit
 *   ids, the way the import writes: how much of the import's margin comes from those choices.
 *
 * How it is measured:
 * - Each side runs ROUNDS times (3 by default), alternating, each into its own copy of one migrated
 *   database. The machine is shared: another process taking the second core slows whichever run it
 *   overlaps, by up to half in the runs recorded in docs/import.md. Every disturbance only adds time, so the
 *   minimum of each side is the least disturbed estimate; the ratio uses the minima of CPU time (user +
 *   system of this process, all its threads), and the wall-clock ratio is printed beside it.
 * - The code runs as an esbuild bundle in plain node (./support/bundled.ts), as the application ships it.
 * - Peak RSS is that of the first import, before any rows are read back for the bare inserts.
 * Exits 1 when the CPU-time ratio is below 0.5 or the peak RSS reaches 500 MB.
 *
 * Run: npx tsx bench/import-1m.ts (IMPORT_BENCH_ROWS=200000 IMPORT_BENCH_ROUNDS=5 for a quicker check;
 * the figure is judged on 1,000,000 rows)
 */
import { copyFileSync, createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { once } from "node:events";
import { execFileSync } from "node:child_process";
import { createPrismaClient } from "../src/db/connect";
import { importCsv } from "../src/imports/import-csv";
import { openImportDatabase, prepareInsert, ROWS_PER_STATEMENT } from "../src/imports/write";
import { createRng } from "../src/spc/random";
import { loadedAs, runBundled } from "./support/bundled";

await runBundled(import.meta.url);

const ROWS = Number(process.env.IMPORT_BENCH_ROWS ?? 1_000_000);
const ROUNDS = Number(process.env.IMPORT_BENCH_ROUNDS ?? 3);
const MINIMUM_RATIO = 0.5;
const MAXIMUM_RSS_BYTES = 500 * 1024 * 1024;
const START = Date.UTC(2026, 0, 1);

interface Sample {
  readonly cpu: number;
  readonly wall: number;
}

/** Runs `work` and returns its CPU time (this process, all threads) and wall time, in milliseconds. */
async function measure(work: () => unknown): Promise<Sample> {
  const startedCpu = process.cpuUsage();
  const startedWall = performance.now();
  await work();
  const wall = performance.now() - startedWall;
  const usage = process.cpuUsage(startedCpu);
  return { cpu: (usage.user + usage.system) / 1000, wall };
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

/** A migrated database with one individuals characteristic, copied for every run. */
async function templateDatabase(): Promise<{ file: string; characteristicId: number }> {
  const file = path.join(directory, "template.db");
  // Migrated by the project's script in a child process, so the migration engine's WebAssembly memory
  // does not count in this process's resident set.
  execFileSync("npm", ["run", "-s", "db:migrate"], { env: { ...process.env, DATABASE_URL: `file:${file}` }, stdio: "ignore" });
  const prisma = createPrismaClient(`file:${file}`);
  const site = await prisma.site.create({ data: { name: "Bench site" } });
  const area = await prisma.area.create({ data: { siteId: site.id, name: "Hall" } });
  const press = await prisma.process.create({ data: { areaId: area.id, name: "Press", kind: "injection-moulding press" } });
  const characteristic = await prisma.characteristic.create({
    data: { processId: press.id, name: "Cap height", unit: "mm", chartType: "imr", subgroupSize: 1, ruleSet: "nelson" },
  });
  await prisma.$disconnect();
  // Everything into the main file, so that copying it copies the whole database.
  const sqlite = openImportDatabase(file);
  sqlite.pragma("wal_checkpoint(TRUNCATE)");
  sqlite.close();
  return { file, characteristicId: characteristic.id };
}

let copies = 0;
function copyOf(template: string): string {
  copies += 1;
  const file = path.join(directory, `run-${copies}.db`);
  copyFileSync(template, file);
  return file;
}

const SUBGROUP_COLUMNS = ["characteristicId", "sequence", "timestamp", "count", "size", "sourceKey", "importBatchId", "mean", "spread", "createdAt"] as const;
const MEASUREMENT_COLUMNS = ["subgroupId", "position", "value"] as const;
type TStoredRow = [number, number, string, null, null, string, number, number, null, string];

/** The rows the first import stored: ids, Subgroup columns in insert order, and each subgroup's one value. */
function storedRows(databaseFile: string): { ids: number[]; subgroups: TStoredRow[]; values: number[]; batch: unknown[] } {
  const sqlite = openImportDatabase(databaseFile);
  const ids = sqlite.prepare<[], number>('SELECT "id" FROM "Subgroup" ORDER BY "sequence"').pluck().all();
  const subgroups = sqlite
    .prepare<[], TStoredRow>(`SELECT ${SUBGROUP_COLUMNS.map((column) => `"${column}"`).join(", ")} FROM "Subgroup" ORDER BY "sequence"`)
    .raw()
    .all();
  const values = sqlite.prepare<[], number>('SELECT m."value" FROM "Subgroup" s JOIN "Measurement" m ON m."subgroupId" = s."id" ORDER BY s."sequence"').pluck().all();
  const batch = sqlite.prepare('SELECT * FROM "ImportBatch"').raw().get() as unknown[];
  sqlite.close();
  return { ids, subgroups, values, batch };
}

/**
 * Inserts the stored rows into a copy of the template and returns its time. With one row per statement
 * (the bare insert of the issue) SQLite chooses each id and each measurement takes its subgroup's
 * `lastInsertRowid`; with many, the ids are given, as the import gives them. The batch row the subgroups
 * point to is written first, untimed; what was stored is compared with what was read, untimed.
 */
async function bareInsert(template: string, firstImport: string, rowsPerStatement: number): Promise<Sample> {
  const { ids, subgroups, values, batch } = storedRows(firstImport);
  const sqlite = openImportDatabase(copyOf(template));
  sqlite.prepare(`INSERT INTO "ImportBatch" VALUES (${batch.map(() => "?").join(", ")})`).run(batch);
  const insertOne = () => {
    const insertSubgroup = prepareInsert(sqlite, "Subgroup", SUBGROUP_COLUMNS, 1);
    const insertMeasurement = prepareInsert(sqlite, "Measurement", MEASUREMENT_COLUMNS, 1);
    for (let index = 0; index < subgroups.length; index += 1) {
      const { lastInsertRowid } = insertSubgroup.run(subgroups[index]);
      insertMeasurement.run(lastInsertRowid, 0, values[index]);
    }
  };
  const insertMany = () => {
    const insertSubgroups = prepareInsert(sqlite, "Subgroup", ["id", ...SUBGROUP_COLUMNS], rowsPerStatement);
    const insertMeasurements = prepareInsert(sqlite, "Measurement", MEASUREMENT_COLUMNS, rowsPerStatement);
    const subgroupValues: unknown[] = [];
    const measurementValues: unknown[] = [];
    for (let first = 0; first < subgroups.length; first += rowsPerStatement) {
      subgroupValues.length = 0;
      measurementValues.length = 0;
      for (let index = first; index < first + rowsPerStatement; index += 1) {
        subgroupValues.push(ids[index], ...(subgroups[index] as TStoredRow));
        measurementValues.push(ids[index], 0, values[index]);
      }
      insertSubgroups.run(subgroupValues);
      insertMeasurements.run(measurementValues);
    }
  };
  const sample = await measure(() => sqlite.transaction(rowsPerStatement === 1 ? insertOne : insertMany)());
  const stored = sqlite.prepare<[], number>('SELECT m."value" FROM "Subgroup" s JOIN "Measurement" m ON m."subgroupId" = s."id" ORDER BY s."sequence"').pluck().all();
  sqlite.close();
  if (stored.length !== values.length || stored.some((value, index) => value !== values[index])) {
    throw new Error(`the bare insert with ${rowsPerStatement} rows per statement did not store the rows it was given`);
  }
  return sample;
}

try {
  if (ROWS % ROWS_PER_STATEMENT !== 0) throw new Error(`IMPORT_BENCH_ROWS must be a multiple of ${ROWS_PER_STATEMENT}`);
  const csvFile = path.join(directory, "readings.csv");
  await writeCsv(csvFile);
  const fileBytes = statSync(csvFile).size;
  const template = await templateDatabase();

  let firstImport: string | undefined;
  let peakRss = 0;
  const imports: Sample[] = [];
  const bare: Sample[] = [];
  const bareMultiRow: Sample[] = [];
  for (let round = 0; round < ROUNDS; round += 1) {
    const databaseFile = copyOf(template.file);
    const prisma = createPrismaClient(`file:${databaseFile}`);
    const sqlite = openImportDatabase(databaseFile);
    let sampler: NodeJS.Timeout | undefined;
    if (round === 0) sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 20);
    let result: Awaited<ReturnType<typeof importCsv>> | undefined;
    imports.push(
      await measure(async () => {
        result = await importCsv(prisma, sqlite, {
          characteristicId: template.characteristicId,
          source: createReadStream(csvFile),
          options: { fileName: "readings.csv", mapping: { timestamp: "timestamp", value: "value" } },
          now: new Date(),
        });
      }),
    );
    if (sampler !== undefined) {
      clearInterval(sampler);
      peakRss = Math.max(peakRss, process.memoryUsage().rss);
    }
    sqlite.close();
    await prisma.$disconnect();
    if (result?.status !== "imported" || result.subgroupsAdded !== ROWS) {
      throw new Error(`import did not add every row: ${JSON.stringify({ ...result, problems: result?.problems.slice(0, 5) })}`);
    }
    firstImport ??= databaseFile;
    bare.push(await bareInsert(template.file, firstImport, 1));
    bareMultiRow.push(await bareInsert(template.file, firstImport, ROWS_PER_STATEMENT));
  }

  const least = (samples: readonly Sample[]): Sample => ({
    cpu: Math.min(...samples.map((sample) => sample.cpu)),
    wall: Math.min(...samples.map((sample) => sample.wall)),
  });
  const rate = (milliseconds: number) => Math.round(ROWS / (milliseconds / 1000)).toLocaleString("en");
  const line = (label: string, samples: readonly Sample[]) => {
    const { cpu, wall } = least(samples);
    const all = samples.map((sample) => (sample.cpu / 1000).toFixed(2)).join(", ");
    return `${label}: ${(cpu / 1000).toFixed(2)} s CPU (${rate(cpu)} rows/s), ${(wall / 1000).toFixed(2)} s wall (${rate(wall)} rows/s); CPU of each round: ${all} s`;
  };
  const ratio = (side: readonly Sample[], key: keyof Sample) => least(side)[key] / least(imports)[key];
  const cpuRatio = ratio(bare, "cpu");
  const peakMegabytes = peakRss / 1024 / 1024;
  console.log(`CSV: ${ROWS.toLocaleString("en")} rows, ${(fileBytes / 1024 / 1024).toFixed(1)} MB; ${ROUNDS} rounds, alternating; minima shown`);
  console.log(`loaded as: ${loadedAs()}`);
  console.log(line("real import path             ", imports));
  console.log(line("bare insert, 1 row/statement ", bare));
  console.log(line(`bare insert, ${ROWS_PER_STATEMENT} rows/statement`, bareMultiRow));
  console.log(`throughput ratio (import / bare, 1 row per statement): ${cpuRatio.toFixed(2)} on CPU time, ${ratio(bare, "wall").toFixed(2)} on wall time (target >= ${MINIMUM_RATIO} on CPU time)`);
  console.log(`for comparison, against the bare insert with ${ROWS_PER_STATEMENT} rows per statement: ${ratio(bareMultiRow, "cpu").toFixed(2)} on CPU time, ${ratio(bareMultiRow, "wall").toFixed(2)} on wall time`);
  console.log(`peak RSS during the first import: ${peakMegabytes.toFixed(0)} MB (target < ${MAXIMUM_RSS_BYTES / 1024 / 1024} MB)`);
  if (cpuRatio < MINIMUM_RATIO || peakRss >= MAXIMUM_RSS_BYTES) {
    console.log("FAILED");
    process.exitCode = 1;
  }
} finally {
  rmSync(directory, { recursive: true, force: true });
}
