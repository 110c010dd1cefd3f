/**
 * The application's Prisma client: one instance per server process.
 *
 * Outside production the instance is kept on `globalThis`, because Next.js dev mode re-evaluates modules on
 * every edit and would otherwise open a new SQLite connection each time. Scripts and tests, which run
 * outside the Next.js server, use `createPrismaClient` from `src/db/connect.ts` (no server-only marker).
 */
import "server-only";
import { environment } from "@/src/config/env";
import { createPrismaClient, type PrismaClient } from "@/src/db/connect";

const globalForPrisma = globalThis as typeof globalThis & { assignablePrisma?: PrismaClient };

const settings = environment();

export const prisma: PrismaClient = globalForPrisma.assignablePrisma ?? createPrismaClient(settings.databaseUrl);

if (settings.nodeEnv !== "production") {
  globalForPrisma.assignablePrisma = prisma;
}

export { createPrismaClient };
