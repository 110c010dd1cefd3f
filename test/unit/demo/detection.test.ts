// The planted disturbances are strong enough for the engine to see: each characteristic's history is
// charted with Phase I limits from its first 300 subgroups (before any episode) and evaluated with all
// eight Nelson tests; every planted episode must raise a signal with a firing point inside its window.
// Signals in the in-control stretches are compared with the number the same charts and rules give on
// histories simulated from the in-control model alone (the prediction of the rules for this design).
import binomialFactory from "@stdlib/random-base-binomial";
import poissonFactory from "@stdlib/random-base-poisson";
import { describe, expect, test } from "vitest";
import { estimateParameters, evaluateChart } from "@/src/spc/charts";
import { attributesData, variablesData } from "@/src/spc/data";
import { createRng, type Rng } from "@/src/spc/random";
import { LONGEST_RULE_WINDOW, evaluateRules, resolveRuleSet } from "@/src/spc/rules";
import type { ChartData, Signal } from "@/src/spc/types";
import { roundToResolution } from "@/src/demo/series";
import type { DemoCharacteristic, DemoCharacteristicKey } from "@/src/demo/types";
import { characteristicOf, demoScenario, episodesOf } from "@/test/unit/demo/scenario-helpers";

/** Phase I window: subgroups 0..299, before the first planted episode (380). */
const BASELINE = { start: 0, end: 300 } as const;
/** Simulated in-control histories per characteristic: enough for a mean and sd of the signal count. */
const REPLICATES = 60;
const STANDARD_ERRORS = 4;

function chartData(characteristic: DemoCharacteristic, subgroups = characteristic.subgroups): ChartData {
  return characteristic.inControl.kind === "normal"
    ? variablesData(subgroups.map((subgroup) => subgroup.values))
    : attributesData(
        subgroups.map((subgroup) => subgroup.count ?? Number.NaN),
        subgroups.map((subgroup) => subgroup.size ?? Number.NaN),
      );
}

function signalsOf(characteristic: DemoCharacteristic, data: ChartData): Signal[] {
  const parameters = estimateParameters(characteristic.chartType, data, {
    baseline: BASELINE,
    subgroupSize: characteristic.inControl.kind === "normal" ? characteristic.subgroupSize : undefined,
  });
  const rules = resolveRuleSet(characteristic.ruleSet);
  return evaluateChart(data, parameters).statistics.flatMap((series) => evaluateRules(series, rules).signals);
}

/** Whether a point is outside every planted window, each extended by the longest rule window after it. */
function inControlPoint(key: DemoCharacteristicKey): (index: number) => boolean {
  const windows = episodesOf(demoScenario(), key);
  return (index) => windows.every((window) => index < window.first || index > window.last + LONGEST_RULE_WINDOW - 1);
}

function inControlSignalCount(key: DemoCharacteristicKey, signals: readonly Signal[]): number {
  const inControl = inControlPoint(key);
  return signals.filter((signal) => inControl(signal.firing[0] ?? Number.NaN)).length;
}

/** A history drawn from the in-control model only, with the scenario's own subgroup sizes. */
function simulatedHistory(characteristic: DemoCharacteristic, rng: Rng): ChartData {
  const model = characteristic.inControl;
  const subgroups = characteristic.subgroups;
  switch (model.kind) {
    case "normal":
      return variablesData(
        subgroups.map((subgroup) =>
          subgroup.values.map(() => roundToResolution(model.mean + model.sigma * rng.normal(), model.resolution)),
        ),
      );
    case "binomial": {
      const binomial = binomialFactory.factory({ prng: rng.uniform });
      const sizes = subgroups.map((subgroup) => subgroup.size ?? Number.NaN);
      return attributesData(sizes.map((size) => binomial(size, model.proportion)), sizes);
    }
    case "poisson": {
      const poisson = poissonFactory.factory({ prng: rng.uniform });
      const sizes = subgroups.map((subgroup) => subgroup.size ?? Number.NaN);
      return attributesData(sizes.map((size) => poisson(model.ratePerUnit * size)), sizes);
    }
  }
}

const KEYS: readonly DemoCharacteristicKey[] = ["closure-weight", "cap-height", "short-shot-fraction", "flash-defects"];

describe("the engine sees every planted episode", () => {
  test.each(demoScenario().plantedEpisodes.map((episode) => [episode.kind, episode.characteristic, episode] as const))(
    "%s in %s raises a signal inside its window",
    (_, key, episode) => {
      const characteristic = characteristicOf(demoScenario(), key);
      const signals = signalsOf(characteristic, chartData(characteristic));
      const inside = signals.filter((signal) => signal.firing.some((index) => index >= episode.first && index <= episode.last));
      expect(inside.length).toBeGreaterThan(0);
    },
  );
});

describe("in-control stretches raise about as many signals as the rules predict", () => {
  test.each(KEYS)("%s", (key) => {
    const characteristic = characteristicOf(demoScenario(), key);
    const observed = inControlSignalCount(key, signalsOf(characteristic, chartData(characteristic)));
    const rng = createRng(4242);
    const simulated = Array.from({ length: REPLICATES }, () =>
      inControlSignalCount(key, signalsOf(characteristic, simulatedHistory(characteristic, rng))),
    );
    const expected = simulated.reduce((sum, count) => sum + count, 0) / REPLICATES;
    const spread = Math.sqrt(simulated.reduce((sum, count) => sum + (count - expected) ** 2, 0) / (REPLICATES - 1));
    console.log(`${key}: ${observed} signals in the in-control stretches; in-control model predicts ${expected.toFixed(1)} ± ${spread.toFixed(1)}`);
    // The observed count is one draw of the same distribution when the stretches are truly in control:
    // within 4 simulated standard deviations of the simulated mean (the mean's own error, sd/sqrt(60), is small).
    expect(Math.abs(observed - expected)).toBeLessThan(STANDARD_ERRORS * spread);
  });
});
