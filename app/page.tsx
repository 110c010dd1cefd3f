import Link from "next/link";
import { TIME_ZONES } from "@/shared/intake";
import { connection } from "next/server";
import { CharacteristicCard } from "@/src/components/characteristic-card";
import { loadCharacteristicOverview } from "@/src/characteristics/overview";
import { prisma } from "@/src/db/client";
import { siteZones } from "@/src/sites/zone";
import { SiteZoneForm } from "./site-zone-form";
import "./characteristics/characteristics.css";

export default async function OverviewPage() {
  // Read the database for every request, never once at build time.
  await connection();
  const [processes, sites] = await Promise.all([loadCharacteristicOverview(prisma), siteZones(prisma)]);
  const zoneOf = (processId: number) => sites.find((site) => site.processIds.includes(processId))?.zone ?? "UTC";
  return (
    <>
      <h1>Characteristics</h1>
      {processes.length > 0 && (
        <p>
          <Link href="/characteristics/new">Set up a new characteristic</Link>
        </p>
      )}
      {processes.length === 0 ? (
        <section className="empty-state" aria-labelledby="empty-heading">
          <h2 id="empty-heading">No characteristics recorded yet</h2>
          <p>
            Characteristics appear here with their latest value and recent trend once they are recorded. To
            look around with invented data, load the demo plant with <code>npm run db:seed</code>.
          </p>
        </section>
      ) : (
        processes.map((process) => (
          <section key={process.id} className="process" aria-labelledby={`process-${process.id}`}>
            <h2 id={`process-${process.id}`}>
              {process.name} <span className="process-kind">{process.kind}</span>
            </h2>
            <ul className="cards">
              {process.characteristics.map((characteristic) => (
                <li key={characteristic.id}>
                  <CharacteristicCard characteristic={characteristic} zone={zoneOf(process.id)} />
                </li>
              ))}
            </ul>
          </section>
        ))
      )}
      {sites.length > 0 && <SiteZoneForm sites={sites.map(({ id, name, zone }) => ({ id, name, zone }))} zones={TIME_ZONES} />}
    </>
  );
}
