/**
 * Reads the structure of a SQLite database through SQLite's own pragmas (table_info, index_list,
 * index_info, foreign_key_list), in a sorted plain form that two databases can be compared by.
 */
import Database from "better-sqlite3";

export type TColumn = { name: string; type: string; notNull: boolean; primaryKeyPosition: number; defaultValue: string | null };
export type TIndex = { columns: string[]; unique: boolean; origin: string };
export type TForeignKey = { columns: string[]; table: string; referenced: string[]; onDelete: string; onUpdate: string };
export type TTable = { name: string; columns: TColumn[]; indexes: TIndex[]; foreignKeys: TForeignKey[] };

/** Tables of the application, without SQLite's internal ones and Prisma's migration history. */
export function describeDatabase(databaseFile: string): TTable[] {
  const database = new Database(databaseFile, { readonly: true, fileMustExist: true });
  try {
    const tableNames = database
      .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> '_prisma_migrations' ORDER BY name")
      .pluck()
      .all() as string[];
    return tableNames.map((name) => describeTable(database, name));
  } finally {
    database.close();
  }
}

function describeTable(database: Database.Database, table: string): TTable {
  const columns = (database.pragma(`table_info("${table}")`) as { name: string; type: string; notnull: number; pk: number; dflt_value: string | null }[])
    .map((column) => ({
      name: column.name,
      type: column.type,
      notNull: column.notnull === 1,
      primaryKeyPosition: column.pk,
      defaultValue: column.dflt_value,
    }))
    .sort((a, b) => a.name.localeCompare(b.name));
  const indexes = (database.pragma(`index_list("${table}")`) as { name: string; unique: number; origin: string }[])
    .map((index) => ({
      columns: (database.pragma(`index_info("${index.name}")`) as { seqno: number; name: string }[])
        .sort((a, b) => a.seqno - b.seqno)
        .map((column) => column.name),
      unique: index.unique === 1,
      origin: index.origin,
    }))
    .sort((a, b) => a.columns.join(",").localeCompare(b.columns.join(",")));
  const foreignKeyRows = database.pragma(`foreign_key_list("${table}")`) as {
    id: number; seq: number; table: string; from: string; to: string; on_update: string; on_delete: string;
  }[];
  const foreignKeys = [...new Set(foreignKeyRows.map((row) => row.id))].map((id) => {
    const rows = foreignKeyRows.filter((row) => row.id === id).sort((a, b) => a.seq - b.seq);
    const first = rows[0]!;
    return {
      columns: rows.map((row) => row.from),
      table: first.table,
      referenced: rows.map((row) => row.to),
      onDelete: first.on_delete,
      onUpdate: first.on_update,
    };
  }).sort((a, b) => a.columns.join(",").localeCompare(b.columns.join(",")));
  return { name: table, columns, indexes, foreignKeys };
}

/** Runs a SQL script on a (new) database file. */
export function executeScript(databaseFile: string, script: string): void {
  const database = new Database(databaseFile);
  try {
    database.exec(script);
  } finally {
    database.close();
  }
}
