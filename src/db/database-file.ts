/**
 * Checks, before anything else touches it, that the database file can be created, opened, read and
 * written, and explains in one paragraph what to do when it cannot. A damaged file or a bad path is a
 * situation the person starting the app must fix, not a bug, so it gets a message rather than a stack trace.
 */
import { mkdir, stat } from "node:fs/promises";
import path from "node:path";
import Database from "better-sqlite3";

/** The database file cannot be used; the message names the file and the way out. */
export class DatabaseFileError extends Error {
  override name = "DatabaseFileError";
}

const WAY_OUT = "or set DATABASE_URL to another file (for example DATABASE_URL=file:./data/assignable.db).";

function describeCode(code: string | undefined): string {
  switch (code) {
    case "SQLITE_NOTADB":
      return "it is not a SQLite database (it is damaged, or some other kind of file)";
    case "SQLITE_CORRUPT":
      return "the SQLite database in it is damaged";
    case "SQLITE_READONLY":
    case "SQLITE_PERM":
      return "it cannot be written (read-only file, directory or file system)";
    case "SQLITE_CANTOPEN":
      return "it cannot be opened or created there";
    case "SQLITE_BUSY":
    case "SQLITE_LOCKED":
      return "another process holds a lock on it";
    case "EACCES":
    case "EPERM":
    case "EROFS":
      return "its directory cannot be created or written (permission denied or read-only file system)";
    case "ENOTDIR":
    case "EEXIST":
      return "part of its directory path is an existing file, not a directory";
    case "EISDIR":
      return "it is a directory, not a file";
    case "ENOENT":
      return "its directory cannot be created (a parent directory does not exist and cannot be made)";
    default:
      return "it cannot be opened";
  }
}

function advice(code: string | undefined, databaseFile: string): string {
  switch (code) {
    case "SQLITE_NOTADB":
    case "SQLITE_CORRUPT":
      return `Move the file aside (or delete it, losing its data) and start again to get a fresh database with the demo plant, ${WAY_OUT}`;
    case "SQLITE_BUSY":
    case "SQLITE_LOCKED":
      return `Stop the other process using ${path.basename(databaseFile)} and try again, ${WAY_OUT}`;
    case "ENOTDIR":
    case "EEXIST":
    case "ENOENT":
    case "EISDIR":
      return `Choose a file path whose directories exist or can be created, ${WAY_OUT}`;
    default:
      return `Make that location writable for this user, ${WAY_OUT}`;
  }
}

/**
 * Creates `directory` and its missing parents one level at a time. (Node's recursive mkdir never returns
 * under some virtual file systems such as /proc; this fails there with the first level's error instead.)
 */
async function createDirectory(directory: string): Promise<void> {
  const missing: string[] = [];
  let current = directory;
  for (;;) {
    const existing = await stat(current).catch((error: NodeJS.ErrnoException) => {
      if (error.code === "ENOENT") return undefined;
      throw error;
    });
    if (existing !== undefined) {
      if (!existing.isDirectory()) throw Object.assign(new Error(`${current} is a file`), { code: "ENOTDIR" });
      break;
    }
    missing.unshift(current);
    const parent = path.dirname(current);
    if (parent === current) break;
    current = parent;
  }
  for (const level of missing) await mkdir(level);
}

/** A one-paragraph explanation of why `databaseFile` cannot be used, from a Node or SQLite error. */
export function explainDatabaseFileProblem(databaseFile: string, error: unknown): DatabaseFileError {
  const code = (error as { code?: unknown } | null)?.code;
  const codeText = typeof code === "string" ? code : undefined;
  const reason = error instanceof Error ? error.message : String(error);
  return new DatabaseFileError(
    `Cannot use the database file ${databaseFile}: ${describeCode(codeText)} (${reason}). ${advice(codeText, databaseFile)}`,
    { cause: error },
  );
}

/**
 * Creates the directory if needed, then opens the file (creating an empty database when missing), checks
 * its integrity and that a write lock can be taken. Throws DatabaseFileError; leaves existing data untouched.
 */
export async function checkDatabaseFile(databaseFile: string): Promise<void> {
  try {
    await createDirectory(path.dirname(databaseFile));
    if ((await stat(databaseFile).catch(() => undefined))?.isDirectory()) {
      throw Object.assign(new Error(`${databaseFile} is a directory`), { code: "EISDIR" });
    }
    const database = new Database(databaseFile);
    try {
      const integrity = database.pragma("quick_check", { simple: true });
      if (integrity !== "ok") {
        throw Object.assign(new Error(`integrity check reported: ${String(integrity)}`), { code: "SQLITE_CORRUPT" });
      }
      // Taking the write lock and rolling back proves the file is writable without changing it.
      database.exec("BEGIN IMMEDIATE; CREATE TABLE assignable_write_check (id INTEGER); ROLLBACK;");
    } finally {
      database.close();
    }
  } catch (error) {
    throw explainDatabaseFileProblem(databaseFile, error);
  }
}
