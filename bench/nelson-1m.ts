/**
 * Speed of the run rules: all eight Nelson tests over 1,000,000 individuals, against a bare single pass
 * summing the same Float64Array, measured in the same run (median of several repetitions after warm-up).
 * Target (issue 3): the rules take at most 10 times the bare pass. Exits 1 if the ratio exceeds 10.
 *
 * Both are timed in CPU time of this process (process.cpuUsage, user + system) and in wall time. The
 * ratio uses CPU time: on a shared machine busier than its cores, the wall time of the longer run also
 * counts the time spent waiting for a core, which the 1 ms bare pass mostly escapes.
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

const cpuMilliseconds = (usage: NodeJS.CpuUsage): number => (usage.user + usage.system) / 1000;

/** Median CPU and wall times in milliseconds of `run` after warm-up; `run` returns a value so it is not optimised away. */
function time(run: () => number): { cpu: number; wall: number; result: number } {
  let result = 0;
  for (let repetition = 0; repetition < WARM_UP; repetition++) result += run();
  const cpu: number[] = [];
  const wall: number[] = [];
  for (let repetition = 0; repetition < REPETITIONS; repetition++) {
    const startedCpu = process.cpuUsage();
    const startedWall = performance.now();
    result += run();
    wall.push(performance.now() - startedWall);
    cpu.push(cpuMilliseconds(process.cpuUsage(startedCpu)));
  }
  return { cpu: median(cpu), wall: median(wall), result };
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

function sum(values: Float64Array): number {
  let total = 0;
  for (let index = 0; index < values.length; index++) total += values[index]!;
  return total;
}

const bare = time(() => sum(points));
let signalCount = 0;
const rules = time(() => {
  signalCount = evaluateRules(series, NELSON_RULES).signals.length;
  return signalCount;
});

const ratio = rules.cpu / bare.cpu;
const format = (timing: { cpu: number; wall: number }) =>
  `${timing.cpu.toFixed(3)} ms CPU, ${timing.wall.toFixed(3)} ms wall (medians of ${REPETITIONS})`;
console.log(`points: ${POINTS.toLocaleString("en")} individuals, seeded in-control normal data`);
console.log(`bare sum pass:          ${format(bare)}`);
console.log(`nelson-1..8 evaluation: ${format(rules)}, ${signalCount} signals`);
console.log(`ratio (CPU): ${ratio.toFixed(2)} (limit ${MAXIMUM_RATIO}); ratio (wall): ${(rules.wall / bare.wall).toFixed(2)}`);
if (ratio > MAXIMUM_RATIO) {
  console.error(`FAIL: the rules take ${ratio.toFixed(2)} times the bare pass, above ${MAXIMUM_RATIO}`);
  process.exitCode = 1;
}
