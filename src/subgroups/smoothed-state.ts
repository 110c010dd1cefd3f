/**
 * The cached EWMA and CUSUM state on each subgroup row (see prisma/schema.prisma): written by batch
 * re-evaluation for whole segments and by live detection for new points. Values go in as bound
 * parameters, so the stored doubles are exactly the computed ones (live detection continues from them).
 */
import type { Prisma } from "@/src/db/generated/client";
import type { StatisticSeries } from "@/src/spc/types";

/** Rows per UPDATE: two bound values per row, well under SQLite's parameter limit. */
const ROWS_PER_STATEMENT = 400;

export async function clearSmoothedState(transaction: Prisma.TransactionClient, characteristicId: number): Promise<void> {
  await transaction.subgroup.updateMany({ where: { characteristicId }, data: { ewma: null, cusumUpper: null, cusumLower: null } });
}

const COLUMN_OF = { ewma: "ewma", "cusum-upper": "cusumUpper", "cusum-lower": "cusumLower" } as const;

/** Stores the smoothed statistics of a segment whose first point has sequence `from`. */
export async function writeSmoothedState(
  transaction: Prisma.TransactionClient,
  characteristicId: number,
  from: number,
  statistics: readonly StatisticSeries[],
): Promise<void> {
  for (const series of statistics) {
    if (!(series.key in COLUMN_OF)) continue;
    const column = COLUMN_OF[series.key as keyof typeof COLUMN_OF];
    for (let first = 0; first < series.points.length; first += ROWS_PER_STATEMENT) {
      const last = Math.min(series.points.length, first + ROWS_PER_STATEMENT);
      const cases: string[] = [];
      const values: number[] = [];
      for (let index = first; index < last; index++) {
        cases.push("WHEN ? THEN ?");
        values.push(from + index, series.points[index]!);
      }
      await transaction.$executeRawUnsafe(
        `UPDATE "Subgroup" SET "${column}" = CASE "sequence" ${cases.join(" ")} END ` +
          `WHERE "characteristicId" = ? AND "sequence" >= ? AND "sequence" < ?`,
        ...values,
        characteristicId,
        from + first,
        from + last,
      );
    }
  }
}
