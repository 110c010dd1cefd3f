/**
 * The import's write path: a raw better-sqlite3 connection with prepared statements (placeholders only),
 * used inside one transaction the caller opens. Prisma is not used here because a million rows through
 * an ORM cost many times the bare insert; the columns written are exactly those Prisma would write
 * (timestamps in Prisma's text form, src/db/stored-time.ts; cached summaries from `summarize`, the same as every other path).
 * A subgroup whose source key is already stored is counted as already present and skipped; a new one must
 * not be earlier than the last stored subgroup (points are appended in time order). The SQL text is built
 * from constant names only: every value goes through a placeholder.
 */
import Database from "better-sqlite3";
import type { ChartType } from "@/shared/constants";
import type { CsvProblem } from "@/src/io/csv/errors";
import { BUSY_TIMEOUT_MS } from "@/src/db/sqlite-adapter";
import { createStoredTimeFormatter } from "@/src/db/stored-time";
import { summarize } from "@/src/subgroups/summaries";
import type { TAssembledSubgroup } from "./assemble";

/** Page cache of the import connection, in KiB (64 MiB). */
export const IMPORT_CACHE_KIB = 65_536;

/** Opens the database file for importing, with the settings every connection of the app uses. */
export function openImportDatabase(databaseFile: string): Database.Database {
  const database = new Database(databaseFile, { fileMustExist: true });
  database.pragma("journal_mode = WAL");
  database.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
  database.pragma("foreign_keys = ON");
  // Each subgroup's source key lands at a random place in the (characteristicId, sourceKey) index; with
  // SQLite's default 2 MB page cache a million-row import spends most of its time re-reading index pages.
  database.pragma(`cache_size = -${IMPORT_CACHE_KIB}`);
  return database;
}

export type TWriteOutcome = { readonly kind: "added"; readonly sequence: number } | { readonly kind: "present" } | { readonly kind: "refused"; readonly problem: CsvProblem };

export interface TBatchCounts {
  readonly rowsRead: number;
  readonly subgroupsAdded: number;
  readonly subgroupsAlreadyPresent: number;
  readonly rowsRejected: number;
}

/**
 * Rows written per INSERT statement. One multi-row statement binds and steps once for many rows, which
 * saves about a quarter of the per-row cost of single-row statements (bench/import-1m.ts; 50-100 rows per
 * statement measured alike, 20 noticeably slower). 64 rows of the widest table bind 704 values, far under
 * SQLite's limit of 32,766.
 */
export const ROWS_PER_STATEMENT = 64;

/**
 * `INSERT INTO table (columns) VALUES (?, ...), ... (rows times)`. Only the project's own constant table and
 * column names go into the text; every value is a placeholder.
 */
export function prepareInsert(database: Database.Database, table: string, columns: readonly string[], rows: number) {
  const tuple = `(${columns.map(() => "?").join(", ")})`;
  const names = columns.map((column) => `"${column}"`).join(", ");
  return database.prepare(`INSERT INTO "${table}" (${names}) VALUES ${Array.from({ length: rows }, () => tuple).join(", ")}`);
}

/** Three-column rows (Measurement, SubgroupTag) gathered and written ROWS_PER_STATEMENT at a time. */
function createRowBatch(database: Database.Database, table: string, columns: readonly [string, string, string]) {
  const whole = prepareInsert(database, table, columns, ROWS_PER_STATEMENT);
  const single = prepareInsert(database, table, columns, 1);
  const values: unknown[] = new Array(3 * ROWS_PER_STATEMENT);
  let rows = 0;
  return {
    add(first: unknown, second: unknown, third: unknown): void {
      const offset = 3 * rows;
      values[offset] = first;
      values[offset + 1] = second;
      values[offset + 2] = third;
      rows += 1;
      if (rows === ROWS_PER_STATEMENT) {
        whole.run(values);
        rows = 0;
      }
    },
    flush(): void {
      for (let row = 0; row < rows; row += 1) single.run(values.slice(3 * row, 3 * row + 3));
      rows = 0;
    },
  };
}

const SUBGROUP_COLUMNS = ["id", "characteristicId", "sequence", "timestamp", "count", "size", "sourceKey", "importBatchId", "mean", "spread", "createdAt"] as const;

/**
 * Prepared statements for one characteristic and one batch; call inside an open write transaction (BEGIN
 * IMMEDIATE). Added subgroups are gathered and written ROWS_PER_STATEMENT at a time; `flush` writes the
 * rest (call it before the transaction commits).
 *
 * Whether a subgroup is already stored is settled before it is queued, so a queued subgroup is certain to
 * be added and can take its sequence and its id at once. A source key begins with its subgroup's time
 * ("csv:<epoch ms>:…", ./assemble.ts), and stored subgroups are never later than the last one stored, so
 * only a subgroup no later than that time can match a stored key: those are looked up one by one (a
 * re-imported file), every later one is new. Keys within one file are distinct (the occurrence field). The
 * insert has no conflict clause: should a key still collide, the statement fails and the whole import
 * rolls back rather than dropping a row silently.
 *
 * Ids are given explicitly, counting on from the largest the table has ever used (its AUTOINCREMENT
 * counter in sqlite_sequence, or its largest id), so the measurement and tag rows know their subgroup's id
 * without reading it back: the open write transaction keeps every other writer out until the commit, and
 * SQLite moves the counter past explicit ids. (Reading the ids back with RETURNING cost 0.7 us per row.)
 */
export function createSubgroupWriter(
  database: Database.Database,
  characteristicId: number,
  chart: ChartType,
  timestampColumn: string,
  batchId: number,
  createdAt: string,
) {
  const last = database
    .prepare<[number], { sequence: number; timestamp: string }>(
      'SELECT "sequence", "timestamp" FROM "Subgroup" WHERE "characteristicId" = ? ORDER BY "sequence" DESC LIMIT 1',
    )
    .get(characteristicId);
  let nextId = database
    .prepare<[], number>(
      `SELECT max(coalesce((SELECT "seq" FROM "sqlite_sequence" WHERE "name" = 'Subgroup'), 0), coalesce((SELECT max("id") FROM "Subgroup"), 0)) + 1`,
    )
    .pluck()
    .get() as number;
  const isStored = database.prepare<[number, string]>('SELECT 1 FROM "Subgroup" WHERE "characteristicId" = ? AND "sourceKey" = ?').pluck();
  const width = SUBGROUP_COLUMNS.length;
  const insertWhole = prepareInsert(database, "Subgroup", SUBGROUP_COLUMNS, ROWS_PER_STATEMENT);
  const insertSingle = prepareInsert(database, "Subgroup", SUBGROUP_COLUMNS, 1);
  const measurements = createRowBatch(database, "Measurement", ["subgroupId", "position", "value"]);
  const tags = createRowBatch(database, "SubgroupTag", ["subgroupId", "key", "value"]);
  const formatTime = createStoredTimeFormatter();
  const lastStoredTime = last === undefined ? -Infinity : Date.parse(last.timestamp);
  let nextSequence = last === undefined ? 0 : last.sequence + 1;
  let lastTime = lastStoredTime;
  const firstSequence = nextSequence;

  // The queue: subgroup columns in statement order, and each subgroup's values and tags, whose rows are
  // written after the subgroup rows they point to (foreign keys are checked at once).
  const columns: unknown[] = new Array(width * ROWS_PER_STATEMENT);
  const queuedValues: (readonly number[] | undefined)[] = new Array(ROWS_PER_STATEMENT);
  const queuedTags: Readonly<Record<string, string>>[] = new Array(ROWS_PER_STATEMENT);
  let queued = 0;

  function writeQueued(): void {
    if (queued === ROWS_PER_STATEMENT) insertWhole.run(columns);
    else for (let index = 0; index < queued; index += 1) insertSingle.run(columns.slice(width * index, width * index + width));
    for (let index = 0; index < queued; index += 1) {
      const id = columns[width * index];
      const values = queuedValues[index];
      if (values !== undefined) for (let position = 0; position < values.length; position += 1) measurements.add(id, position, values[position]);
      const subgroupTags = queuedTags[index] as Readonly<Record<string, string>>;
      // A loop over the keys allocates nothing for the untagged rows of most large files.
      for (const key in subgroupTags) tags.add(id, key, subgroupTags[key]);
    }
    queued = 0;
  }

  return {
    /** The sequence the first added subgroup gets. */
    firstSequence,
    write(subgroup: TAssembledSubgroup): TWriteOutcome {
      if (subgroup.timestamp <= lastStoredTime && isStored.get(characteristicId, subgroup.sourceKey) !== undefined) return { kind: "present" };
      if (subgroup.timestamp < lastTime) {
        return {
          kind: "refused",
          problem: {
            line: subgroup.firstLine,
            column: timestampColumn,
            message: `${new Date(subgroup.timestamp).toISOString()} is before the last stored subgroup of this characteristic (${new Date(lastTime).toISOString()}): new points are appended in time order`,
          },
        };
      }
      const summary = summarize(chart, subgroup.recorded);
      const sequence = nextSequence;
      const offset = width * queued;
      columns[offset] = nextId;
      columns[offset + 1] = characteristicId;
      columns[offset + 2] = sequence;
      columns[offset + 3] = formatTime(subgroup.timestamp);
      columns[offset + 4] = summary.count;
      columns[offset + 5] = summary.size;
      columns[offset + 6] = subgroup.sourceKey;
      columns[offset + 7] = batchId;
      columns[offset + 8] = summary.mean;
      columns[offset + 9] = summary.spread;
      columns[offset + 10] = createdAt;
      nextId += 1;
      queuedValues[queued] = subgroup.recorded.values;
      queuedTags[queued] = subgroup.tags;
      queued += 1;
      nextSequence += 1;
      lastTime = subgroup.timestamp;
      if (queued === ROWS_PER_STATEMENT) writeQueued();
      return { kind: "added", sequence };
    },
    /** Writes the queued subgroups and rows. */
    flush(): void {
      writeQueued();
      measurements.flush();
      tags.flush();
    },
  };
}

/** The ImportBatch row, created first (subgroups point to it) and completed at the end. */
export function createBatch(database: Database.Database, characteristicId: number, fileName: string, mode: string, createdAt: string): number {
  const { lastInsertRowid } = database
    .prepare(
      'INSERT INTO "ImportBatch" ("characteristicId", "fileName", "fileHash", "rowsRead", "subgroupsAdded", "subgroupsAlreadyPresent", "rowsRejected", "mode", "createdAt") VALUES (?, ?, \'\', 0, 0, 0, 0, ?, ?)',
    )
    .run(characteristicId, fileName, mode, createdAt);
  return Number(lastInsertRowid);
}

export function completeBatch(database: Database.Database, batchId: number, fileHash: string, counts: TBatchCounts): void {
  database
    .prepare('UPDATE "ImportBatch" SET "fileHash" = ?, "rowsRead" = ?, "subgroupsAdded" = ?, "subgroupsAlreadyPresent" = ?, "rowsRejected" = ? WHERE "id" = ?')
    .run(fileHash, counts.rowsRead, counts.subgroupsAdded, counts.subgroupsAlreadyPresent, counts.rowsRejected, batchId);
}
