"use client";

import { Line, LineChart, YAxis } from "recharts";

/**
 * A small line of recent values without axes, for a glance at level and trend. Decorative for
 * assistive technology: the caller places the text alternative next to it.
 */
export function Sparkline({ values }: { values: readonly number[] }) {
  const data = values.map((value, index) => ({ index, value }));
  return (
    <div className="sparkline-plot" aria-hidden="true">
      <LineChart width={260} height={64} data={data} margin={{ top: 6, right: 6, bottom: 6, left: 6 }} accessibilityLayer={false}>
        <YAxis hide domain={["dataMin", "dataMax"]} />
        <Line type="linear" dataKey="value" stroke="currentColor" strokeWidth={2} dot={false} isAnimationActive={false} />
      </LineChart>
    </div>
  );
}
