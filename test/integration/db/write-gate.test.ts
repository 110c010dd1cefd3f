// Writers of one process while the CSV import holds the database's write lock: a line system's post
// (a Prisma transaction) and a process event (one autocommit write) wait their turn at the write gate and
// succeed once the import has committed, instead of failing with SQLITE_BUSY; the gate itself serves
// writers in arrival order and lets a writer give up without holding up the others.
import { describe, expect, test } from "vitest";
import { EVENT_KINDS } from "@/shared/constants";
import { enterWriteGate } from "@/src/db/write-gate";
import { recordEvent } from "@/src/events/record";
import { importCsv } from "@/src/imports/import-csv";
import { appendSubgroups } from "@/src/subgroups/append";
import { chunked, createTestCharacteristic, NOW, openImportTestDatabase } from "../imports/harness";

const harness = openImportTestDatabase("write-gate");

/** Chunks handed over one event-loop turn apart, as a file or network stream hands them over. */
async function* slowly(chunks: AsyncIterable<Uint8Array>): AsyncGenerator<Uint8Array> {
  for await (const chunk of chunks) {
    await new Promise((resolve) => setImmediate(resolve));
    yield chunk;
  }
}

/** An individuals file of `count` rows, one minute apart. */
function readings(count: number): Uint8Array {
  const rows = Array.from({ length: count }, (_, index) => `${new Date(Date.UTC(2026, 5, 1) + index * 60_000).toISOString()},${(18 + (index % 50) / 100).toFixed(2)}`);
  return new TextEncoder().encode(["timestamp,value", ...rows].join("\n"));
}

describe("the write gate", () => {
  test("a post and an event made during an import wait for its commit and are both stored", async () => {
    const imported = await createTestCharacteristic(harness.prisma, "imr", 1);
    const posted = await createTestCharacteristic(harness.prisma, "imr", 1);
    const { processId } = await harness.prisma.characteristic.findUniqueOrThrow({ where: { id: posted }, select: { processId: true } });
    // Whether the import's transaction was still open when each other writer finished.
    const duringImport: Record<string, boolean> = {};
    // Small chunks, one event-loop turn apart: the import holds the lock across many turns, as an upload does.
    const importing = importCsv(harness.prisma, harness.sqlite, {
      characteristicId: imported,
      source: slowly(chunked(readings(5_000), 4_096)),
      options: { fileName: "readings.csv", mapping: { timestamp: "timestamp", value: "value" } },
      now: NOW,
    });
    // The others start once the import has opened its transaction.
    while (!harness.sqlite.inTransaction) await new Promise((resolve) => setImmediate(resolve));
    expect(harness.sqlite.inTransaction).toBe(true);
    const [result, post, event] = await Promise.all([
      importing,
      appendSubgroups(harness.prisma, posted, [{ timestamp: "2026-06-01T00:00:00Z", values: [18.1] }], { source: "api", now: NOW }).then((answer) => {
        duringImport.post = harness.sqlite.inTransaction;
        return answer;
      }),
      recordEvent(harness.prisma, processId, { occurredAt: "2026-06-01T00:00:00Z", kind: EVENT_KINDS[0], description: "Lot change during the import" }, NOW).then((answer) => {
        duringImport.event = harness.sqlite.inTransaction;
        return answer;
      }),
    ]);
    expect(result).toMatchObject({ status: "imported", subgroupsAdded: 5_000 });
    expect(post.stored).toHaveLength(1);
    expect(event.description).toBe("Lot change during the import");
    expect(duringImport).toEqual({ post: false, event: false });
    expect(await harness.prisma.subgroup.count({ where: { characteristicId: imported } })).toBe(5_000);
  });

  test("a writer that waits too long gives up with a busy error and does not hold up the writers behind it", async () => {
    const leaveFirst = await enterWriteGate();
    await expect(enterWriteGate(30)).rejects.toMatchObject({ name: "AppError", code: "busy" });
    const third = enterWriteGate(5_000);
    leaveFirst();
    const leaveThird = await third;
    leaveThird();
  });

  test("turns are given in arrival order", async () => {
    const leaveFirst = await enterWriteGate();
    const served: number[] = [];
    const waiting = [1, 2, 3].map((writer) =>
      enterWriteGate().then((leave) => {
        served.push(writer);
        leave();
      }),
    );
    leaveFirst();
    await Promise.all(waiting);
    expect(served).toEqual([1, 2, 3]);
  });
});
