/**
 * Limit set v1 for every demo characteristic, from a documented baseline window, and the stored signals
 * of the demo history (a recorded re-evaluation, through the same services the app uses).
 *
 * Baseline: subgroups 0–99 (about eleven days at three checks per shift). Every planted disturbance starts
 * later (the earliest, the heater drift, at 380; ./plant.ts), and the first dew-point excursion comes
 * before subgroup 250, so the window holds in-control data only; 100 subgroups is well above the 20–25
 * that common practice asks for.
 */
import type { PrismaClient } from "@/src/db/connect";
import { reviseLimits } from "@/src/limits/revise";

export const DEMO_BASELINE = { start: 0, end: 100 } as const;

export const DEMO_LIMITS_REASON =
  "Initial limits from the first 100 subgroups, an in-control stretch before any known disturbance";
/** A role, not a person: demo data name no one. */
export const DEMO_LIMITS_APPROVER = "Quality engineer (demo)";

/** Freezes v1 for each characteristic of the given ids; each revision re-evaluates its signals. */
export async function seedDemoLimits(prisma: PrismaClient, characteristicIds: readonly number[], now: Date): Promise<{ limitSets: number; signals: number }> {
  let signals = 0;
  for (const characteristicId of characteristicIds) {
    await reviseLimits(
      prisma,
      characteristicId,
      { baselineStart: DEMO_BASELINE.start, baselineEnd: DEMO_BASELINE.end, reason: DEMO_LIMITS_REASON, approvedBy: DEMO_LIMITS_APPROVER },
      now,
    );
    signals += await prisma.signal.count({ where: { characteristicId } });
  }
  return { limitSets: characteristicIds.length, signals };
}
