import Link from "next/link";
import { connection } from "next/server";
import { CharacteristicCard } from "@/src/components/characteristic-card";
import { loadCharacteristicOverview } from "@/src/characteristics/overview";
import { prisma } from "@/src/db/client";

export default async function OverviewPage() {
  // Read the database for every request, never once at build time.
  await connection();
  const processes = await loadCharacteristicOverview(prisma);
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
                  <CharacteristicCard characteristic={characteristic} />
                </li>
              ))}
            </ul>
          </section>
        ))
      )}
    </>
  );
}
