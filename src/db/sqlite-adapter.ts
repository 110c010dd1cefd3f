/**
 * The SQLite driver adapter factory shared by the app's Prisma client and the migration engine.
 *
 * Every connection to the database file gets the same settings on opening:
 * - WAL journal mode, so the web server's readers do not block behind a writer (the seed, live input);
 * - a busy timeout, so a writer waits for a lock instead of failing at once with SQLITE_BUSY;
 * - foreign keys on, so the `onDelete: Cascade` relations of the schema are enforced.
 * And every write waits its turn at the process's write gate, every transaction taking the write lock
 * before its first statement (see `gateWrites`).
 * The Prisma adapter has no hook for either, hence this thin wrapper around its factory.
 */
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import type { SqlDriverAdapter, SqlMigrationAwareDriverAdapterFactory, SqlQuery, Transaction } from "@prisma/driver-adapter-utils";
import { enterWriteGate, withWriteGate } from "./write-gate";

/** How long a connection waits for a competing writer before giving up, in milliseconds. */
export const BUSY_TIMEOUT_MS = 5_000;

const CONNECTION_PRAGMAS = [
  "PRAGMA journal_mode = WAL;",
  `PRAGMA busy_timeout = ${BUSY_TIMEOUT_MS};`,
  "PRAGMA foreign_keys = ON;",
].join("\n");

/** Creates the adapter factory for the SQLite file at `databaseFile` (an absolute path). */
export function createSqliteAdapterFactory(databaseFile: string): SqlMigrationAwareDriverAdapterFactory {
  const inner = new PrismaBetterSqlite3({ url: `file:${databaseFile}`, timeout: BUSY_TIMEOUT_MS });
  return {
    provider: inner.provider,
    adapterName: inner.adapterName,
    async connect(): Promise<SqlDriverAdapter> {
      const adapter = await inner.connect();
      try {
        await adapter.executeScript(CONNECTION_PRAGMAS);
      } catch (error) {
        await adapter.dispose();
        throw error;
      }
      return gateWrites(adapter);
    },
    // The shadow database is an in-memory scratch copy used to replay migrations: no WAL there.
    connectToShadowDb: () => inner.connectToShadowDb(),
  };
}

const statement = (sql: string) => ({ sql, args: [], argTypes: [] });

/** Statements that write, as Prisma writes them (its SQL begins with the verb). */
const WRITE_STATEMENT = /^\s*(?:INSERT|UPDATE|DELETE|REPLACE)\b/i;

/**
 * Makes every write of the adapter wait its turn at the process's write gate (src/db/write-gate.ts) and
 * every transaction take the database's write lock before its first statement.
 *
 * Prisma's adapter opens transactions with a plain (deferred) BEGIN, so a transaction holds only a read
 * snapshot until its first write; when another process writes meanwhile, SQLite answers the upgrade with
 * SQLITE_BUSY at once, without the busy timeout. Every transaction here writes, so each is turned into
 * BEGIN IMMEDIATE before anything runs in it (nothing has happened inside the deferred BEGIN yet, so
 * ending it changes nothing): it waits for the lock, then reads and writes a snapshot no other writer can
 * change. A write outside a transaction (one statement, autocommit) passes the gate for its own length.
 */
function gateWrites(adapter: SqlDriverAdapter): SqlDriverAdapter {
  const startTransaction = adapter.startTransaction.bind(adapter);
  adapter.startTransaction = async (isolationLevel): Promise<Transaction> => {
    const leave = await enterWriteGate();
    let transaction: Transaction | undefined;
    try {
      transaction = await startTransaction(isolationLevel);
      await transaction.executeRaw(statement("ROLLBACK"));
      await transaction.executeRaw(statement("BEGIN IMMEDIATE"));
    } catch (error) {
      // No transaction is open: release the adapter's own hold on the connection, then the gate.
      await transaction?.rollback();
      leave();
      throw error;
    }
    const opened = transaction;
    const end = (finish: () => Promise<void>) => async () => {
      try {
        await finish();
      } finally {
        leave();
      }
    };
    opened.commit = end(opened.commit.bind(opened));
    opened.rollback = end(opened.rollback.bind(opened));
    return opened;
  };
  for (const method of ["queryRaw", "executeRaw"] as const) {
    const run = adapter[method].bind(adapter) as (query: SqlQuery) => Promise<never>;
    adapter[method] = (async (query: SqlQuery) => (WRITE_STATEMENT.test(query.sql) ? withWriteGate(() => run(query)) : run(query))) as never;
  }
  return adapter;
}
