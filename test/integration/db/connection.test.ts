// Every Prisma client connection runs in WAL mode with the busy timeout and foreign keys on.
import path from "node:path";
import { describe, expect, test } from "vitest";
import { createPrismaClient } from "@/src/db/connect";
import { applyMigrations } from "@/src/db/migrations/apply-migrations";
import { BUSY_TIMEOUT_MS } from "@/src/db/sqlite-adapter";
import { registerTemporaryDirectories } from "@/test/integration/db/temporary-directory";

const temporaryDirectory = registerTemporaryDirectories();

describe("Prisma client connection", () => {
  test("WAL journal, busy timeout and foreign keys are in effect", async () => {
    const databaseFile = path.join(temporaryDirectory("connection"), "assignable.db");
    await applyMigrations({ databaseFile });
    const prisma = createPrismaClient(`file:${databaseFile}`);
    try {
      const [journal] = await prisma.$queryRawUnsafe<{ journal_mode: string }[]>("PRAGMA journal_mode");
      const [timeout] = await prisma.$queryRawUnsafe<{ timeout: bigint }[]>("PRAGMA busy_timeout");
      const [foreignKeys] = await prisma.$queryRawUnsafe<{ foreign_keys: bigint }[]>("PRAGMA foreign_keys");
      expect(journal?.journal_mode).toBe("wal");
      expect(Number(timeout?.timeout)).toBe(BUSY_TIMEOUT_MS);
      expect(BUSY_TIMEOUT_MS).toBeGreaterThan(0);
      expect(Number(foreignKeys?.foreign_keys)).toBe(1);

      // Foreign keys are enforced, not merely declared: an area of a missing site is refused.
      await expect(prisma.area.create({ data: { siteId: 999_999, name: "nowhere" } })).rejects.toThrow();
      // And deleting a site cascades to its areas.
      const site = await prisma.site.create({ data: { name: "test site", areas: { create: { name: "hall" } } } });
      await prisma.site.delete({ where: { id: site.id } });
      expect(await prisma.area.count({ where: { siteId: site.id } })).toBe(0);
    } finally {
      await prisma.$disconnect();
    }
  });
});
