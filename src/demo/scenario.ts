/**
 * The demo plant as plain data: a pure, deterministic function of a seed and an end time.
 *
 * Tarnwick Demo Closures Plant (invented) runs two injection-moulding presses making 38 mm polypropylene
 * closures, checked three times per 8-hour shift for 120 days (1080 subgroups per characteristic):
 * - Press 1: closure weight (g, X-bar & R, five closures, one per cavity pair) and flash defects per
 *   100 closures (u chart, 24..56 inspection units per check);
 * - Press 2: cap height (mm, individuals, one closure) and short-shot fraction (p chart, 300..700
 *   closures per check).
 * Planted disturbances, at the fixed positions documented in ./plant.ts and returned in
 * `plantedEpisodes`: (a) closure weight shifts up for one resin lot, (b) cap height drifts down and short
 * shots rise while a hot-runner heater band fails, ended by hot-runner maintenance, (c) flash defects
 * cycle with a period of 12 subgroups while the chiller is fouled, (d) cap-height readings alternate
 * between two cavities, (e) one closure weight is typed with two digits swapped.
 * Outside those windows every series is independent noise around the in-control model.
 */
import { createRng, type Rng } from "@/src/spc/random";
import { lotChangeEvents, crewRotationEvents, pressOneEvents, pressTwoEvents, type ResinLot } from "./events";
import {
  CAP_HEIGHT,
  CAVITY_MIXTURE,
  CHILLER_CYCLE,
  CLOSURE_WEIGHT,
  DEMO_AREA_NAME,
  DEMO_PROCESSES,
  DEMO_SITE_NAME,
  DEMO_SITE_ZONE,
  FLASH,
  HEATER_DRIFT,
  SHIFTS_PER_DAY,
  SHORT_SHOT,
  SUBGROUPS_PER_SHIFT,
  SUBGROUP_COUNT,
  WEIGHT_SHIFT,
} from "./plant";
import { buildPressSchedule, lotNames, lotPerSubgroup, lotStarts, type PressSchedule } from "./schedule";
import { capHeights, closureWeights, flashDefects, shortShots, type CountSeries, type DigitSlip } from "./series";
import type { DemoCharacteristic, DemoEvent, DemoScenario, DemoSubgroup, PlantedEpisode } from "./types";

export const DEFAULT_DEMO_SEED = 20_240_917;

export interface DemoScenarioOptions {
  /** Any unsigned 32-bit integer; the same seed and end give the same scenario. */
  readonly seed: number;
  /** The scenario's last check happens at or before this time. */
  readonly end: Date;
}

/** Melt flow index of a typical lot (g/10 min) and of the lot that makes closures heavier. */
const TYPICAL_MELT_FLOW = 12;
const HEAVY_LOT_MELT_FLOW = 13.6;
const HOURS_PER_SUBGROUP = 24 / (SHIFTS_PER_DAY * SUBGROUPS_PER_SHIFT);

function resinLots(count: number, anchors: readonly number[], rng: Rng): ResinLot[] {
  const starts = lotStarts(count, anchors, rng);
  const names = lotNames(starts.length, rng);
  return starts.map((start, index) => ({
    start,
    name: names[index] ?? "",
    meltFlowIndex:
      start === WEIGHT_SHIFT.first ? HEAVY_LOT_MELT_FLOW : TYPICAL_MELT_FLOW + 0.6 * (rng.uniform() - 0.5),
  }));
}

function baseTags(schedule: PressSchedule, lots: readonly string[], index: number): Record<string, string> {
  return {
    lot: lots[index] ?? "",
    operator: schedule.operators[index] ?? "",
    shift: schedule.shiftNames[index] ?? "",
  };
}

function timeAt(schedule: PressSchedule, index: number): Date {
  const time = schedule.times[index];
  if (time === undefined) throw new RangeError(`No check time for subgroup ${index}`);
  return time;
}

function variablesSubgroups(
  schedule: PressSchedule,
  lots: readonly string[],
  values: readonly (readonly number[])[],
  extraTags?: readonly Record<string, string>[],
): DemoSubgroup[] {
  return values.map((subgroupValues, index) => ({
    sequence: index,
    timestamp: timeAt(schedule, index),
    values: subgroupValues,
    count: null,
    size: null,
    tags: { ...baseTags(schedule, lots, index), ...extraTags?.[index] },
  }));
}

function attributesSubgroups(schedule: PressSchedule, lots: readonly string[], series: CountSeries): DemoSubgroup[] {
  return series.counts.map((count, index) => ({
    sequence: index,
    timestamp: timeAt(schedule, index),
    values: [],
    count,
    size: series.sizes[index] ?? null,
    tags: baseTags(schedule, lots, index),
  }));
}

function plantedEpisodes(heavyLot: string, slip: DigitSlip): PlantedEpisode[] {
  const shortShotRise = SHORT_SHOT.proportion * (HEATER_DRIFT.finalProportionFactor - 1);
  return [
    {
      kind: "level-shift",
      characteristic: "closure-weight",
      first: WEIGHT_SHIFT.first,
      last: WEIGHT_SHIFT.last,
      magnitude: WEIGHT_SHIFT.shift,
      description:
        `Closure weight ${WEIGHT_SHIFT.shift} g (${(WEIGHT_SHIFT.shift / CLOSURE_WEIGHT.sigma).toFixed(2)} sigma) ` +
        `heavier throughout resin lot ${heavyLot} (high melt flow index), which arrived right before subgroup ` +
        `${WEIGHT_SHIFT.first}; the next lot change, right after subgroup ${WEIGHT_SHIFT.last}, ends it.`,
    },
    {
      kind: "drift",
      characteristic: "cap-height",
      first: HEATER_DRIFT.first,
      last: HEATER_DRIFT.last,
      magnitude: HEATER_DRIFT.totalChange,
      description:
        `Failing hot-runner heater band on press 2: cap height falls linearly by ${-HEATER_DRIFT.totalChange} mm ` +
        `(${(-HEATER_DRIFT.totalChange / CAP_HEIGHT.sigma).toFixed(1)} sigma) over subgroups ` +
        `${HEATER_DRIFT.first}..${HEATER_DRIFT.last}; hot-runner maintenance right after ${HEATER_DRIFT.last} ends it.`,
    },
    {
      kind: "drift",
      characteristic: "short-shot-fraction",
      first: HEATER_DRIFT.first,
      last: HEATER_DRIFT.last,
      magnitude: shortShotRise,
      description:
        `Same failing heater band: the short-shot fraction rises linearly from ${SHORT_SHOT.proportion} to ` +
        `${SHORT_SHOT.proportion * HEATER_DRIFT.finalProportionFactor} over subgroups ` +
        `${HEATER_DRIFT.first}..${HEATER_DRIFT.last}.`,
    },
    {
      kind: "cycle",
      characteristic: "flash-defects",
      first: CHILLER_CYCLE.first,
      last: CHILLER_CYCLE.last,
      magnitude: FLASH.ratePerUnit * CHILLER_CYCLE.relativeAmplitude,
      period: CHILLER_CYCLE.period,
      description:
        `Fouled chiller on press 1: the flash-defect rate swings sinusoidally by ` +
        `±${CHILLER_CYCLE.relativeAmplitude * 100}% around ${FLASH.ratePerUnit} per 100 closures with a period of ` +
        `${CHILLER_CYCLE.period} subgroups (${CHILLER_CYCLE.period * HOURS_PER_SUBGROUP} hours); cleaning the ` +
        `chiller right after ${CHILLER_CYCLE.last} ends it.`,
    },
    {
      kind: "mixture",
      characteristic: "cap-height",
      first: CAVITY_MIXTURE.first,
      last: CAVITY_MIXTURE.last,
      magnitude: CAVITY_MIXTURE.offset,
      description:
        `Two cavities on one chart: readings alternate between cavity ${CAVITY_MIXTURE.highCavity} ` +
        `(+${CAVITY_MIXTURE.offset} mm, starting at ${CAVITY_MIXTURE.first}) and cavity ` +
        `${CAVITY_MIXTURE.lowCavity} (-${CAVITY_MIXTURE.offset} mm) instead of cavity ${CAVITY_MIXTURE.usualCavity}.`,
    },
    {
      kind: "digit-slip",
      characteristic: "closure-weight",
      first: slip.sequence,
      last: slip.sequence,
      magnitude: slip.typed - slip.intended,
      slip: { position: slip.position, intended: slip.intended, typed: slip.typed },
      description:
        `Hand-typed reading ${slip.position + 1} of subgroup ${slip.sequence}: ${slip.intended} g entered ` +
        `as ${slip.typed} g (first two decimals swapped).`,
    },
  ];
}

export function generateDemoScenario(options: DemoScenarioOptions): DemoScenario {
  const { seed, end } = options;
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffff_ffff) {
    throw new RangeError(`Demo seed must be an unsigned 32-bit integer, got ${seed}`);
  }
  if (Number.isNaN(end.getTime())) throw new RangeError("Demo end time is not a valid date");
  // One stream, consumed in a fixed order, so the whole scenario follows from the seed.
  const rng = createRng(seed);
  const pressOne = buildPressSchedule("press-1", end, rng);
  const pressTwo = buildPressSchedule("press-2", end, rng);
  const pressOneLots = resinLots(SUBGROUP_COUNT, [WEIGHT_SHIFT.first, WEIGHT_SHIFT.last + 1], rng);
  const pressTwoLots = resinLots(SUBGROUP_COUNT, [], rng);
  const lotsOf = (lots: readonly ResinLot[]) =>
    lotPerSubgroup(SUBGROUP_COUNT, lots.map((lot) => lot.start), lots.map((lot) => lot.name));
  const pressOneLotTags = lotsOf(pressOneLots);
  const pressTwoLotTags = lotsOf(pressTwoLots);

  const weights = closureWeights(rng);
  const heights = capHeights(rng);
  const shorts = shortShots(rng);
  const flash = flashDefects(rng);

  const characteristics: DemoCharacteristic[] = [
    {
      key: "closure-weight",
      processKey: "press-1",
      name: "Closure weight",
      unit: "g",
      chartType: "xbar-r",
      subgroupSize: 5,
      target: CLOSURE_WEIGHT.mean,
      lowerSpecLimit: CLOSURE_WEIGHT.lsl,
      upperSpecLimit: CLOSURE_WEIGHT.usl,
      ruleSet: "nelson",
      safetyRelated: false,
      description: "One closure from each of the five cavity pairs, weighed on the press-side balance (0.001 g).",
      inControl: { kind: "normal", ...CLOSURE_WEIGHT },
      subgroups: variablesSubgroups(pressOne, pressOneLotTags, weights.subgroups),
    },
    {
      key: "flash-defects",
      processKey: "press-1",
      name: "Flash defects per 100 closures",
      unit: "defects per 100 closures",
      chartType: "u",
      subgroupSize: FLASH.nominalUnits,
      target: null,
      lowerSpecLimit: null,
      upperSpecLimit: null,
      ruleSet: "nelson",
      safetyRelated: false,
      description: "Flash counted by the vision check on every closure since the last check; units of 100 closures.",
      inControl: { kind: "poisson", ratePerUnit: FLASH.ratePerUnit },
      subgroups: attributesSubgroups(pressOne, pressOneLotTags, flash),
    },
    {
      key: "cap-height",
      processKey: "press-2",
      name: "Cap height",
      unit: "mm",
      chartType: "imr",
      subgroupSize: 1,
      target: CAP_HEIGHT.mean,
      lowerSpecLimit: CAP_HEIGHT.lsl,
      upperSpecLimit: CAP_HEIGHT.usl,
      ruleSet: "nelson",
      safetyRelated: false,
      description: `One closure from cavity ${CAVITY_MIXTURE.usualCavity} per check, height gauge (0.01 mm).`,
      inControl: { kind: "normal", ...CAP_HEIGHT },
      subgroups: variablesSubgroups(
        pressTwo,
        pressTwoLotTags,
        heights.values.map((value) => [value]),
        heights.cavities.map((cavity) => ({ cavity })),
      ),
    },
    {
      key: "short-shot-fraction",
      processKey: "press-2",
      name: "Short-shot fraction",
      unit: "fraction defective",
      chartType: "p",
      subgroupSize: SHORT_SHOT.nominalSample,
      target: null,
      lowerSpecLimit: null,
      upperSpecLimit: null,
      ruleSet: "nelson",
      // A short shot can leave the seal lip or tamper band incomplete on food-contact packaging.
      safetyRelated: true,
      description: "Closures with an incomplete fill (seal lip or tamper band) in a sample of 300 to 700 closures.",
      inControl: { kind: "binomial", proportion: SHORT_SHOT.proportion },
      subgroups: attributesSubgroups(pressTwo, pressTwoLotTags, shorts),
    },
  ];

  const heavyLot = pressOneLots.find((lot) => lot.start === WEIGHT_SHIFT.first)?.name ?? "";
  const events: DemoEvent[] = [
    ...lotChangeEvents("press-1", pressOne, pressOneLots),
    ...lotChangeEvents("press-2", pressTwo, pressTwoLots),
    ...pressOneEvents(pressOne, rng),
    ...pressTwoEvents(pressTwo),
    ...crewRotationEvents("press-1", pressOne),
    ...crewRotationEvents("press-2", pressTwo),
  ].sort((left, right) => left.occurredAt.getTime() - right.occurredAt.getTime());

  const start = [pressOne.times[0], pressTwo.times[0]]
    .filter((time): time is Date => time !== undefined)
    .reduce((earliest, time) => (time < earliest ? time : earliest));

  return {
    seed,
    start,
    end,
    siteName: DEMO_SITE_NAME,
    siteZone: DEMO_SITE_ZONE,
    areaName: DEMO_AREA_NAME,
    processes: DEMO_PROCESSES,
    characteristics,
    events,
    plantedEpisodes: plantedEpisodes(heavyLot, weights.slip),
  };
}
