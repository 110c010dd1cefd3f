/**
 * Shapes of the invented demo plant: plain data, free of Prisma, so the generator stays pure and tests
 * can inspect it without a database.
 */
import type { CauseCategory, ChartType, EventKind } from "@/shared/constants";

export type DemoProcessKey = "press-1" | "press-2";
export type DemoCharacteristicKey = "closure-weight" | "cap-height" | "short-shot-fraction" | "flash-defects";

export interface DemoProcess {
  readonly key: DemoProcessKey;
  readonly name: string;
  readonly kind: string;
}

/** One point on a chart: measured values (variables charts) or a count and its size (attributes charts). */
export interface DemoSubgroup {
  readonly sequence: number;
  readonly timestamp: Date;
  /** Variables charts: the recorded values in sampling order. Empty for attributes charts. */
  readonly values: readonly number[];
  /** Attributes charts: defectives (p) or defects (u). */
  readonly count: number | null;
  /** Attributes charts: sample size (p) or inspection units (u). */
  readonly size: number | null;
  readonly tags: Readonly<Record<string, string>>;
}

/** The generator's in-control model of a characteristic, so tests can compare the data with it. */
export type DemoInControlModel =
  | { readonly kind: "normal"; readonly mean: number; readonly sigma: number; readonly resolution: number }
  | { readonly kind: "binomial"; readonly proportion: number }
  | { readonly kind: "poisson"; readonly ratePerUnit: number };

export interface DemoCharacteristic {
  readonly key: DemoCharacteristicKey;
  readonly processKey: DemoProcessKey;
  readonly name: string;
  readonly unit: string;
  readonly chartType: ChartType;
  readonly subgroupSize: number;
  readonly target: number | null;
  readonly lowerSpecLimit: number | null;
  readonly upperSpecLimit: number | null;
  readonly ruleSet: string;
  readonly safetyRelated: boolean;
  readonly description: string;
  readonly inControl: DemoInControlModel;
  readonly subgroups: readonly DemoSubgroup[];
}

export interface DemoEvent {
  readonly processKey: DemoProcessKey;
  readonly occurredAt: Date;
  readonly kind: EventKind;
  readonly causeCategory: CauseCategory | null;
  readonly description: string;
  readonly value: number | null;
  readonly unit: string | null;
}

/** Our own names for the disturbances planted in the history. */
export type PlantedEpisodeKind = "level-shift" | "drift" | "cycle" | "mixture" | "digit-slip";

/**
 * A disturbance planted in one characteristic's history: subgroups `first..last` (inclusive, 0-based
 * sequence numbers) are affected. Known only to the scenario; nothing in the data marks it.
 */
export interface PlantedEpisode {
  readonly kind: PlantedEpisodeKind;
  readonly characteristic: DemoCharacteristicKey;
  readonly first: number;
  readonly last: number;
  readonly description: string;
  /** Size of the disturbance in the characteristic's unit (shift, total drift, cycle amplitude, offset). */
  readonly magnitude: number;
  /** Cycle period in subgroups (cycles only). */
  readonly period?: number;
  /** Digit slips: position in the subgroup, the value meant and the value typed. */
  readonly slip?: { readonly position: number; readonly intended: number; readonly typed: number };
}

export interface DemoScenario {
  readonly seed: number;
  /** Time of the first and the last subgroup. */
  readonly start: Date;
  readonly end: Date;
  readonly siteName: string;
  /** The site's time zone (IANA name): display and entry only, the scenario's times are instants. */
  readonly siteZone: string;
  readonly areaName: string;
  readonly processes: readonly DemoProcess[];
  readonly characteristics: readonly DemoCharacteristic[];
  readonly events: readonly DemoEvent[];
  readonly plantedEpisodes: readonly PlantedEpisode[];
}
