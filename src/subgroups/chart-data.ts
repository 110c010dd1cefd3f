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
  const where = { characteristicId, sequence: Number.isFinite(to) ? { gte: from, lt: to } : { gte: from } };
  if (VARIABLES_CHART_TYPES.includes(chart)) {
    const rows = await db.subgroup.findMany({
      where,
      orderBy: { sequence: "asc" },
      select: { sequence: true, measurements: { orderBy: { position: "asc" }, select: { value: true } } },
    });
    if (rows.length === 0) return undefined;
    return {
      data: variablesData(rows.map((row) => row.measurements.map((measurement) => measurement.value))),
      sequences: rows.map((row) => row.sequence),
    };
  }
  const rows = await db.subgroup.findMany({ where, orderBy: { sequence: "asc" }, select: { sequence: true, count: true, size: true } });
  if (rows.length === 0) return undefined;
  return {
    data: attributesData(
      rows.map((row) => row.count ?? Number.NaN),
      rows.map((row) => row.size ?? 1),
    ),
    sequences: rows.map((row) => row.sequence),
  };
}
