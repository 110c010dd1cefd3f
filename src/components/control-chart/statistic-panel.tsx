"use client";

import {
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
  type TooltipContentProps,
} from "recharts";
import { EVENT_KIND_LABELS } from "@/shared/constants";
import type { TChartEvent, TStatisticView } from "@/src/chart-data/view";
import { formatTime, formatValue } from "../format";
import { chartRows, type TChartRow } from "./rows";

/** Inks: points dark, limits in red (action) and amber (warning), signals red triangles, originals hollow blue. */
const INK = "#16181c";
const ACTION = "#b3261e";
const WARNING = "#9a6700";
const ORIGINAL = "#1f4e79";
const EVENT = "#5b3a8c";
/** Dots on every point only while they stay apart. */
const MOST_DOTS = 250;

function PointTooltip({ active, payload, unit, zone }: TooltipContentProps & { unit: string; zone: string }) {
  const row = payload?.[0]?.payload as TChartRow | undefined;
  if (!active || row === undefined) return null;
  const { point } = row;
  const { bucket, firedRules = [] } = point;
  return (
    <div className="chart-tooltip">
      <p>
        <strong>Subgroup {point.sequence}</strong> · {formatTime(point.timestamp, zone)}
      </p>
      <p>
        {point.value === null ? "No value" : `${formatValue(point.value)} ${unit}`}
        {point.version !== null && ` · limits v${point.version}`}
      </p>
      {bucket && (
        <p>
          Stands for subgroups {bucket.from}–{bucket.to}: {formatValue(bucket.min)} to {formatValue(bucket.max)}
        </p>
      )}
      {firedRules.length > 0 && <p className="chart-tooltip-signal">▲ Signal: {firedRules.join(", ")}</p>}
      {(point.corrections ?? []).map((correction, index) => (
        <p key={index}>
          Recorded {formatValue(correction.recorded)}, corrected to {formatValue(correction.corrected)}: {correction.reason} ({correction.correctedBy})
        </p>
      ))}
    </div>
  );
}

function EventMarker({ event, zone }: { event: TChartEvent; zone: string }) {
  const text = `${EVENT_KIND_LABELS[event.kind]}: ${event.description}${event.value === null ? "" : ` (${event.value} ${event.unit ?? ""})`} · ${formatTime(event.occurredAt, zone)}`;
  return (
    <ReferenceLine
      x={event.position}
      stroke={EVENT}
      strokeDasharray="2 3"
      label={(props: { viewBox?: { x?: number; y?: number } }) => (
        <g className="chart-event" transform={`translate(${props.viewBox?.x ?? 0}, ${(props.viewBox?.y ?? 0) + 2})`}>
          <title>{text}</title>
          <rect x={-7} y={0} width={14} height={14} fill={EVENT} />
          <text x={0} y={11} textAnchor="middle" fill="#fff" fontSize={11} fontWeight={700}>
            E
          </text>
        </g>
      )}
    />
  );
}

export function StatisticPanel({
  statistic,
  events,
  unit,
  zone,
  height,
  domain,
}: {
  statistic: TStatisticView;
  events: readonly TChartEvent[];
  unit: string;
  /** The site's time zone: tooltips and event markers show times in it. */
  zone: string;
  height: number;
  domain: [number, number];
}) {
  const rows = chartRows(statistic);
  const showDots = rows.length <= MOST_DOTS;
  return (
    <figure className="chart-panel" aria-label={`${statistic.label} chart`}>
      <figcaption className="chart-panel-title">{statistic.label}</figcaption>
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={height}>
          <ComposedChart data={rows} margin={{ top: 20, right: 24, bottom: 8, left: 8 }}>
            <CartesianGrid stroke="#e2e0d8" vertical={false} />
            <XAxis dataKey="sequence" type="number" domain={domain} allowDataOverflow tick={{ fontSize: 14 }} />
            <YAxis domain={["auto", "auto"]} tick={{ fontSize: 14 }} width={72} tickFormatter={(value: number) => formatValue(value)} />
            <Tooltip content={(props) => <PointTooltip {...(props as TooltipContentProps)} unit={unit} zone={zone} />} isAnimationActive={false} />
            <Line dataKey="ucl" type="stepAfter" stroke={ACTION} strokeWidth={2} strokeDasharray="8 4" dot={false} isAnimationActive={false} connectNulls={false} />
            <Line dataKey="lcl" type="stepAfter" stroke={ACTION} strokeWidth={2} strokeDasharray="8 4" dot={false} isAnimationActive={false} connectNulls={false} />
            <Line dataKey="upperWarning" type="stepAfter" stroke={WARNING} strokeWidth={1.5} strokeDasharray="2 4" dot={false} isAnimationActive={false} />
            <Line dataKey="lowerWarning" type="stepAfter" stroke={WARNING} strokeWidth={1.5} strokeDasharray="2 4" dot={false} isAnimationActive={false} />
            <Line dataKey="center" type="stepAfter" stroke={INK} strokeWidth={1.5} dot={false} isAnimationActive={false} />
            <Line
              dataKey="value"
              type="linear"
              stroke={INK}
              strokeWidth={1.5}
              dot={showDots ? { r: 3, fill: INK, stroke: INK } : false}
              isAnimationActive={false}
              className="chart-values"
            />
            <Scatter dataKey="original" shape="circle" fill="none" stroke={ORIGINAL} strokeWidth={2} isAnimationActive={false} className="chart-originals" />
            <Scatter dataKey="signal" shape="triangle" fill={ACTION} stroke="#fff" isAnimationActive={false} className="chart-signals" />
            {events.map((event) => (
              <EventMarker key={event.id} event={event} zone={zone} />
            ))}
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
