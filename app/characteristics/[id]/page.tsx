// One characteristic: the verdict first, then the chart, the limit versions, the signals and the events.
import Link from "next/link";
import { connection } from "next/server";
import { CHART_TYPE_LABELS, EVENT_KIND_LABELS, SAFETY_CAUTION } from "@/shared/constants";
import { PATTERN_KIND_LABELS } from "@/shared/patterns";
import { chartDatabase } from "@/src/chart-data/database";
import { loadChartView } from "@/src/chart-data/load";
import { STATISTIC_LABELS } from "@/src/chart-data/view";
import { ControlChart } from "@/src/components/control-chart/control-chart";
import { summarizeChart } from "@/src/components/control-chart/summary";
import { formatTime, formatValue } from "@/src/components/format";
import { prisma } from "@/src/db/client";
import { eventsFor } from "@/src/events";
import { limitSetsFor } from "@/src/limits";
import { RULE_DEFINITIONS } from "@/src/spc/rules";
import { signalsFor } from "@/src/signals";
import { zoneOfProcess } from "@/src/sites/zone";
import { findCharacteristic } from "../find-characteristic";
import "../characteristics.css";

/** Signals and events listed under the chart: the most recent ones. */
const LISTED = 25;

export default async function CharacteristicPage({ params }: { params: Promise<{ id: string }> }) {
  await connection();
  const characteristic = await findCharacteristic(params);
  const view = loadChartView(chartDatabase(), characteristic.id);
  const [limitSets, signals, events, zone] = await Promise.all([
    limitSetsFor(prisma, characteristic.id),
    signalsFor(prisma, characteristic.id),
    eventsFor(prisma, characteristic.processId),
    zoneOfProcess(prisma, characteristic.processId),
  ]);
  const summary = summarizeChart(view, zone);
  const recentSignals = signals.slice(-LISTED).reverse();
  const recentEvents = events.slice(-LISTED).reverse();
  const cautionId = "safety-caution";
  return (
    <>
      <p className="breadcrumb">
        <Link href="/">Characteristics</Link> › {characteristic.process.name}
      </p>
      <header className="page-header">
        <h1>{characteristic.name}</h1>
        {characteristic.safetyRelated && (
          <span className="badge badge-safety" aria-describedby={cautionId}>
            Safety-related
          </span>
        )}
      </header>
      <section className={`verdict ${summary.inControl ? "verdict-ok" : "verdict-signal"}`} aria-labelledby="verdict-heading">
        <h2 id="verdict-heading" className="verdict-headline">
          {summary.headline}
        </h2>
        {summary.detail !== null && <p className="verdict-detail">{summary.detail}</p>}
      </section>
      {characteristic.safetyRelated && (
        <p className="caution" id={cautionId}>
          {SAFETY_CAUTION}
        </p>
      )}
      <nav aria-label="Characteristic" className="page-actions">
        <Link href={`/characteristics/${characteristic.id}/entry`}>Enter a subgroup</Link>
        <Link href={`/characteristics/${characteristic.id}/import`}>Import a file</Link>
        <Link href={`/characteristics/${characteristic.id}/settings`}>Settings and limits</Link>
        <Link href={`/characteristics/${characteristic.id}/corrections`}>Correct a recorded value</Link>
        <Link href={`/processes/${characteristic.processId}/events`}>Event log of {characteristic.process.name}</Link>
      </nav>
      <p className="facts-line">
        {CHART_TYPE_LABELS[characteristic.chartType]} · subgroup size {characteristic.subgroupSize} · {characteristic.unit} · rules{" "}
        {characteristic.ruleSet} · {characteristic.subgroupCount.toLocaleString("en")} subgroups · times in {zone}
      </p>

      <ControlChart initialView={view} zone={zone} />

      <h2 id="limits-heading">Limit versions</h2>
      {limitSets.length === 0 ? (
        <p>No limits yet. Set the first version from a baseline under Settings and limits.</p>
      ) : (
        <div className="table-scroll">
          <table aria-labelledby="limits-heading" className="data-table">
            <thead>
              <tr>
                <th scope="col">Version</th>
                <th scope="col">Applies to subgroups</th>
                <th scope="col">Centre</th>
                <th scope="col">σ</th>
                <th scope="col">Baseline</th>
                <th scope="col">Reason</th>
                <th scope="col">Approved by</th>
              </tr>
            </thead>
            <tbody>
              {limitSets.map((limitSet) => (
                <tr key={limitSet.id}>
                  <th scope="row">v{limitSet.version}</th>
                  <td>
                    {limitSet.appliesTo === null
                      ? "none (superseded)"
                      : limitSet.appliesTo.to === null
                        ? `${limitSet.appliesTo.from} onwards`
                        : `${limitSet.appliesTo.from}–${limitSet.appliesTo.to - 1}`}
                  </td>
                  <td>{formatValue(limitSet.center)}</td>
                  <td>{limitSet.sigma === null ? "from the centre" : formatValue(limitSet.sigma)}</td>
                  <td>
                    {limitSet.baselineStart}–{limitSet.baselineEnd - 1} ({limitSet.baselineUsed} used)
                    {limitSet.exclusions.length > 0 && (
                      <ul className="plain-list">
                        {limitSet.exclusions.map((exclusion) => (
                          <li key={exclusion.sequence}>
                            left out {exclusion.sequence}: {exclusion.reason}
                          </li>
                        ))}
                      </ul>
                    )}
                  </td>
                  <td>{limitSet.reason}</td>
                  <td>
                    {limitSet.approvedBy}, {formatTime(limitSet.createdAt.toISOString(), zone)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      <h2 id="signals-heading">Signals</h2>
      {signals.length === 0 ? (
        <p>No signals stored.</p>
      ) : (
        <>
          <p>
            {signals.length} stored{signals.length > LISTED ? `; the latest ${LISTED} are listed` : ""}.
          </p>
          <ol className="signal-list" aria-labelledby="signals-heading" reversed>
            {recentSignals.map((signal) => (
              <li key={signal.id} className="signal-item">
                <p className="signal-rule">
                  <span aria-hidden="true" className="signal-mark">
                    ▲
                  </span>{" "}
                  {RULE_DEFINITIONS[signal.rule].summary} <span className="muted">({signal.rule})</span>
                </p>
                <p>
                  {STATISTIC_LABELS[signal.statistic]}, subgroups {signal.startSequence}–{signal.endSequence}
                  {signal.side !== null && `, ${signal.side} the centre line`}
                  {signal.pattern !== null && ` · pattern: ${PATTERN_KIND_LABELS[signal.pattern]}`} · limits v{signal.limitSetVersion} · {signal.status} ·
                  detected {formatTime(signal.detectedAt.toISOString(), zone)}
                </p>
              </li>
            ))}
          </ol>
        </>
      )}

      <h2 id="events-heading">Process events</h2>
      {events.length === 0 ? (
        <p>No events recorded for {characteristic.process.name}.</p>
      ) : (
        <ol className="event-list" aria-labelledby="events-heading" reversed>
          {recentEvents.map((event) => (
            <li key={event.id}>
              <time dateTime={event.occurredAt.toISOString()}>{formatTime(event.occurredAt.toISOString(), zone)}</time> ·{" "}
              <strong>{EVENT_KIND_LABELS[event.kind as keyof typeof EVENT_KIND_LABELS] ?? event.kind}</strong>: {event.description}
              {event.value !== null && ` (${formatValue(event.value)} ${event.unit ?? ""})`}
            </li>
          ))}
        </ol>
      )}
      <p>
        <Link href={`/processes/${characteristic.processId}/events`}>All events and a form to record one</Link>
      </p>
    </>
  );
}
