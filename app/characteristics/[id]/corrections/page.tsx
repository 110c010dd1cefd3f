// Correcting a recorded value: the form, its answer in words, and every correction of this characteristic
// (newest first) with the value as recorded, who corrected it, when and why.
import Link from "next/link";
import { connection } from "next/server";
import { VARIABLES_CHART_TYPES } from "@/shared/constants";
import { formatTime } from "@/src/components/format";
import { prisma } from "@/src/db/client";
import { zoneOfProcess } from "@/src/sites/zone";
import { correctionsFor } from "@/src/subgroups";
import { findCharacteristic } from "../../find-characteristic";
import { correctFromForm } from "./actions";
import { CorrectionForm } from "./correction-form";
import "../../characteristics.css";

export default async function CorrectionsPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const characteristic = await findCharacteristic(params);
  const [stored, zone] = await Promise.all([correctionsFor(prisma, characteristic.id), zoneOfProcess(prisma, characteristic.processId)]);
  const corrections = stored.reverse();
  const variables = VARIABLES_CHART_TYPES.includes(characteristic.chartType);
  return (
    <>
      <p className="breadcrumb">
        <Link href={`/characteristics/${characteristic.id}`}>Back to the chart of {characteristic.name}</Link>
      </p>
      <h1>Correct a recorded value: {characteristic.name}</h1>
      <p>
        For a recording mistake only (a misread gauge, a mistyped digit). The value as recorded stays on record with who corrected it, when
        and why, and the signals of the whole chart are evaluated again.
      </p>
      <CorrectionForm
        action={correctFromForm.bind(null, characteristic.id)}
        chartType={characteristic.chartType}
        variables={variables}
        subgroupSize={characteristic.subgroupSize}
        unit={characteristic.unit}
        lastSequence={characteristic.subgroupCount > 0 ? characteristic.subgroupCount - 1 : null}
      />

      <h2 id="corrections-heading">Corrections</h2>
      {corrections.length === 0 ? (
        <p>No value of {characteristic.name} has been corrected.</p>
      ) : (
        <div className="table-scroll">
          <table aria-labelledby="corrections-heading" className="data-table">
            <thead>
              <tr>
                <th scope="col">Subgroup</th>
                <th scope="col">{variables ? "Value" : "Field"}</th>
                <th scope="col">Replaced → corrected</th>
                <th scope="col">Reason</th>
                <th scope="col">Corrected by</th>
                <th scope="col">When</th>
              </tr>
            </thead>
            <tbody>
              {corrections.map((correction) => (
                <tr key={correction.id}>
                  <th scope="row">{correction.sequence}</th>
                  <td>{correction.position === null ? correction.field : `value ${correction.position + 1}`}</td>
                  <td>
                    {correction.originalValue} → {correction.correctedValue}
                  </td>
                  <td>{correction.reason}</td>
                  <td>{correction.correctedBy}</td>
                  <td>
                    <time dateTime={correction.correctedAt.toISOString()}>{formatTime(correction.correctedAt.toISOString(), zone)}</time>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
