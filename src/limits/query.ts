/** Reading limit versions: all of a characteristic's, and the one in force for a point. */
import type { PrismaClient } from "@/src/db/connect";
import { limitSegments, segmentAt } from "./segments";

const LIMIT_SET_VIEW = {
  id: true,
  characteristicId: true,
  version: true,
  center: true,
  sigma: true,
  subgroupSize: true,
  ewmaLambda: true,
  ewmaWidth: true,
  cusumK: true,
  cusumH: true,
  baselineStart: true,
  baselineEnd: true,
  baselineUsed: true,
  appliesFrom: true,
  reason: true,
  approvedBy: true,
  createdAt: true,
  exclusions: { orderBy: { sequence: "asc" }, select: { sequence: true, reason: true } },
} as const;

export type TLimitSetView = Awaited<ReturnType<typeof readLimitSets>>[number];

async function readLimitSets(db: PrismaClient, characteristicId: number) {
  return db.limitSet.findMany({ where: { characteristicId }, orderBy: { version: "asc" }, select: LIMIT_SET_VIEW });
}

/**
 * Every version, oldest first, each with the points it applies to: `appliesTo` is [from, to) in sequences
 * (`to` null while it is the version new points join), or null when later versions supersede it everywhere.
 */
export async function limitSetsFor(db: PrismaClient, characteristicId: number) {
  const limitSets = await readLimitSets(db, characteristicId);
  const segments = limitSegments(limitSets);
  return limitSets.map((limitSet) => {
    const segment = segments.find((candidate) => candidate.limitSet.id === limitSet.id);
    return {
      ...limitSet,
      appliesTo: segment === undefined ? null : { from: segment.from, to: Number.isFinite(segment.to) ? segment.to : null },
    };
  });
}

/** The version in force for the point at `sequence` (the next point's, for any sequence at or after the end). */
export async function limitSetInForce(db: PrismaClient, characteristicId: number, sequence: number): Promise<TLimitSetView | null> {
  return segmentAt(limitSegments(await readLimitSets(db, characteristicId)), sequence)?.limitSet ?? null;
}
