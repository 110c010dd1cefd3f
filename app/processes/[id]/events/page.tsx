// The event log of one process: every event, newest first, and a form to record one.
import Link from "next/link";
import { notFound } from "next/navigation";
import { connection } from "next/server";
import { ZIdParams } from "@/shared/api";
import { EVENT_KIND_LABELS, type EventKind } from "@/shared/constants";
import { formatTime, formatValue } from "@/src/components/format";
import { wallClockText } from "@/src/time/local-time";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";
import { eventsFor } from "@/src/events";
import { zoneOfProcess } from "@/src/sites/zone";
import { EventForm } from "./event-form";
import "../../../characteristics/characteristics.css";

export default async function ProcessEventsPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const parsed = ZIdParams.safeParse(await params);
  if (!parsed.success) notFound();
  const process = await prisma.process.findUnique({
    where: { id: parsed.data.id },
    select: { id: true, name: true, characteristics: { select: { id: true, name: true }, orderBy: { name: "asc" } } },
  });
  if (process === null) notFound();
  const [events, zone] = await Promise.all([
    eventsFor(prisma, process.id).catch((error: unknown) => {
      if (isAppError(error) && error.code === "not-found") notFound();
      throw error;
    }),
    zoneOfProcess(prisma, process.id),
  ]);
  return (
    <>
      <p className="breadcrumb">
        <Link href="/">Characteristics</Link> ›{" "}
        {process.characteristics.map((characteristic, index) => (
          <span key={characteristic.id}>
            {index > 0 && ", "}
            <Link href={`/characteristics/${characteristic.id}`}>{characteristic.name}</Link>
          </span>
        ))}
      </p>
      <h1>Event log: {process.name}</h1>
      <h2 id="record-heading">Record an event</h2>
      <EventForm processId={process.id} zone={zone} defaultTime={wallClockText(new Date(), zone)} />
      <h2 id="log-heading">Events, newest first</h2>
      {events.length === 0 ? (
        <p>No events recorded yet.</p>
      ) : (
        <div className="table-scroll">
          <table className="data-table" aria-labelledby="log-heading">
            <thead>
              <tr>
                <th scope="col">Time</th>
                <th scope="col">Kind</th>
                <th scope="col">Cause category</th>
                <th scope="col">What happened</th>
                <th scope="col">Reading</th>
              </tr>
            </thead>
            <tbody>
              {[...events].reverse().map((event) => (
                <tr key={event.id}>
                  <td>
                    <time dateTime={event.occurredAt.toISOString()}>{formatTime(event.occurredAt.toISOString(), zone)}</time>
                  </td>
                  <td>{EVENT_KIND_LABELS[event.kind as EventKind] ?? event.kind}</td>
                  <td>{event.causeCategory ?? "—"}</td>
                  <td>{event.description}</td>
                  <td>{event.value === null ? "—" : `${formatValue(event.value)} ${event.unit ?? ""}`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
