/**
 * The invented closure-moulding plant: names, the in-control process model and where each planted
 * disturbance sits. Every name here is made up for the demo; none belongs to a real company or person.
 *
 * Positions are 0-based subgroup sequence numbers, identical for every seed and every end date, so the
 * documentation, the tests and later features can point at them.
 */
import type { DemoProcess } from "./types";

export const DEMO_SITE_NAME = "Tarnwick Demo Closures Plant";
/** An invented plant in Great Britain: its pages show GMT in winter and BST in summer. */
export const DEMO_SITE_ZONE = "Europe/London";
export const DEMO_AREA_NAME = "Moulding hall";

export const DEMO_PROCESSES: readonly DemoProcess[] = [
  { key: "press-1", name: "Press 1", kind: "Injection-moulding press, 10-cavity mould, 38 mm PP closures" },
  { key: "press-2", name: "Press 2", kind: "Injection-moulding press, 16-cavity mould, 38 mm PP closures" },
];

/** Four months of three 8-hour shifts with three checks each: 1080 subgroups per characteristic. */
export const DEMO_DAYS = 120;
export const SHIFTS_PER_DAY = 3;
export const SUBGROUPS_PER_SHIFT = 3;
export const SUBGROUP_COUNT = DEMO_DAYS * SHIFTS_PER_DAY * SUBGROUPS_PER_SHIFT;

/** Shift names by starting hour (UTC): early 06-14, late 14-22, night 22-06. */
export const SHIFTS = [
  { name: "early", startHour: 6 },
  { name: "late", startHour: 14 },
  { name: "night", startHour: 22 },
] as const;

/** Three crews per press rotate through the shifts weekly (one operator each). */
export const CREWS: Readonly<Record<DemoProcess["key"], readonly string[]>> = {
  "press-1": ["op-01", "op-02", "op-03"],
  "press-2": ["op-04", "op-05", "op-06"],
};

/** Press 2 checks are taken 20 minutes after press 1's, so the two logs do not coincide. */
export const PRESS_CHECK_OFFSET_MINUTES: Readonly<Record<DemoProcess["key"], number>> = {
  "press-1": 0,
  "press-2": 20,
};

/** In-control model of each characteristic. */
export const CLOSURE_WEIGHT = { mean: 2.6, sigma: 0.012, resolution: 0.001, lsl: 2.54, usl: 2.66 } as const;
export const CAP_HEIGHT = { mean: 18.2, sigma: 0.06, resolution: 0.01, lsl: 17.9, usl: 18.5 } as const;
export const SHORT_SHOT = { proportion: 0.01, minSample: 300, maxSample: 700, nominalSample: 500 } as const;
/** Flash defects per 100 closures; a vision check inspects 2400..5600 closures (24..56 units of 100). */
export const FLASH = { ratePerUnit: 0.8, minClosures: 2400, maxClosures: 5600, nominalUnits: 40 } as const;

/** Resin lots last about six days (54 subgroups) on each press. */
export const TYPICAL_LOT_LENGTH = 54;

/**
 * (a) Level shift in closure weight: a new resin lot arrives right before `first` and the next lot,
 * right after `last`, ends it.
 */
export const WEIGHT_SHIFT = { first: 520, last: 573, shift: 0.015 } as const;

/**
 * (b) A failing hot-runner heater band on press 2: cap height falls linearly by `totalChange` mm over
 * `first..last`, and short shots rise to `finalProportionFactor` times their usual rate; hot-runner
 * maintenance right after `last` ends both.
 */
export const HEATER_DRIFT = { first: 380, last: 451, totalChange: -0.21, finalProportionFactor: 3.5 } as const;

/** (c) A fouled chiller on press 1: the flash-defect rate cycles by ±`relativeAmplitude` with `period`. */
export const CHILLER_CYCLE = { first: 640, last: 747, period: 12, relativeAmplitude: 0.5 } as const;

/**
 * (d) Two cavities on one chart: cap-height readings alternate between cavity 4 (runs `offset` high)
 * and cavity 11 (runs `offset` low) instead of coming from cavity 7.
 */
export const CAVITY_MIXTURE = {
  first: 900,
  last: 935,
  offset: 0.12,
  usualCavity: "7",
  highCavity: "4",
  lowCavity: "11",
} as const;

/** (e) A hand-typed closure weight with its first two decimals transposed. */
export const DIGIT_SLIP = { sequence: 820, preferredPosition: 2 } as const;

/** Dryer dew-point excursions on press 1 (before these subgroups), and how many subgroups each lasts. */
export const DEW_POINT_EXCURSIONS = [
  { before: 250, duration: 4 },
  { before: 511, duration: 5 },
  { before: 960, duration: 3 },
] as const;
