import Link from "next/link";
import type { CharacteristicSummary } from "../characteristics/summary";
import { SAFETY_CAUTION } from "../../shared/constants";
import { formatTime, formatValue } from "./format";
import { Sparkline } from "./sparkline";

function trendDescription(characteristic: CharacteristicSummary, zone: string): string {
  const { trend, statisticName, unit } = characteristic;
  const first = trend[0];
  const last = trend.at(-1);
  if (first === undefined || last === undefined) return "";
  const values = trend.map((point) => point.value);
  const count = trend.length === 1 ? `The last ${statisticName}` : `Last ${trend.length} values of the ${statisticName}`;
  return (
    `${count}, from ${formatTime(first.time, zone)} to ${formatTime(last.time, zone)}, ` +
    `ranging from ${formatValue(Math.min(...values))} to ${formatValue(Math.max(...values))} ${unit}.`
  );
}

/** `zone`: the site's time zone, in which the card shows its times. */
export function CharacteristicCard({ characteristic, zone }: { characteristic: CharacteristicSummary; zone: string }) {
  const { latest } = characteristic;
  const cautionId = `safety-caution-${characteristic.id}`;
  return (
    <article className="card" aria-labelledby={`characteristic-${characteristic.id}`}>
      <header className="card-header">
        <h3 id={`characteristic-${characteristic.id}`}>
          <Link href={`/characteristics/${characteristic.id}`}>{characteristic.name}</Link>
        </h3>
        {characteristic.safetyRelated && (
          <span className="badge badge-safety" aria-describedby={cautionId}>
            Safety-related
          </span>
        )}
      </header>
      <div className="latest">
        <p className="latest-label">Latest {characteristic.statisticName}</p>
        {latest === null ? (
          <p className="latest-value">No data yet</p>
        ) : (
          <>
            <p className="latest-value">
              {formatValue(latest.value)} {characteristic.unit}
            </p>
            <p className="latest-time">
              <time dateTime={latest.time}>{formatTime(latest.time, zone)}</time>
            </p>
          </>
        )}
      </div>
      <dl className="facts">
        <div>
          <dt>Chart</dt>
          <dd>{characteristic.chartTypeLabel}</dd>
        </div>
        <div>
          <dt>Unit</dt>
          <dd>{characteristic.unit}</dd>
        </div>
      </dl>
      {characteristic.trend.length > 0 && (
        <figure className="sparkline">
          <Sparkline values={characteristic.trend.map((point) => point.value)} />
          <figcaption>{trendDescription(characteristic, zone)}</figcaption>
        </figure>
      )}
      <p className="card-actions">
        <Link href={`/characteristics/${characteristic.id}/entry`}>
          Enter a subgroup<span className="visually-hidden"> for {characteristic.name}</span>
        </Link>{" "}
        <Link href={`/characteristics/${characteristic.id}/import`}>
          Import readings<span className="visually-hidden"> for {characteristic.name}</span>
        </Link>
      </p>
      {characteristic.safetyRelated && (
        <p className="caution" id={cautionId}>
          {SAFETY_CAUTION}
        </p>
      )}
    </article>
  );
}
