// CSV import into one characteristic: thin server page (load the characteristic, render the workflow).
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { getCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { ImportForm } from "./import-form";

export const dynamic = "force-dynamic";

const ZParams = z.object({ id: z.coerce.number().int().positive() });

async function load(id: number) {
  try {
    return await getCharacteristic(prisma, id);
  } catch (error) {
    if (isAppError(error) && error.code === "not-found") notFound();
    throw error;
  }
}

export default async function ImportPage({ params }: { params: Promise<{ id: string }> }) {
  const parsed = ZParams.safeParse(await params);
  if (!parsed.success) notFound();
  const characteristic = await load(parsed.data.id);
  const size = characteristic.subgroupSize === 1 ? "one value per point" : `subgroups of ${characteristic.subgroupSize}`;
  return (
    <>
      <p>
        <Link href={`/characteristics/${characteristic.id}`}>Back to the chart of {characteristic.name}</Link>
      </p>
      <h1>Import readings: {characteristic.name}</h1>
      <p>
        {characteristic.chartType} chart, {size}, in {characteristic.unit}. {characteristic.subgroupCount.toLocaleString("en")} points stored. A file is
        imported whole or not at all unless you choose to keep only its valid rows; importing the same file again adds nothing.
      </p>
      <ImportForm
        characteristic={{ id: characteristic.id, name: characteristic.name, chartType: characteristic.chartType, subgroupSize: characteristic.subgroupSize }}
      />
    </>
  );
}
