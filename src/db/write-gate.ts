/**
 * One writer at a time in this process, queued without blocking the event loop.
 *
 * SQLite lets one connection write at a time. The server writes through two connections: Prisma's, and
 * the CSV import's raw connection, whose one transaction stays open across the awaits of a streamed file.
 * A connection that meets the other's lock can only wait synchronously (SQLite's busy timeout), which
 * stops the event loop and with it the holder of the lock, so the wait always ends in SQLITE_BUSY; a
 * Prisma transaction that has already read fails at once. So every writer of the process passes this gate
 * first (Prisma's transactions and writes through src/db/sqlite-adapter.ts, the import in
 * src/imports/import-csv.ts) and waits its turn asynchronously, in arrival order. Writers in other
 * processes are still met by the busy timeout.
 */
import { AppError } from "@/src/errors";

/** How long a writer waits for its turn before giving up with a "busy" AppError (a large import takes seconds). */
export const WRITE_GATE_TIMEOUT_MS = 30_000;

let last: Promise<void> = Promise.resolve();

/**
 * Waits for this writer's turn and returns the function that ends it (call it exactly once, when the
 * writer has committed or rolled back). Throws a "busy" AppError after `timeoutMs`; the writers after it
 * keep their places.
 */
export async function enterWriteGate(timeoutMs = WRITE_GATE_TIMEOUT_MS): Promise<() => void> {
  const before = last;
  let leave!: () => void;
  const turn = new Promise<void>((resolve) => (leave = resolve));
  last = before.then(() => turn);
  let timer: NodeJS.Timeout | undefined;
  const waited = await Promise.race([
    before.then(() => true),
    new Promise<false>((resolve) => (timer = setTimeout(() => resolve(false), timeoutMs))),
  ]);
  clearTimeout(timer);
  if (!waited) {
    // Give the turn up as soon as it comes, so that the writers queued behind this one are not held.
    void before.then(leave);
    throw new AppError("busy", `The database is busy with another change (a large import takes seconds); nothing was written: try again in a moment`);
  }
  return leave;
}

/** Runs `work` in this writer's turn. */
export async function withWriteGate<T>(work: () => Promise<T>, timeoutMs = WRITE_GATE_TIMEOUT_MS): Promise<T> {
  const leave = await enterWriteGate(timeoutMs);
  try {
    return await work();
  } finally {
    leave();
  }
}
