/**
 * Setting up a characteristic: what is measured, on which chart, against which specification and rules.
 * The chart type and subgroup size cannot change once subgroups are stored (the stored data and limits
 * would no longer fit); a changed rule set re-evaluates the stored signals, recorded as a re-evaluation.
 * Services take the Prisma client as their first argument (see DEVELOPERS.md, "Services and server-only").
 */
import { CHART_TYPES, type ChartType } from "@/shared/constants";
import type { TCharacteristicChange } from "@/shared/api";
import { ZCharacteristicInput, type TCharacteristicInput } from "@/shared/intake";
import type { z } from "zod";
import type { PrismaClient } from "@/src/db/connect";
import type { Prisma } from "@/src/db/generated/client";
import { AppError, parseInput } from "@/src/errors";
import { limitSetInForce } from "@/src/limits/query";
import { reevaluateWithin, REEVALUATION_TIMEOUT_MS } from "@/src/signals/reevaluate";

export type TCharacteristicInputFields = z.input<typeof ZCharacteristicInput>;

/** A stored chart type as the vocabulary type (the column is plain text). */
export function chartTypeOf(stored: string): ChartType {
  const chart = CHART_TYPES.find((candidate) => candidate === stored);
  if (chart === undefined) throw new Error(`Unknown chart type stored: ${stored}`);
  return chart;
}

const CHARACTERISTIC_VIEW = {
  id: true,
  processId: true,
  name: true,
  unit: true,
  chartType: true,
  subgroupSize: true,
  target: true,
  lowerSpecLimit: true,
  upperSpecLimit: true,
  ruleSet: true,
  safetyRelated: true,
  description: true,
  createdAt: true,
  process: { select: { id: true, name: true } },
} as const;

async function requireProcess(db: PrismaClient | Prisma.TransactionClient, processId: number): Promise<void> {
  if ((await db.process.count({ where: { id: processId } })) === 0) {
    throw new AppError("not-found", `Process ${processId} does not exist`, [{ path: "processId", message: "does not exist" }]);
  }
}

async function refuseDuplicateName(db: PrismaClient | Prisma.TransactionClient, input: TCharacteristicInput, exceptId?: number): Promise<void> {
  const existing = await db.characteristic.findFirst({
    where: { processId: input.processId, name: input.name, ...(exceptId === undefined ? {} : { id: { not: exceptId } }) },
    select: { id: true },
  });
  if (existing !== null) {
    throw new AppError("conflict", `This process already has a characteristic named "${input.name}"`, [
      { path: "name", message: "is already used on this process" },
    ]);
  }
}

function columnsOf(input: TCharacteristicInput) {
  return {
    processId: input.processId,
    name: input.name,
    unit: input.unit,
    chartType: input.chartType,
    subgroupSize: input.subgroupSize,
    target: input.target ?? null,
    lowerSpecLimit: input.lowerSpecLimit ?? null,
    upperSpecLimit: input.upperSpecLimit ?? null,
    ruleSet: input.ruleSet,
    safetyRelated: input.safetyRelated,
    description: input.description ?? null,
  };
}

export async function createCharacteristic(db: PrismaClient, input: TCharacteristicInputFields) {
  const parsed = parseInput(ZCharacteristicInput, input, "characteristic");
  await requireProcess(db, parsed.processId);
  await refuseDuplicateName(db, parsed);
  const { id } = await db.characteristic.create({ data: columnsOf(parsed), select: { id: true } });
  return getCharacteristic(db, id);
}

/** Replaces the settings; `now` and `changedBy` date and sign the re-evaluation a changed rule set causes. */
export async function updateCharacteristic(
  db: PrismaClient,
  id: number,
  input: TCharacteristicInputFields,
  options: { now: Date; changedBy: string } = { now: new Date(), changedBy: "characteristic settings" },
) {
  const parsed = parseInput(ZCharacteristicInput, input, "characteristic");
  // The checks, the new settings and the re-evaluation a changed rule set causes commit together: stored
  // signals never disagree with the rule set in force, and no other write slips in between.
  await db.$transaction(
    async (transaction) => {
      const current = await transaction.characteristic.findUnique({
        where: { id },
        select: { chartType: true, subgroupSize: true, processId: true, ruleSet: true, _count: { select: { subgroups: true } } },
      });
      if (current === null) throw new AppError("not-found", `Characteristic ${id} does not exist`);
      if (current._count.subgroups > 0) {
        const fixed = (["chartType", "subgroupSize", "processId"] as const).filter((field) => parsed[field] !== current[field]);
        if (fixed.length > 0) {
          throw new AppError(
            "conflict",
            `The ${fixed.join(", ")} cannot change once subgroups are stored (${current._count.subgroups} are); set up a new characteristic instead`,
            fixed.map((field) => ({ path: field, message: "cannot change once subgroups are stored" })),
          );
        }
      }
      await requireProcess(transaction, parsed.processId);
      await refuseDuplicateName(transaction, parsed, id);
      await transaction.characteristic.update({ where: { id }, data: columnsOf(parsed) });
      if (parsed.ruleSet !== current.ruleSet) {
        await reevaluateWithin(transaction, id, {
          trigger: "request",
          reason: `rule set changed from "${current.ruleSet}" to "${parsed.ruleSet}"`,
          requestedBy: options.changedBy,
          now: options.now,
        });
      }
    },
    { timeout: REEVALUATION_TIMEOUT_MS, maxWait: REEVALUATION_TIMEOUT_MS },
  );
  return getCharacteristic(db, id);
}

/**
 * Changes only the settings given: the others keep their stored values, and `null` clears an optional one;
 * the result is then checked whole, as on setup (`updateCharacteristic`).
 */
export async function changeCharacteristic(
  db: PrismaClient,
  id: number,
  changes: Omit<TCharacteristicChange, "changedBy">,
  options: { now: Date; changedBy: string },
) {
  const merged = { ...(await getCharacteristic(db, id)), ...changes };
  return updateCharacteristic(
    db,
    id,
    {
      processId: merged.processId,
      name: merged.name,
      unit: merged.unit,
      chartType: merged.chartType,
      subgroupSize: merged.subgroupSize,
      target: merged.target ?? undefined,
      lowerSpecLimit: merged.lowerSpecLimit ?? undefined,
      upperSpecLimit: merged.upperSpecLimit ?? undefined,
      ruleSet: merged.ruleSet,
      safetyRelated: merged.safetyRelated,
      description: merged.description ?? undefined,
    },
    options,
  );
}

/** The characteristic as a plain object, with its subgroup count and the limit set new points meet. */
export async function getCharacteristic(db: PrismaClient, id: number) {
  const characteristic = await db.characteristic.findUnique({ where: { id }, select: CHARACTERISTIC_VIEW });
  if (characteristic === null) throw new AppError("not-found", `Characteristic ${id} does not exist`);
  const subgroupCount = await db.subgroup.count({ where: { characteristicId: id } });
  const limitsInForce = await limitSetInForce(db, id, subgroupCount);
  return { ...characteristic, chartType: chartTypeOf(characteristic.chartType), subgroupCount, limitsInForce };
}
