/**
 * The process event log: lot changes, maintenance, setting changes, operator and shift changes,
 * calibrations and environment readings, each with a time, a kind, an optional cause category, free text
 * and, for readings, a value with its unit. Charts show them as markers.
 */
import { ZEventInput } from "@/shared/intake";
import type { z } from "zod";
import type { PrismaClient } from "@/src/db/connect";
import { AppError, parseInput } from "@/src/errors";

export type TEventFields = z.input<typeof ZEventInput>;

const EVENT_VIEW = {
  id: true,
  processId: true,
  occurredAt: true,
  kind: true,
  causeCategory: true,
  description: true,
  value: true,
  unit: true,
  createdAt: true,
} as const;

async function requireProcess(db: PrismaClient, processId: number): Promise<void> {
  if ((await db.process.count({ where: { id: processId } })) === 0) {
    throw new AppError("not-found", `Process ${processId} does not exist`);
  }
}

export async function recordEvent(db: PrismaClient, processId: number, input: TEventFields, now: Date) {
  const event = parseInput(ZEventInput, input, "process event");
  await requireProcess(db, processId);
  return db.processEvent.create({
    data: {
      processId,
      occurredAt: new Date(event.occurredAt),
      kind: event.kind,
      causeCategory: event.causeCategory ?? null,
      description: event.description,
      value: event.value ?? null,
      unit: event.unit ?? null,
      createdAt: now,
    },
    select: EVENT_VIEW,
  });
}

/** Events of a process in time order, optionally between two instants (both inclusive). */
export async function eventsFor(db: PrismaClient, processId: number, range: { from?: Date; to?: Date } = {}) {
  await requireProcess(db, processId);
  return db.processEvent.findMany({
    where: {
      processId,
      ...(range.from === undefined && range.to === undefined ? {} : { occurredAt: { gte: range.from, lte: range.to } }),
    },
    orderBy: [{ occurredAt: "asc" }, { id: "asc" }],
    select: EVENT_VIEW,
  });
}
