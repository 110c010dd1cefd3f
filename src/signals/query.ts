/** Reading stored signals: those of a characteristic touching a range of sequences, in order. */
import type { PrismaClient } from "@/src/db/connect";
import { AppError } from "@/src/errors";
import { SIGNAL_VIEW, toSignalView, type TSignalView } from "./rows";

export async function signalsFor(
  db: PrismaClient,
  characteristicId: number,
  range: { from?: number; to?: number } = {},
): Promise<TSignalView[]> {
  if ((await db.characteristic.count({ where: { id: characteristicId } })) === 0) {
    throw new AppError("not-found", `Characteristic ${characteristicId} does not exist`);
  }
  const rows = await db.signal.findMany({
    where: {
      characteristicId,
      // A signal touches [from, to] when it ends at or after `from` and starts at or before `to`.
      ...(range.from === undefined ? {} : { endSequence: { gte: range.from } }),
      ...(range.to === undefined ? {} : { startSequence: { lte: range.to } }),
    },
    orderBy: [{ startSequence: "asc" }, { id: "asc" }],
    select: SIGNAL_VIEW,
  });
  return rows.map(toSignalView);
}
