// CSV import into one characteristic: thin server page (load the characteristic, render the workflow).
import Link from "next/link";
import { connection } from "next/server";
import { prisma } from "@/src/db/client";
import { zoneOfProcess } from "@/src/sites/zone";
import { findCharacteristic } from "../../find-characteristic";
import { ImportForm } from "./import-form";

export default async function ImportPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const characteristic = await findCharacteristic(params);
  const zone = await zoneOfProcess(prisma, characteristic.processId);
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
        zone={zone}
      />
    </>
  );
}
