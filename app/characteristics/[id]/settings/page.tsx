// Settings of one characteristic: its setup, and a new limit version computed from a baseline.
import Link from "next/link";
import { connection } from "next/server";
import { SAFETY_CAUTION } from "@/shared/constants";
import { prisma } from "@/src/db/client";
import { findCharacteristic } from "../../find-characteristic";
import { SetupForm } from "../../setup-form";
import { reviseFromForm, updateFromForm } from "./actions";
import { LimitRevisionForm } from "./limit-form";
import "../../characteristics.css";

export default async function SettingsPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const characteristic = await findCharacteristic(params);
  const processes = await prisma.process.findMany({ select: { id: true, name: true }, orderBy: { name: "asc" } });
  const limits = characteristic.limitsInForce;
  return (
    <>
      <p className="breadcrumb">
        <Link href={`/characteristics/${characteristic.id}`}>Back to the chart of {characteristic.name}</Link>
      </p>
      <h1>Settings and limits: {characteristic.name}</h1>
      {characteristic.safetyRelated && <p className="caution">{SAFETY_CAUTION}</p>}
      <h2 id="limits-heading">New limit version</h2>
      <p>
        {limits === null ? "No limits yet." : `Version ${limits.version} is in force.`} A new version is computed from the baseline subgroups
        with the chart&apos;s published method, frozen, and applies from the baseline&apos;s first subgroup on; stored signals are re-evaluated.
        It needs a reason and who approved it.
      </p>
      <LimitRevisionForm
        action={reviseFromForm.bind(null, characteristic.id)}
        lastSequence={characteristic.subgroupCount > 0 ? characteristic.subgroupCount - 1 : null}
      />
      <h2 id="setup-heading">Setup</h2>
      <p>Chart type, subgroup size and process cannot change once subgroups are stored.</p>
      <SetupForm
        action={updateFromForm.bind(null, characteristic.id)}
        processes={processes}
        values={characteristic}
        submitLabel="Save settings"
      />
    </>
  );
}
