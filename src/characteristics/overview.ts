/**
 * Loads the overview of every characteristic, grouped by process: the shell around the pure
 * summaries in ./summary.ts. Reads only the most recent OVERVIEW_POINT_COUNT subgroups per
 * characteristic, so the cost does not grow with the length of the history.
 */
import "server-only";
import type { PrismaClient } from "../db/connect";
import { groupByProcess, OVERVIEW_POINT_COUNT, type ProcessOverview } from "./summary";

export async function loadCharacteristicOverview(prisma: PrismaClient): Promise<ProcessOverview[]> {
  const characteristics = await prisma.characteristic.findMany({
    select: {
      id: true,
      name: true,
      unit: true,
      chartType: true,
      subgroupSize: true,
      safetyRelated: true,
      process: { select: { id: true, name: true, kind: true } },
      subgroups: {
        orderBy: { sequence: "desc" },
        take: OVERVIEW_POINT_COUNT,
        select: {
          sequence: true,
          timestamp: true,
          count: true,
          size: true,
          measurements: { select: { value: true } },
        },
      },
    },
  });
  return groupByProcess(characteristics);
}
