// The demo plant generator: deterministic from its seed, the documented shape, planted disturbances of
// the documented size where the metadata says, and in-control stretches that match the in-control model.
// Tolerances: sampling checks allow 4 standard errors (a false failure about once in 16 000 per check,
// and the data are fixed by the seed, so a pass is reproducible); the standard error is stated each time.
import { describe, expect, test } from "vitest";
import { CAUSE_CATEGORIES, CHART_TYPES, EVENT_KINDS } from "@/shared/constants";
import {
  CAP_HEIGHT,
  CAVITY_MIXTURE,
  CHILLER_CYCLE,
  CLOSURE_WEIGHT,
  DEMO_DAYS,
  FLASH,
  HEATER_DRIFT,
  SHORT_SHOT,
  SUBGROUP_COUNT,
  WEIGHT_SHIFT,
} from "@/src/demo/plant";
import { generateDemoScenario } from "@/src/demo/scenario";
import { transposeFirstDecimals } from "@/src/demo/series";
import type { DemoCharacteristic } from "@/src/demo/types";
import {
  DEMO_END,
  characteristicOf,
  demoScenario,
  episode,
  inControlSequences,
  mean,
  range,
  sampleStandardDeviation,
  valuesAt,
} from "@/test/unit/demo/scenario-helpers";

const HOUR = 3_600_000;
const STANDARD_ERRORS = 4;

/** Ordinary least-squares fit of y on the columns of `design`; returns coefficients and their standard errors. */
function leastSquares(design: readonly number[][], y: readonly number[]): { coefficients: number[]; errors: number[] } {
  const columns = design[0]?.length ?? 0;
  // Normal equations solved by Gauss-Jordan elimination on [X'X | I] (small, well-conditioned systems).
  const augmented = Array.from({ length: columns }, (_, row) =>
    Array.from({ length: 2 * columns }, (_, column) =>
      column < columns
        ? design.reduce((sum, x) => sum + (x[row] ?? 0) * (x[column] ?? 0), 0)
        : Number(column - columns === row),
    ),
  );
  for (let pivot = 0; pivot < columns; pivot += 1) {
    const pivotRow = augmented[pivot] ?? [];
    const divisor = pivotRow[pivot] ?? 1;
    for (let column = 0; column < 2 * columns; column += 1) pivotRow[column] = (pivotRow[column] ?? 0) / divisor;
    augmented.forEach((row, index) => {
      if (index === pivot) return;
      const factor = row[pivot] ?? 0;
      for (let column = 0; column < 2 * columns; column += 1) {
        row[column] = (row[column] ?? 0) - factor * (pivotRow[column] ?? 0);
      }
    });
  }
  const inverse = augmented.map((row) => row.slice(columns));
  const xty = Array.from({ length: columns }, (_, row) => design.reduce((sum, x, i) => sum + (x[row] ?? 0) * (y[i] ?? 0), 0));
  const coefficients = inverse.map((row) => row.reduce((sum, value, column) => sum + value * (xty[column] ?? 0), 0));
  const residuals = design.map((x, i) => (y[i] ?? 0) - x.reduce((sum, value, column) => sum + value * (coefficients[column] ?? 0), 0));
  const variance = residuals.reduce((sum, value) => sum + value * value, 0) / (y.length - columns);
  return { coefficients, errors: inverse.map((row, index) => Math.sqrt(variance * (row[index] ?? 0))) };
}

function counts(characteristic: DemoCharacteristic, sequences: readonly number[]): { count: number; size: number }[] {
  return sequences.map((sequence) => {
    const subgroup = characteristic.subgroups[sequence];
    return { count: subgroup?.count ?? Number.NaN, size: subgroup?.size ?? Number.NaN };
  });
}

describe("determinism", () => {
  test("the same seed and end give an identical scenario", () => {
    const again = generateDemoScenario({ seed: demoScenario().seed, end: DEMO_END });
    expect(again).toEqual(demoScenario());
  });

  test("a different seed gives different data but the same episode positions", () => {
    const other = generateDemoScenario({ seed: demoScenario().seed + 1, end: DEMO_END });
    const weights = (scenario: typeof other) => characteristicOf(scenario, "closure-weight").subgroups.flatMap((s) => s.values);
    expect(weights(other)).not.toEqual(weights(demoScenario()));
    expect(other.plantedEpisodes.map(({ kind, first, last }) => [kind, first, last])).toEqual(
      demoScenario().plantedEpisodes.map(({ kind, first, last }) => [kind, first, last]),
    );
  });

  test("the end time moves the calendar, not the measurements", () => {
    const later = generateDemoScenario({ seed: demoScenario().seed, end: new Date(DEMO_END.getTime() + 7 * 24 * HOUR) });
    const heights = (scenario: typeof later) => characteristicOf(scenario, "cap-height").subgroups.map((s) => s.values);
    expect(heights(later)).toEqual(heights(demoScenario()));
    expect(later.start.getTime() - demoScenario().start.getTime()).toBe(7 * 24 * HOUR);
  });

  test.each([
    ["a negative seed", -1],
    ["a fractional seed", 1.5],
    ["a seed beyond 32 bits", 2 ** 32],
  ])("refuses %s", (_, seed) => {
    expect(() => generateDemoScenario({ seed, end: DEMO_END })).toThrow(/unsigned 32-bit/);
  });

  test("refuses an invalid end time", () => {
    expect(() => generateDemoScenario({ seed: 1, end: new Date("not a date") })).toThrow(/valid date/);
  });
});

describe("shape", () => {
  const scenario = demoScenario();

  test("two presses, four characteristics of the documented chart types, 1080 subgroups each", () => {
    expect(scenario.processes.map((process) => process.key)).toEqual(["press-1", "press-2"]);
    expect(scenario.characteristics.map((c) => [c.key, c.chartType])).toEqual([
      ["closure-weight", "xbar-r"],
      ["flash-defects", "u"],
      ["cap-height", "imr"],
      ["short-shot-fraction", "p"],
    ]);
    for (const characteristic of scenario.characteristics) {
      expect(CHART_TYPES).toContain(characteristic.chartType);
      expect(characteristic.subgroups).toHaveLength(SUBGROUP_COUNT);
      expect(characteristic.subgroups.map((subgroup) => subgroup.sequence)).toEqual(range(0, SUBGROUP_COUNT - 1));
    }
  });

  test("closure weight has five readings per subgroup, cap height one, attributes a count and a size", () => {
    const weights = characteristicOf(scenario, "closure-weight").subgroups;
    expect(weights.every((subgroup) => subgroup.values.length === 5 && subgroup.count === null)).toBe(true);
    const heights = characteristicOf(scenario, "cap-height").subgroups;
    expect(heights.every((subgroup) => subgroup.values.length === 1)).toBe(true);
    for (const key of ["short-shot-fraction", "flash-defects"] as const) {
      for (const subgroup of characteristicOf(scenario, key).subgroups) {
        expect(subgroup.values).toHaveLength(0);
        expect(Number.isInteger(subgroup.count)).toBe(true);
        expect(subgroup.size).toBeGreaterThan(0);
      }
    }
    const shortShots = characteristicOf(scenario, "short-shot-fraction").subgroups;
    expect(shortShots.every((s) => (s.count ?? 0) <= (s.size ?? 0) && Number.isInteger(s.size))).toBe(true);
    const sizes = new Set(shortShots.map((subgroup) => subgroup.size));
    expect(sizes.size).toBeGreaterThan(100);
  });

  test("the total number of measured values stays small enough to seed in seconds", () => {
    const values = scenario.characteristics.reduce((sum, c) => sum + c.subgroups.reduce((n, s) => n + s.values.length, 0), 0);
    expect(values).toBe(SUBGROUP_COUNT * 6);
    expect(values).toBeLessThan(40_000);
  });

  test("timestamps increase, end no later than the given end, and span the documented number of days", () => {
    for (const characteristic of scenario.characteristics) {
      const times = characteristic.subgroups.map((subgroup) => subgroup.timestamp.getTime());
      times.forEach((time, index) => {
        if (index > 0) expect(time).toBeGreaterThan(times[index - 1] ?? Infinity);
      });
      const last = times.at(-1) ?? Number.NaN;
      expect(last).toBeLessThanOrEqual(DEMO_END.getTime());
      // The last check falls in the last complete shift before the end (at most 8 h + a shift back).
      expect(DEMO_END.getTime() - last).toBeLessThan(16 * HOUR);
      expect(last - (times[0] ?? Number.NaN)).toBeGreaterThan((DEMO_DAYS - 1) * 24 * HOUR);
    }
  });

  test("every subgroup carries lot, operator and shift tags; shifts run three checks each", () => {
    for (const characteristic of scenario.characteristics) {
      for (const subgroup of characteristic.subgroups) {
        expect(subgroup.tags.lot).toMatch(/^PP-\d{5}$/);
        expect(subgroup.tags.operator).toMatch(/^op-\d{2}$/);
        expect(["early", "late", "night"]).toContain(subgroup.tags.shift);
      }
      const shifts = characteristic.subgroups.map((subgroup) => subgroup.tags.shift);
      for (let first = 0; first < shifts.length; first += 3) {
        expect(new Set(shifts.slice(first, first + 3)).size).toBe(1);
      }
    }
  });

  test("events use the shared vocabulary, lie inside the history and are in time order", () => {
    expect(scenario.events.length).toBeGreaterThan(50);
    // Not a flood: at most about one event per day per press on average.
    expect(scenario.events.length).toBeLessThan(2 * DEMO_DAYS);
    let previous = -Infinity;
    for (const event of scenario.events) {
      expect(EVENT_KINDS).toContain(event.kind);
      if (event.causeCategory !== null) expect(CAUSE_CATEGORIES).toContain(event.causeCategory);
      expect(event.occurredAt.getTime()).toBeGreaterThanOrEqual(previous);
      expect(event.occurredAt.getTime()).toBeGreaterThanOrEqual(scenario.start.getTime());
      expect(event.occurredAt.getTime()).toBeLessThanOrEqual(scenario.end.getTime());
      expect(event.value === null).toBe(event.unit === null);
      previous = event.occurredAt.getTime();
    }
    const kinds = new Set(scenario.events.map((event) => event.kind));
    for (const kind of ["lot-change", "maintenance", "calibration", "environment", "operator-change"] as const) {
      expect(kinds).toContain(kind);
    }
    const dewPoints = scenario.events.filter((event) => event.description.includes("dew point"));
    expect(dewPoints.length).toBeGreaterThanOrEqual(4);
    expect(dewPoints.every((event) => event.unit === "°C" && event.value !== null)).toBe(true);
  });
});

describe("names", () => {
  // A few of the large closure and packaging groups (common practice: names known in the trade); the demo
  // must not borrow any of them, nor people's names (operators are codes).
  const REAL_PACKAGING_GROUPS = ["aptar", "bericap", "berry", "alpla", "amcor", "silgan", "crown", "closure systems", "guala"];

  test("site, area, processes, characteristics, lots and operators use invented names only", () => {
    const scenario = demoScenario();
    const names = [
      scenario.siteName,
      scenario.areaName,
      ...scenario.processes.flatMap((process) => [process.name, process.kind]),
      ...scenario.characteristics.flatMap((c) => [c.name, c.description]),
      ...scenario.events.map((event) => event.description),
      ...new Set(scenario.characteristics.flatMap((c) => c.subgroups.map((s) => s.tags.operator ?? ""))),
    ];
    for (const name of names) {
      for (const company of REAL_PACKAGING_GROUPS) expect(name.toLowerCase()).not.toContain(company);
    }
    expect(scenario.siteName).toContain("Demo");
  });
});

describe("planted episodes", () => {
  const scenario = demoScenario();

  test("metadata lists the five documented disturbances (the heater band shows on two charts)", () => {
    expect(scenario.plantedEpisodes.map(({ kind, characteristic, first, last }) => [kind, characteristic, first, last])).toEqual([
      ["level-shift", "closure-weight", 520, 573],
      ["drift", "cap-height", 380, 451],
      ["drift", "short-shot-fraction", 380, 451],
      ["cycle", "flash-defects", 640, 747],
      ["mixture", "cap-height", 900, 935],
      ["digit-slip", "closure-weight", 820, 820],
    ]);
    expect(episode(scenario, "flash-defects", "cycle").period).toBe(12);
  });

  test("(a) closure weight rises by the planted amount for exactly the lot that arrived right before it", () => {
    const weights = characteristicOf(scenario, "closure-weight");
    const shifted = valuesAt(weights, range(WEIGHT_SHIFT.first, WEIGHT_SHIFT.last));
    const inControl = valuesAt(weights, inControlSequences(scenario, "closure-weight"));
    // Standard error of a difference of two means of independent normal values with sigma 0.012 g.
    const standardError = CLOSURE_WEIGHT.sigma * Math.sqrt(1 / shifted.length + 1 / inControl.length);
    expect(Math.abs(mean(shifted) - mean(inControl) - WEIGHT_SHIFT.shift)).toBeLessThan(STANDARD_ERRORS * standardError);
    // Strong enough for a Shewhart X-bar chart: the shift is 2.8 standard errors of a subgroup mean.
    expect(WEIGHT_SHIFT.shift / (CLOSURE_WEIGHT.sigma / Math.sqrt(5))).toBeGreaterThan(2.5);

    const lots = weights.subgroups.map((subgroup) => subgroup.tags.lot);
    const heavyLot = lots[WEIGHT_SHIFT.first];
    expect(lots[WEIGHT_SHIFT.first - 1]).not.toBe(heavyLot);
    expect(lots[WEIGHT_SHIFT.last + 1]).not.toBe(heavyLot);
    expect(lots.filter((lot) => lot === heavyLot)).toHaveLength(WEIGHT_SHIFT.last - WEIGHT_SHIFT.first + 1);
    const times = weights.subgroups.map((subgroup) => subgroup.timestamp.getTime());
    const lotChange = scenario.events.find(
      (event) => event.processKey === "press-1" && event.kind === "lot-change" && event.description.includes(heavyLot ?? "?"),
    );
    expect(lotChange?.occurredAt.getTime()).toBeGreaterThan(times[WEIGHT_SHIFT.first - 1] ?? Infinity);
    expect(lotChange?.occurredAt.getTime()).toBeLessThan(times[WEIGHT_SHIFT.first] ?? -Infinity);
  });

  test("(b) cap height falls linearly at the planted slope and hot-runner maintenance follows the window", () => {
    const heights = characteristicOf(scenario, "cap-height");
    const sequences = range(HEATER_DRIFT.first, HEATER_DRIFT.last);
    const fit = leastSquares(sequences.map((sequence) => [1, sequence]), valuesAt(heights, sequences));
    const plantedSlope = HEATER_DRIFT.totalChange / sequences.length;
    expect(Math.abs((fit.coefficients[1] ?? 0) - plantedSlope)).toBeLessThan(STANDARD_ERRORS * (fit.errors[1] ?? 0));
    const times = heights.subgroups.map((subgroup) => subgroup.timestamp.getTime());
    const repair = scenario.events.find((event) => event.processKey === "press-2" && event.description.includes("heater band"));
    expect(repair?.kind).toBe("maintenance");
    expect(repair?.occurredAt.getTime()).toBeGreaterThan(times[HEATER_DRIFT.last] ?? Infinity);
    expect(repair?.occurredAt.getTime()).toBeLessThan(times[HEATER_DRIFT.last + 1] ?? -Infinity);
  });

  test("(b) short shots rise with the heater-band failure as planted", () => {
    const shortShots = characteristicOf(scenario, "short-shot-fraction");
    const window = counts(shortShots, range(HEATER_DRIFT.first, HEATER_DRIFT.last));
    // Expected defectives from the planted proportions, and the binomial standard error of their sum.
    const proportions = window.map((_, offset) => {
      const progress = (offset + 1) / window.length;
      return SHORT_SHOT.proportion * (1 + (HEATER_DRIFT.finalProportionFactor - 1) * progress);
    });
    const expected = window.reduce((sum, row, index) => sum + row.size * (proportions[index] ?? 0), 0);
    const variance = window.reduce((sum, row, index) => sum + row.size * (proportions[index] ?? 0) * (1 - (proportions[index] ?? 0)), 0);
    const observed = window.reduce((sum, row) => sum + row.count, 0);
    expect(Math.abs(observed - expected)).toBeLessThan(STANDARD_ERRORS * Math.sqrt(variance));
  });

  test("(c) flash defects cycle with the stated period and amplitude", () => {
    const flash = characteristicOf(scenario, "flash-defects");
    const rows = counts(flash, range(CHILLER_CYCLE.first, CHILLER_CYCLE.last));
    const phases = rows.map((_, offset) => (2 * Math.PI * offset) / CHILLER_CYCLE.period);
    const fit = leastSquares(
      phases.map((phase) => [1, Math.sin(phase), Math.cos(phase)]),
      rows.map((row) => row.count / row.size),
    );
    const [level = 0, sine = 0, cosine = 0] = fit.coefficients;
    const [levelError = 0, sineError = 0, cosineError = 0] = fit.errors;
    expect(Math.abs(level - FLASH.ratePerUnit)).toBeLessThan(STANDARD_ERRORS * levelError);
    expect(Math.abs(sine - FLASH.ratePerUnit * CHILLER_CYCLE.relativeAmplitude)).toBeLessThan(STANDARD_ERRORS * sineError);
    expect(Math.abs(cosine)).toBeLessThan(STANDARD_ERRORS * cosineError);
  });

  test("(d) cap-height readings alternate between two cavities with the planted offsets", () => {
    const heights = characteristicOf(scenario, "cap-height");
    const sequences = range(CAVITY_MIXTURE.first, CAVITY_MIXTURE.last);
    const high = sequences.filter((sequence) => (sequence - CAVITY_MIXTURE.first) % 2 === 0);
    const low = sequences.filter((sequence) => (sequence - CAVITY_MIXTURE.first) % 2 === 1);
    expect(new Set(high.map((sequence) => heights.subgroups[sequence]?.tags.cavity))).toEqual(new Set([CAVITY_MIXTURE.highCavity]));
    expect(new Set(low.map((sequence) => heights.subgroups[sequence]?.tags.cavity))).toEqual(new Set([CAVITY_MIXTURE.lowCavity]));
    const others = heights.subgroups.filter((s) => s.sequence < CAVITY_MIXTURE.first || s.sequence > CAVITY_MIXTURE.last);
    expect(others.every((subgroup) => subgroup.tags.cavity === CAVITY_MIXTURE.usualCavity)).toBe(true);
    // Standard error of a mean of 18 readings with sigma 0.06 mm.
    const standardError = CAP_HEIGHT.sigma / Math.sqrt(high.length);
    expect(Math.abs(mean(valuesAt(heights, high)) - (CAP_HEIGHT.mean + CAVITY_MIXTURE.offset))).toBeLessThan(STANDARD_ERRORS * standardError);
    expect(Math.abs(mean(valuesAt(heights, low)) - (CAP_HEIGHT.mean - CAVITY_MIXTURE.offset))).toBeLessThan(STANDARD_ERRORS * standardError);
  });

  test("(e) one closure weight is the intended reading with its first two decimals swapped", () => {
    const slip = episode(scenario, "closure-weight", "digit-slip");
    const details = slip.slip;
    expect(details).toBeDefined();
    if (details === undefined) return;
    const values = characteristicOf(scenario, "closure-weight").subgroups[slip.first]?.values ?? [];
    expect(values[details.position]).toBe(details.typed);
    const [intendedDigits, typedDigits] = [details.intended.toFixed(3), details.typed.toFixed(3)];
    expect(typedDigits).toBe(`${intendedDigits.slice(0, 2)}${intendedDigits[3]}${intendedDigits[2]}${intendedDigits.slice(4)}`);
    // The intended reading is an ordinary one; the typed one is far from the rest of its subgroup.
    expect(Math.abs(details.intended - CLOSURE_WEIGHT.mean)).toBeLessThan(4 * CLOSURE_WEIGHT.sigma);
    const neighbours = values.filter((_, position) => position !== details.position);
    expect(Math.abs(details.typed - mean(neighbours))).toBeGreaterThan(10 * CLOSURE_WEIGHT.sigma);
    expect(slip.magnitude).toBeCloseTo(details.typed - details.intended, 9);
  });

  test.each([
    [2.614, 3, 2.164],
    [18.27, 2, 18.72],
    [2.66, 3, null],
  ])("transposing the first decimals of %s (%s decimals) gives %s", (value, decimals, expected) => {
    expect(transposeFirstDecimals(value, decimals)).toBe(expected);
  });
});

describe("in-control stretches match the in-control model", () => {
  const scenario = demoScenario();

  test.each([
    ["closure-weight", CLOSURE_WEIGHT],
    ["cap-height", CAP_HEIGHT],
  ] as const)("%s: mean and standard deviation as configured, no serial correlation", (key, model) => {
    const characteristic = characteristicOf(scenario, key);
    const values = valuesAt(characteristic, inControlSequences(scenario, key));
    // Standard errors for normal data: sigma/sqrt(n) for the mean, about sigma/sqrt(2(n-1)) for the sd.
    expect(Math.abs(mean(values) - model.mean)).toBeLessThan((STANDARD_ERRORS * model.sigma) / Math.sqrt(values.length));
    expect(Math.abs(sampleStandardDeviation(values) / model.sigma - 1)).toBeLessThan(
      STANDARD_ERRORS / Math.sqrt(2 * (values.length - 1)),
    );
    // Lag-1 autocorrelation of consecutive values: standard error about 1/sqrt(n) under independence.
    const center = mean(values);
    const lagged = values.slice(1).reduce((sum, value, index) => sum + (value - center) * ((values[index] ?? 0) - center), 0);
    const total = values.reduce((sum, value) => sum + (value - center) ** 2, 0);
    expect(Math.abs(lagged / total)).toBeLessThan(STANDARD_ERRORS / Math.sqrt(values.length));
  });

  test.each([
    ["short-shot-fraction", (size: number) => size * SHORT_SHOT.proportion * (1 - SHORT_SHOT.proportion), SHORT_SHOT.proportion],
    ["flash-defects", (size: number) => size * FLASH.ratePerUnit, FLASH.ratePerUnit],
  ] as const)("%s: pooled rate as configured and binomial/Poisson dispersion", (key, countVariance, rate) => {
    const rows = counts(characteristicOf(scenario, key), inControlSequences(scenario, key));
    const totalCount = rows.reduce((sum, row) => sum + row.count, 0);
    const totalSize = rows.reduce((sum, row) => sum + row.size, 0);
    const variance = rows.reduce((sum, row) => sum + countVariance(row.size), 0);
    expect(Math.abs(totalCount - rate * totalSize)).toBeLessThan(STANDARD_ERRORS * Math.sqrt(variance));
    // Pearson dispersion: the mean squared standardised count is 1 when the counts are binomial or Poisson
    // with the configured rate (no extra variation between checks). One squared standardised count has
    // variance 2 + excess kurtosis, i.e. 2 + (1 - 6pq)/(npq) (binomial) or 2 + 1/mu (Poisson), below 2.4
    // here since npq >= 2.9 and mu >= 19 (from memory: moments of the binomial and Poisson distributions).
    const dispersion = rows.reduce((sum, row) => sum + (row.count - rate * row.size) ** 2 / countVariance(row.size), 0) / rows.length;
    expect(Math.abs(dispersion - 1)).toBeLessThan(STANDARD_ERRORS * Math.sqrt(2.4 / rows.length));
  });
});
