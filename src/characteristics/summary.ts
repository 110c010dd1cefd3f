/**
 * Turns stored characteristics and their most recent subgroups into the plain objects the overview
 * page shows: the plotted value of each subgroup, the latest one with its time, and the points of a
 * small trend chart. Pure: no database, no clock.
 *
 * The plotted value follows the chart's own statistic (Montgomery, "Introduction to Statistical
 * Quality Control", 7th ed., ch. 6-7): the subgroup mean for variables charts (the single value when
 * the subgroup size is 1), and count / size for attributes charts (fraction defective for p and np,
 * defects per unit for c and u; for c the size is 1, so the value is the count itself).
 */
import { CHART_TYPES, CHART_TYPE_LABELS, VARIABLES_CHART_TYPES, type ChartType } from "../../shared/constants";
import { subgroupMeans, variablesData } from "../spc/data";

/** How many recent subgroups the overview reads and plots per characteristic. */
export const OVERVIEW_POINT_COUNT = 50;

/** A stored subgroup as the overview reads it: measurements for variables, count and size for attributes. */
export interface StoredSubgroup {
  readonly sequence: number;
  readonly timestamp: Date;
  readonly count: number | null;
  readonly size: number | null;
  readonly measurements: readonly { readonly value: number }[];
}

export interface StoredCharacteristic {
  readonly id: number;
  readonly name: string;
  readonly unit: string;
  readonly chartType: string;
  readonly subgroupSize: number;
  readonly safetyRelated: boolean;
  readonly process: { readonly id: number; readonly name: string; readonly kind: string };
  /** Most recent first, as the query returns them. */
  readonly subgroups: readonly StoredSubgroup[];
}

/** One point of the trend chart; `time` is an ISO 8601 string so it crosses to browser components. */
export interface TrendPoint {
  readonly sequence: number;
  readonly time: string;
  readonly value: number;
}

export interface CharacteristicSummary {
  readonly id: number;
  readonly name: string;
  readonly unit: string;
  readonly chartType: ChartType;
  readonly chartTypeLabel: string;
  /** What the plotted value is, in words ("subgroup mean", "fraction defective", ...). */
  readonly statisticName: string;
  readonly subgroupSize: number;
  readonly safetyRelated: boolean;
  /** The most recent point, or null when no subgroup has a value yet. */
  readonly latest: TrendPoint | null;
  /** Oldest first. */
  readonly trend: readonly TrendPoint[];
}

export interface ProcessOverview {
  readonly id: number;
  readonly name: string;
  readonly kind: string;
  readonly characteristics: readonly CharacteristicSummary[];
}

const ATTRIBUTES_STATISTIC_NAMES: Partial<Record<ChartType, string>> = {
  p: "fraction defective",
  np: "fraction defective",
  c: "defect count",
  u: "defect rate",
};

function toChartType(value: string, characteristicId: number): ChartType {
  const chartType = CHART_TYPES.find((known) => known === value);
  if (chartType === undefined) {
    throw new Error(`Characteristic ${characteristicId} has an unknown chart type "${value}".`);
  }
  return chartType;
}

/** The statistic a subgroup contributes to the trend, or null when it holds no value to plot. */
export function plottedValue(subgroup: StoredSubgroup, chartType: ChartType): number | null {
  if (!VARIABLES_CHART_TYPES.includes(chartType)) {
    if (subgroup.count === null || subgroup.size === null || !(subgroup.size > 0)) return null;
    return subgroup.count / subgroup.size;
  }
  if (subgroup.measurements.length === 0) return null;
  // The engine's own mean, so the overview shows exactly what the chart plots.
  return subgroupMeans(variablesData([subgroup.measurements.map((measurement) => measurement.value)]))[0] ?? null;
}

function statisticNameOf(chartType: ChartType, subgroupSize: number): string {
  return ATTRIBUTES_STATISTIC_NAMES[chartType] ?? (subgroupSize > 1 ? "subgroup mean" : "individual value");
}

export function summarizeCharacteristic(characteristic: StoredCharacteristic): CharacteristicSummary {
  const chartType = toChartType(characteristic.chartType, characteristic.id);
  const trend: TrendPoint[] = [];
  for (const subgroup of characteristic.subgroups) {
    const value = plottedValue(subgroup, chartType);
    if (value === null) continue;
    trend.push({ sequence: subgroup.sequence, time: subgroup.timestamp.toISOString(), value });
  }
  trend.sort((first, second) => first.sequence - second.sequence);
  return {
    id: characteristic.id,
    name: characteristic.name,
    unit: characteristic.unit,
    chartType,
    chartTypeLabel: CHART_TYPE_LABELS[chartType],
    statisticName: statisticNameOf(chartType, characteristic.subgroupSize),
    subgroupSize: characteristic.subgroupSize,
    safetyRelated: characteristic.safetyRelated,
    latest: trend.at(-1) ?? null,
    trend,
  };
}

/** Groups characteristics by process, processes and characteristics in name order. */
export function groupByProcess(characteristics: readonly StoredCharacteristic[]): ProcessOverview[] {
  const processes = new Map<number, { process: StoredCharacteristic["process"]; items: CharacteristicSummary[] }>();
  for (const characteristic of characteristics) {
    const entry = processes.get(characteristic.process.id) ?? { process: characteristic.process, items: [] };
    entry.items.push(summarizeCharacteristic(characteristic));
    processes.set(characteristic.process.id, entry);
  }
  return [...processes.values()]
    .sort((first, second) => first.process.name.localeCompare(second.process.name))
    .map(({ process, items }) => ({
      id: process.id,
      name: process.name,
      kind: process.kind,
      characteristics: items.sort((first, second) => first.name.localeCompare(second.name)),
    }));
}
