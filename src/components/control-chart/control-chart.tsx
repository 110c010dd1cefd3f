"use client";

import { useId, useState, type FormEvent } from "react";
import { ZChartView, type TChartView } from "@/src/chart-data/view";
import { StatisticPanel } from "./statistic-panel";
import "./control-chart.css";

/** Heights in pixels: the plotted statistic large enough to read across a shop floor, the spread below it. */
const MAIN_HEIGHT = 380;
const SPREAD_HEIGHT = 220;

function Legend() {
  return (
    <ul className="chart-legend" aria-label="Legend">
      <li><span className="legend-line legend-center" /> Centre line</li>
      <li><span className="legend-line legend-action" /> Action limits (3σ)</li>
      <li><span className="legend-line legend-warning" /> Warning limits (2σ)</li>
      <li><span className="legend-signal" aria-hidden="true">▲</span> Signal (a rule fired)</li>
      <li><span className="legend-original" aria-hidden="true">○</span> Value as recorded, before a correction</li>
      <li><span className="legend-event" aria-hidden="true">E</span> Process event</li>
    </ul>
  );
}

/**
 * The control chart with its range selector: the first view comes from the server with the page; a new
 * range is fetched, decimated for that range, from the chart-data route. Its times (ISO 8601 UTC, as the
 * route answers) are shown in `zone`, the site's time zone, with the zone's name.
 */
export function ControlChart({ initialView, zone }: { initialView: TChartView; zone: string }) {
  const [view, setView] = useState(initialView);
  const [problem, setProblem] = useState<string | null>(null);
  const [loading, setLoading] = useState(false);
  const fromId = useId();
  const toId = useId();
  const history = view.history;

  async function show(from: number | undefined, to: number | undefined) {
    setLoading(true);
    setProblem(null);
    const query = new URLSearchParams();
    if (from !== undefined) query.set("from", String(from));
    if (to !== undefined) query.set("to", String(to));
    try {
      const response = await fetch(`/api/v1/characteristics/${view.characteristicId}/chart-data?${query}`);
      const body: unknown = await response.json();
      if (!response.ok) {
        const issues = (body as { issues?: { path: string; message: string }[] }).issues ?? [];
        setProblem(issues.length > 0 ? issues.map((issue) => `${issue.path} ${issue.message}`).join("; ") : "The range could not be shown.");
        return;
      }
      setView(ZChartView.parse(body));
    } catch {
      setProblem("The chart data could not be loaded; try again.");
    } finally {
      setLoading(false);
    }
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const number = (name: string) => {
      const text = String(form.get(name) ?? "").trim();
      return text === "" ? undefined : Number(text);
    };
    void show(number("from"), number("to"));
  }

  if (history === null || view.range === null) {
    return <p className="chart-empty">No subgroups to draw yet.</p>;
  }
  const [primary, spread] = view.statistics;
  const domain: [number, number] = [view.range.from, view.range.to];
  const shown = primary === undefined ? 0 : primary.points.length;
  return (
    <section className="control-chart" aria-label="Control chart">
      <form className="chart-range" onSubmit={submit} aria-label="Range shown">
        <label htmlFor={fromId}>From subgroup</label>
        <input id={fromId} name="from" type="number" min={history.first} max={history.last} defaultValue={view.range.from} key={`from-${view.range.from}`} />
        <label htmlFor={toId}>to</label>
        <input id={toId} name="to" type="number" min={history.first} max={history.last} defaultValue={view.range.to} key={`to-${view.range.to}`} />
        <button type="submit" disabled={loading}>Show</button>
        <button type="button" disabled={loading} onClick={() => void show(undefined, undefined)}>
          Whole history
        </button>
        <button type="button" disabled={loading} onClick={() => void show(Math.max(history.first, history.last - 99), undefined)}>
          Last 100
        </button>
      </form>
      <p className="chart-status" role="status" aria-live="polite">
        {loading
          ? "Loading…"
          : `Subgroups ${view.range.from}–${view.range.to} of ${history.first}–${history.last}` +
            (primary?.decimated ? `: ${shown} of ${primary.pointsInRange} points drawn (each stretch by its lowest and highest point; every signal point kept)` : "")}
      </p>
      {problem !== null && (
        <p className="form-error" role="alert">
          {problem}
        </p>
      )}
      <Legend />
      {primary !== undefined && <StatisticPanel statistic={primary} events={view.events} unit={view.unit} zone={zone} height={MAIN_HEIGHT} domain={domain} />}
      {spread !== undefined && <StatisticPanel statistic={spread} events={view.events} unit={view.unit} zone={zone} height={SPREAD_HEIGHT} domain={domain} />}
    </section>
  );
}
