/**
 * The SQLite driver adapter factory shared by the app's Prisma client and the migration engine.
 *
 * Every connection to the database file gets the same settings on opening:
 * - WAL journal mode, so the web server's readers do not block behind a writer (the seed, live input);
 * - a busy timeout, so a writer waits for a lock instead of failing at once with SQLITE_BUSY;
 * - foreign keys on, so the `onDelete: Cascade` relations of the schema are enforced.
 * The Prisma adapter has no hook for connection pragmas, hence this thin wrapper around its factory.
 */
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import type { SqlDriverAdapter, SqlMigrationAwareDriverAdapterFactory } from "@prisma/driver-adapter-utils";

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
      return adapter;
    },
    // The shadow database is an in-memory scratch copy used to replay migrations: no WAL there.
    connectToShadowDb: () => inner.connectToShadowDb(),
  };
}
