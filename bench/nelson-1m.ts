/**
 * Speed of the run rules: all eight Nelson tests over 1,000,000 individuals, against a bare single pass
 * summing the same Float64Array, measured in the same run (median of several repetitions after warm-up).
 * Target (issue 3): the rules take at most 10 times the bare pass. Exits 1 if the ratio exceeds 10.
 *
 * Run: npx tsx bench/nelson-1m.ts
 */
import { NELSON_RULES } from "../shared/constants";
import { createRng } from "../src/spc/random";
import { evaluateRules } from "../src/spc/rules";
import type { StatisticSeries } from "../src/spc/types";

const POINTS = 1_000_000;
const WARM_UP = 5;
const REPETITIONS = 21;
const MAXIMUM_RATIO = 10;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/**
 * Median (and fastest) time in milliseconds of `run`, after warm-up runs; `run` returns a value so it is not
 * optimised away.
 */
function time(run: () => number): { milliseconds: number; fastest: number; result: number } {
  let result = 0;
  for (let repetition = 0; repetition < WARM_UP; repetition++) result += run();
  const times: number[] = [];
  for (let repetition = 0; repetition < REPETITIONS; repetition++) {
    const started = performance.now();
    result += run();
    times.push(performance.now() - started);
  }
  return { milliseconds: median(times), fastest: Math.min(...times), result };
}

const rng = createRng(20261202);
const points = new Float64Array(POINTS);
for (let index = 0; index < POINTS; index++) points[index] = 10 + 0.5 * rng.normal();
// Fixed limits of an individuals chart with centre 10 and sigma 0.5.
const series: StatisticSeries = {
  key: "x",
  points,
  center: 10,
  ucl: new Float64Array(POINTS).fill(11.5),
  lcl: new Float64Array(POINTS).fill(8.5),
  sigma: new Float64Array(POINTS).fill(0.5),
  floor: Number.NEGATIVE_INFINITY,
  zoneRulesByDefault: true,
};

const bare = time(() => {
  let total = 0;
  for (let index = 0; index < points.length; index++) total += points[index]!;
  return total;
});
let signalCount = 0;
const rules = time(() => {
  const evaluation = evaluateRules(series, NELSON_RULES);
  signalCount = evaluation.signals.length;
  return signalCount;
});

const ratio = rules.milliseconds / bare.milliseconds;
console.log(`points: ${POINTS.toLocaleString("en")} individuals, seeded in-control normal data`);
console.log(
  `bare sum pass:          ${bare.milliseconds.toFixed(3)} ms (median of ${REPETITIONS}; fastest ${bare.fastest.toFixed(3)})`,
);
console.log(
  `nelson-1..8 evaluation: ${rules.milliseconds.toFixed(3)} ms (median of ${REPETITIONS}; fastest ` +
    `${rules.fastest.toFixed(3)}), ${signalCount} signals`,
);
console.log(`ratio: ${ratio.toFixed(2)} (limit ${MAXIMUM_RATIO})`);
if (ratio > MAXIMUM_RATIO) {
  console.error(`FAIL: the rules take ${ratio.toFixed(2)} times the bare pass, above ${MAXIMUM_RATIO}`);
  process.exitCode = 1;
}
