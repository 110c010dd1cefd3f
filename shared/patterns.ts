/**
 * The kinds of chart pattern the engine reads from a signal, with plain labels and a short explanation
 * for the UI. The engine (src/spc/patterns/) and the browser both take the vocabulary from here.
 */

export const PATTERN_KINDS = [
  "shift",
  "trend",
  "cycle",
  "mixture",
  "stratification",
  "outlier",
  "spread",
] as const;
export type PatternKind = (typeof PATTERN_KINDS)[number];

export const PATTERN_KIND_LABELS: Record<PatternKind, string> = {
  shift: "Shift in level",
  trend: "Steady drift",
  cycle: "Recurring wave",
  mixture: "Two populations on one chart",
  stratification: "Too little variation",
  outlier: "Single odd point",
  spread: "Change in spread",
};

export const PATTERN_KIND_EXPLANATIONS: Record<PatternKind, string> = {
  shift:
    "The process settled at a new level at one moment and stayed there. Something changed once and for " +
    "all: a new lot of material, a different setting, a repaired or replaced part, another method. The " +
    "estimated change point tells you where to look in the event log.",
  trend:
    "The level moves steadily in one direction, subgroup after subgroup. Something is wearing, heating, " +
    "loading or drying gradually: a tool, a heater band, a filter, a gauge that drifts. The change point " +
    "marks where the drift began, the slope how fast it goes.",
  cycle:
    "The points rise and fall in a wave that repeats at a regular interval. Look for anything that repeats " +
    "on the same rhythm: day and night temperature, a chiller or dryer cycling, shift rotation, maintenance " +
    "or cleaning intervals. The period says how many subgroups one wave takes.",
  mixture:
    "The points avoid the centre line and crowd towards both limits, or jump up and down in turn. Two " +
    "populations are being posted to one chart: two machines, cavities, heads, gauges or material lots. " +
    "Split the data by that source and chart each stream on its own.",
  stratification:
    "The points hug the centre line far more closely than the limits allow. The limits are too wide for " +
    "these data: they were often computed from mixed streams (each subgroup takes one part from each " +
    "source), or the gauge rounds so coarsely that little variation shows.",
  outlier:
    "One point stands apart while its neighbours look normal. A single event hit one subgroup, or the " +
    "value was measured or written down wrongly. Check the measurement and the record first; a plausible " +
    "recording slip is shown with the value that was probably meant.",
  spread:
    "The variation within subgroups grew (or, welcome, shrank) while the level may have stayed put. Look " +
    "at what makes parts differ from one another: worn or loose machine parts, inconsistent material, " +
    "differences between people doing the same task.",
};
