/**
 * Cached columns of the per-subgroup summaries and times, whole history per characteristic, as typed arrays kept in
 * the server process: reading a million rows takes several hundred milliseconds on a busy machine, and
 * the chart is asked for the same history again at every zoom. (CROSS JOIN makes SQLite walk the few
 * corrections and look their subgroups up, instead of walking a million subgroups to find them.)
 *
 * Freshness: each use first reads a stamp of everything that rewrites stored rows (a correction, a
 * recorded re-evaluation, which rewrites the EWMA/CUSUM state, or a characteristic recreated under the
 * same id), all from indexed columns. A changed stamp reloads the column; a history that only grew (the
 * usual case: subgroups arriving) reads just the new rows. Entries are kept for the most recently used
 * characteristics only.
 */
import type Database from "better-sqlite3";

export const COLUMN_STATEMENTS = {
  mean: 'SELECT "mean" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  spread: 'SELECT "spread" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  count: 'SELECT "count" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  size: 'SELECT "size" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  ewma: 'SELECT "ewma" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  cusumUpper: 'SELECT "cusumUpper" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  cusumLower: 'SELECT "cusumLower" FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
  // The time in milliseconds since the epoch: a long history's kept points then need no lookup each.
  time: 'SELECT CAST(ROUND(unixepoch("timestamp", \'subsec\') * 1000) AS INTEGER) FROM "Subgroup" WHERE "characteristicId" = ? AND "sequence" BETWEEN ? AND ? ORDER BY "sequence"',
} as const;
export type TColumn = keyof typeof COLUMN_STATEMENTS;

const STAMP_STATEMENT =
  'SELECT (SELECT "createdAt" FROM "Characteristic" WHERE "id" = ?) || \'|\' || ' +
  '(SELECT COALESCE(MAX("id"), 0) FROM "SignalEvaluation" WHERE "characteristicId" = ?) || \'|\' || ' +
  '(SELECT COALESCE(MAX(c."id"), 0) FROM "Correction" c CROSS JOIN "Subgroup" s ON s."id" = c."subgroupId" WHERE s."characteristicId" = ?)';

/** How many (characteristic, column) entries stay cached; a million-point column takes 8 MB. */
const CACHED_COLUMNS = 24;

interface TEntry {
  stamp: string;
  first: number;
  values: Float64Array;
  /** Values in use at the start of `values`; the rest is room to grow. */
  length: number;
}

const entries = new Map<string, TEntry>();

function read(database: Database.Database, column: TColumn, characteristicId: number, from: number, to: number): Float64Array {
  const values = database.prepare(COLUMN_STATEMENTS[column]).pluck(true).all(characteristicId, from, to) as (number | null)[];
  if (values.length !== to - from + 1) {
    throw new Error(`Characteristic ${characteristicId}: sequences ${from}..${to} are not contiguous (${values.length} rows)`);
  }
  return Float64Array.from(values, (value) => value ?? Number.NaN);
}

/**
 * The column over [from, to] (inside the history [first, last]), NaN where null. Call inside the read
 * transaction that also read `first` and `last`, so the stamp and the rows belong to one snapshot.
 */
export function cachedColumn(
  database: Database.Database,
  column: TColumn,
  characteristicId: number,
  history: { first: number; last: number },
  range: { from: number; to: number },
): Float64Array {
  const key = `${database.name}|${characteristicId}|${column}`;
  const stamp = database.prepare(STAMP_STATEMENT).pluck(true).get(characteristicId, characteristicId, characteristicId) as string;
  let entry = entries.get(key);
  entries.delete(key);
  const reusable = entry !== undefined && entry.stamp === stamp && entry.first === history.first && entry.first + entry.length - 1 <= history.last;
  if (!reusable) {
    const values = read(database, column, characteristicId, history.first, history.last);
    entry = { stamp, first: history.first, values, length: values.length };
  } else if (entry!.first + entry!.length - 1 < history.last) {
    const grown = entry!;
    const added = read(database, column, characteristicId, grown.first + grown.length, history.last);
    if (grown.length + added.length > grown.values.length) {
      const larger = new Float64Array(Math.ceil((grown.length + added.length) * 1.5));
      larger.set(grown.values.subarray(0, grown.length));
      grown.values = larger;
    }
    grown.values.set(added, grown.length);
    grown.length += added.length;
  }
  entries.set(key, entry!);
  for (const oldest of entries.keys()) {
    if (entries.size <= CACHED_COLUMNS) break;
    entries.delete(oldest);
  }
  return entry!.values.subarray(range.from - entry!.first, range.to - entry!.first + 1);
}
