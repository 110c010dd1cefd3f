/**
 * The web server's read-only connection for chart data: a raw better-sqlite3 connection to the same file
 * as the Prisma client (WAL: it reads committed data while others write), kept on `globalThis` so dev-mode
 * reloads do not open one per edit.
 */
import "server-only";
import Database from "better-sqlite3";
import { environment } from "@/src/config/env";
import { BUSY_TIMEOUT_MS } from "@/src/db/sqlite-adapter";

const globalForChart = globalThis as typeof globalThis & { assignableChartDatabase?: Database.Database };

export function chartDatabase(): Database.Database {
  if (globalForChart.assignableChartDatabase === undefined) {
    const database = new Database(environment().databaseFile, { readonly: true, fileMustExist: true, timeout: BUSY_TIMEOUT_MS });
    globalForChart.assignableChartDatabase = database;
  }
  return globalForChart.assignableChartDatabase;
}
