// Manual entry of one subgroup at the press: the form, and at once the verdict.
import Link from "next/link";
import { connection } from "next/server";
import { SAFETY_CAUTION } from "@/shared/constants";
import { wallClockText } from "@/src/time/local-time";
import { prisma } from "@/src/db/client";
import { zoneOfProcess } from "@/src/sites/zone";
import { findCharacteristic } from "../../find-characteristic";
import { EntryForm } from "./entry-form";
import "../../characteristics.css";

export default async function EntryPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const characteristic = await findCharacteristic(params);
  const zone = await zoneOfProcess(prisma, characteristic.processId);
  const limits = characteristic.limitsInForce;
  return (
    <>
      <p className="breadcrumb">
        <Link href={`/characteristics/${characteristic.id}`}>Back to the chart of {characteristic.name}</Link>
      </p>
      <h1>Enter a subgroup: {characteristic.name}</h1>
      <p>
        {limits === null
          ? "No control limits yet: the subgroup is stored without a verdict."
          : `Checked at once against limit version ${limits.version} with the rules ${characteristic.ruleSet}.`}
      </p>
      {characteristic.safetyRelated && <p className="caution">{SAFETY_CAUTION}</p>}
      <EntryForm
        characteristicId={characteristic.id}
        chartType={characteristic.chartType}
        subgroupSize={characteristic.subgroupSize}
        unit={characteristic.unit}
        zone={zone}
        defaultTime={wallClockText(new Date(), zone)}
      />
    </>
  );
}
