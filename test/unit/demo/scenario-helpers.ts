/** Shared reading of the demo scenario for the demo tests: series, episodes and in-control stretches. */
import { DEFAULT_DEMO_SEED, generateDemoScenario } from "@/src/demo/scenario";
import type { DemoCharacteristic, DemoCharacteristicKey, DemoScenario, PlantedEpisode } from "@/src/demo/types";

/** A fixed end time, so every test reads the same history. */
export const DEMO_END = new Date("2026-11-30T18:30:00Z");

let cached: DemoScenario | undefined;

export function demoScenario(): DemoScenario {
  cached ??= generateDemoScenario({ seed: DEFAULT_DEMO_SEED, end: DEMO_END });
  return cached;
}

export function characteristicOf(scenario: DemoScenario, key: DemoCharacteristicKey): DemoCharacteristic {
  const characteristic = scenario.characteristics.find((candidate) => candidate.key === key);
  if (characteristic === undefined) throw new Error(`No characteristic ${key}`);
  return characteristic;
}

export function episodesOf(scenario: DemoScenario, key: DemoCharacteristicKey): PlantedEpisode[] {
  return scenario.plantedEpisodes.filter((episode) => episode.characteristic === key);
}

export function episode(scenario: DemoScenario, key: DemoCharacteristicKey, kind: PlantedEpisode["kind"]): PlantedEpisode {
  const found = episodesOf(scenario, key).find((candidate) => candidate.kind === kind);
  if (found === undefined) throw new Error(`No ${kind} episode on ${key}`);
  return found;
}

/** Subgroup sequence numbers outside every planted window of the characteristic. */
export function inControlSequences(scenario: DemoScenario, key: DemoCharacteristicKey): number[] {
  const windows = episodesOf(scenario, key);
  return characteristicOf(scenario, key)
    .subgroups.map((subgroup) => subgroup.sequence)
    .filter((sequence) => windows.every((window) => sequence < window.first || sequence > window.last));
}

export function range(first: number, last: number): number[] {
  return Array.from({ length: last - first + 1 }, (_, offset) => first + offset);
}

export function valuesAt(characteristic: DemoCharacteristic, sequences: readonly number[]): number[] {
  return sequences.flatMap((sequence) => characteristic.subgroups[sequence]?.values ?? []);
}

export function mean(values: readonly number[]): number {
  return values.reduce((sum, value) => sum + value, 0) / values.length;
}

export function sampleStandardDeviation(values: readonly number[]): number {
  const center = mean(values);
  const squares = values.reduce((sum, value) => sum + (value - center) ** 2, 0);
  return Math.sqrt(squares / (values.length - 1));
}
