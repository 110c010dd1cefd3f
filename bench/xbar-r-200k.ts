/**
 * Speed of X-bar/R limits and run rules on 200,000 subgroups of 5 (budget: under one second on the
 * project's 2-core machine). Timed: estimateParameters + evaluateChart (limits for both statistics) and
 * evaluateRules with all eight Nelson tests on the X-bar and R statistics, as `analyze` does by default.
 * Not timed: generating the seeded data. Reports the median of several runs after warm-up runs.
 *
 * Run: npx tsx bench/xbar-r-200k.ts   (exit code 1 when the median is over the budget)
 */
import { NELSON_RULES } from "../shared/constants";
import { estimateParameters, evaluateChart } from "../src/spc/charts";
import { variablesData } from "../src/spc/data";
import { createRng } from "../src/spc/random";
import { evaluateRules } from "../src/spc/rules";

const SUBGROUPS = 200_000;
const SUBGROUP_SIZE = 5;
const BUDGET_MILLISECONDS = 1000;
const WARM_UP_RUNS = 2;
const TIMED_RUNS = 7;
const SEED = 20240301;

const rng = createRng(SEED);
const subgroups = Array.from({ length: SUBGROUPS }, () =>
  Array.from({ length: SUBGROUP_SIZE }, () => 74 + 0.01 * rng.normal()),
);
const data = variablesData(subgroups);

function analyzeOnce(): number {
  const parameters = estimateParameters("xbar-r", data);
  const result = evaluateChart(data, parameters);
  let signals = 0;
  for (const series of result.statistics) signals += evaluateRules(series, NELSON_RULES).signals.length;
  return signals;
}

for (let run = 0; run < WARM_UP_RUNS; run++) analyzeOnce();
const times: number[] = [];
let signals = 0;
for (let run = 0; run < TIMED_RUNS; run++) {
  const start = performance.now();
  signals = analyzeOnce();
  times.push(performance.now() - start);
}
times.sort((a, b) => a - b);
const median = times[Math.floor(times.length / 2)]!;
const verdict = median <= BUDGET_MILLISECONDS ? "within" : "OVER";
console.log(
  `X-bar/R, ${SUBGROUPS.toLocaleString("en")} subgroups of ${SUBGROUP_SIZE} (seed ${SEED}): limits + Nelson 1-8 on xbar and r`,
);
console.log(
  `  median ${median.toFixed(1)} ms of ${TIMED_RUNS} runs (min ${times[0]!.toFixed(1)}, max ${times.at(-1)!.toFixed(1)}) after ${WARM_UP_RUNS} warm-up runs; ${signals} signals`,
);
console.log(`  budget ${BUDGET_MILLISECONDS} ms: ${verdict} (${((100 * median) / BUDGET_MILLISECONDS).toFixed(0)}% of the budget)`);
if (median > BUDGET_MILLISECONDS) process.exitCode = 1;
