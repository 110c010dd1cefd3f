/**
 * The import's write path: a raw better-sqlite3 connection with prepared statements (placeholders only),
 * used inside one transaction the caller opens. Prisma is not used here because a million rows through
 * an ORM cost many times the bare insert; the columns written are exactly those Prisma would write
 * (timestamps in Prisma's text form, cached summaries from `summarize`, the same as every other path).
 * A subgroup whose source key is already stored is counted as already present and skipped; a new one must
 * not be earlier than the last stored subgroup (points are appended in time order). The SQL text is fixed:
 * every value goes through a placeholder.
 */
import Database from "better-sqlite3";
import type { ChartType } from "@/shared/constants";
import type { CsvProblem } from "@/src/io/csv/errors";
import { BUSY_TIMEOUT_MS } from "@/src/db/sqlite-adapter";
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

/** Prisma's text form of a DateTime in SQLite ("2026-03-01T06:00:00.000+00:00"), from ISO 8601 UTC text. */
export function storedTime(isoTime: string): string {
  return `${isoTime.slice(0, -1)}+00:00`;
}

export type TWriteOutcome = { readonly kind: "added"; readonly sequence: number } | { readonly kind: "present" } | { readonly kind: "refused"; readonly problem: CsvProblem };

export interface TBatchCounts {
  readonly rowsRead: number;
  readonly subgroupsAdded: number;
  readonly subgroupsAlreadyPresent: number;
  readonly rowsRejected: number;
}

/** Prepared statements for one characteristic and one batch; call inside an open transaction. */
export function createSubgroupWriter(database: Database.Database, characteristicId: number, chart: ChartType, timestampColumn: string) {
  const last = database
    .prepare<[number], { sequence: number; timestamp: string }>(
      'SELECT "sequence", "timestamp" FROM "Subgroup" WHERE "characteristicId" = ? ORDER BY "sequence" DESC LIMIT 1',
    )
    .get(characteristicId);
  const isStored = database.prepare<[number, string]>('SELECT 1 FROM "Subgroup" WHERE "characteristicId" = ? AND "sourceKey" = ?').pluck();
  // A subgroup already stored under its source key is skipped by the conflict clause (no extra lookup);
  // any other constraint violation still fails the statement.
  const insertSubgroup = database.prepare(
    'INSERT INTO "Subgroup" ("characteristicId", "sequence", "timestamp", "count", "size", "sourceKey", "importBatchId", "mean", "spread", "createdAt") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT ("characteristicId", "sourceKey") DO NOTHING',
  );
  const insertMeasurement = database.prepare('INSERT INTO "Measurement" ("subgroupId", "position", "value") VALUES (?, ?, ?)');
  const insertTag = database.prepare('INSERT INTO "SubgroupTag" ("subgroupId", "key", "value") VALUES (?, ?, ?)');
  let nextSequence = last === undefined ? 0 : last.sequence + 1;
  let lastTime = last === undefined ? -Infinity : Date.parse(last.timestamp);
  const firstSequence = nextSequence;

  return {
    /** The sequence the first added subgroup gets. */
    firstSequence,
    write(subgroup: TAssembledSubgroup, batchId: number, createdAt: string): TWriteOutcome {
      if (subgroup.timestamp < lastTime) {
        if (isStored.get(characteristicId, subgroup.sourceKey) !== undefined) return { kind: "present" };
        return {
          kind: "refused",
          problem: {
            line: subgroup.firstLine,
            column: timestampColumn,
            message: `${new Date(subgroup.timestamp).toISOString()} is before the last stored subgroup of this characteristic (${new Date(lastTime).toISOString()}): new points are appended in time order`,
          },
        };
      }
      const columns = summarize(chart, subgroup.recorded);
      const sequence = nextSequence;
      const { changes, lastInsertRowid } = insertSubgroup.run(
        characteristicId,
        sequence,
        storedTime(subgroup.isoTime),
        columns.count,
        columns.size,
        subgroup.sourceKey,
        batchId,
        columns.mean,
        columns.spread,
        createdAt,
      );
      if (changes === 0) return { kind: "present" };
      const values = subgroup.recorded.values ?? [];
      for (let position = 0; position < values.length; position += 1) insertMeasurement.run(lastInsertRowid, position, values[position]);
      // A loop over the keys allocates nothing for the untagged rows of most large files.
      for (const key in subgroup.tags) insertTag.run(lastInsertRowid, key, subgroup.tags[key]);
      nextSequence += 1;
      lastTime = subgroup.timestamp;
      return { kind: "added", sequence };
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
