/**
 * Creating Prisma clients, without the `server-only` marker.
 *
 * App code imports `prisma` from `src/db/client.ts`, which carries `import "server-only"` so that a
 * browser component importing the database fails the build. That marker throws outside the Next.js server
 * runtime, so scripts (`scripts/db-*.ts`, the CLI) and tests import `createPrismaClient` from here instead.
 */
import { databaseFileFromUrl } from "@/src/config/env";
import { PrismaClient } from "@/src/db/generated/client";
import { createSqliteAdapterFactory } from "@/src/db/sqlite-adapter";

/**
 * A new Prisma client on the SQLite file named by a `file:` URL (relative paths from the working
 * directory), with WAL, busy timeout and foreign keys set on every connection. Call `$disconnect()` when done.
 */
export function createPrismaClient(url: string): PrismaClient {
  return new PrismaClient({ adapter: createSqliteAdapterFactory(databaseFileFromUrl(url)) });
}

export type { PrismaClient };
