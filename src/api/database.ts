/**
 * Where route handlers get their Prisma client: the application's one client (src/db/client.ts), unless a
 * test has pointed the API at its own database file. The application client is imported lazily, so a
 * test that sets its own client never opens the default database (and never loads the `server-only`
 * marker, which throws outside the Next.js server).
 */
import type { PrismaClient } from "@/src/db/connect";

let testClient: PrismaClient | undefined;

/** Points every route handler at `client` (tests only); `undefined` goes back to the application client. */
export function setApiDatabaseForTests(client: PrismaClient | undefined): void {
  testClient = client;
}

export async function apiDatabase(): Promise<PrismaClient> {
  if (testClient !== undefined) return testClient;
  const { prisma } = await import("@/src/db/client");
  return prisma;
}
