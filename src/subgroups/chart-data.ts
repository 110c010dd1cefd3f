/**
 * Reading stored subgroups back as the engine's ChartData (measurements or counts), for Phase I
 * estimates and batch re-evaluation, which need the recorded values themselves.
 */
import { VARIABLES_CHART_TYPES, type ChartType } from "@/shared/constants";
import type { Prisma } from "@/src/db/generated/client";
import { attributesData, variablesData } from "@/src/spc/data";
import type { ChartData } from "@/src/spc/types";

export interface TStoredRange {
  readonly data: ChartData;
  /** Sequence of each subgroup read, in order. */
  readonly sequences: readonly number[];
}

/** Subgroups with sequence in [from, to) (`to` may be Infinity), in order; undefined when there are none. */
export async function readChartData(
  db: Prisma.TransactionClient,
  characteristicId: number,
  chart: ChartType,
  from: number,
  to: number,
): Promise<TStoredRange | undefined> {
  const end = Number.isFinite(to) ? to : Number.MAX_SAFE_INTEGER;
  if (VARIABLES_CHART_TYPES.includes(chart)) {
    // One joined query: Prisma's relation loading binds every subgroup id and exceeds SQLite's parameter limit.
    const rows = await db.$queryRawUnsafe<{ sequence: number | bigint; value: number }[]>(
      `SELECT s."sequence" AS "sequence", m."value" AS "value" FROM "Subgroup" s JOIN "Measurement" m ON m."subgroupId" = s."id" ` +
        `WHERE s."characteristicId" = ? AND s."sequence" >= ? AND s."sequence" < ? ORDER BY s."sequence", m."position"`,
      characteristicId,
      from,
      end,
    );
    if (rows.length === 0) return undefined;
    const sequences: number[] = [];
    const subgroups: number[][] = [];
    for (const row of rows) {
      const sequence = Number(row.sequence);
      if (sequences.at(-1) !== sequence) {
        sequences.push(sequence);
        subgroups.push([]);
      }
      subgroups.at(-1)!.push(row.value);
    }
    return { data: variablesData(subgroups), sequences };
  }
  const rows = await db.subgroup.findMany({
    where: { characteristicId, sequence: { gte: from, lt: end } },
    orderBy: { sequence: "asc" },
    select: { sequence: true, count: true, size: true },
  });
  if (rows.length === 0) return undefined;
  return {
    data: attributesData(
      rows.map((row) => row.count ?? Number.NaN),
      rows.map((row) => row.size ?? 1),
    ),
    sequences: rows.map((row) => row.sequence),
  };
}
