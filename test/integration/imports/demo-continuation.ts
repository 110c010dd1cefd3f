/**
 * CSV files made from the demo generator (src/demo), never typed by hand: the cap-height series of a demo
 * scenario, optionally with a planted shift of a stated number of the demo's own sigmas
 * (CAP_HEIGHT.sigma) from a given point on, rounded to the gauge resolution like every demo value.
 */
import type { TColumnMapping } from "@/src/imports/options";
import { CAP_HEIGHT, DEMO_DAYS } from "@/src/demo/plant";
import { generateDemoScenario } from "@/src/demo/scenario";
import { roundToResolution } from "@/src/demo/series";

export interface TCapHeightCsvOptions {
  readonly seed: number;
  /** Every timestamp in the file comes after this time. */
  readonly after: Date;
  readonly count: number;
  /** Index of the first shifted point (no shift when undefined). */
  readonly shiftFrom?: number;
  readonly shiftSigmas?: number;
}

const DAY_MS = 86_400_000;

export function capHeightCsv(options: TCapHeightCsvOptions): { csv: string; values: number[]; timestamps: Date[] } {
  // The scenario spans DEMO_DAYS days before its end, so an end DEMO_DAYS + 1 days on puts every point after `after`.
  const scenario = generateDemoScenario({ seed: options.seed, end: new Date(options.after.getTime() + (DEMO_DAYS + 1) * DAY_MS) });
  const series = scenario.characteristics.find((characteristic) => characteristic.key === "cap-height");
  if (series === undefined) throw new Error("the demo scenario has no cap-height series");
  const subgroups = series.subgroups.slice(0, options.count);
  const shift = (options.shiftSigmas ?? 0) * CAP_HEIGHT.sigma;
  const values = subgroups.map((subgroup, index) => {
    const value = subgroup.values[0] ?? Number.NaN;
    return options.shiftFrom !== undefined && index >= options.shiftFrom ? roundToResolution(value + shift, CAP_HEIGHT.resolution) : value;
  });
  const lines = subgroups.map((subgroup, index) => `${subgroup.timestamp.toISOString()},${values[index]},${subgroup.tags.cavity ?? ""},${subgroup.tags.operator ?? ""}`);
  return { csv: ["timestamp,cap height (mm),cavity,operator", ...lines, ""].join("\n"), values, timestamps: subgroups.map((subgroup) => subgroup.timestamp) };
}

export const CAP_HEIGHT_MAPPING: TColumnMapping = {
  timestamp: "timestamp",
  value: "cap height (mm)",
  tags: [
    { column: "cavity", tag: "cavity" },
    { column: "operator", tag: "operator" },
  ],
};
