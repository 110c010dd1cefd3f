/**
 * Simulated detection power and false alarms of rule sets, checked against the closed form for
 * rule 1 alone (tolerance: four binomial standard errors of the simulated fraction, so a correct
 * simulation fails less than once in 10 000 runs of the suite) and against Champ & Woodall's
 * (1987, Technometrics 29, Table 1) in-control ARL of the four Western Electric rules, 91.75.
 */
import { describe, expect, test } from "vitest";
import { shewhartSignalProbability, simulateFalseAlarmProbability, simulateSignalProbability } from "@/src/spc/power";
import { createRng } from "@/src/spc/random";
import { evaluateRules } from "@/src/spc/rules";

describe("simulateSignalProbability with the rules engine", () => {
  test.each([
    { delta: 1, n: 1, m: 10 },
    { delta: 1, n: 5, m: 3 },
    { delta: 2, n: 1, m: 5 },
  ])("rule 1 alone matches 1 − β^m: δ = $delta, n = $n, m = $m", ({ delta, n, m }) => {
    const simulated = simulateSignalProbability({ delta, n, m, rules: ["we-1"], evaluate: evaluateRules, rng: createRng(7), runs: 4000 });
    const exact = shewhartSignalProbability(delta, n, m);
    expect(Math.abs(simulated.probability - exact)).toBeLessThan(4 * Math.sqrt((exact * (1 - exact)) / 4000));
  });

  test("more rules detect a 1-sigma shift sooner, and raise false alarms", () => {
    const common = { n: 1, m: 10, evaluate: evaluateRules, runs: 3000 } as const;
    const ruleOne = simulateSignalProbability({ ...common, delta: 1, rules: ["we-1"], rng: createRng(8) });
    const allFour = simulateSignalProbability({ ...common, delta: 1, rules: ["we-1", "we-2", "we-3", "we-4"], rng: createRng(9) });
    expect(allFour.probability).toBeGreaterThan(ruleOne.probability + 0.2);
    const alarmsOne = simulateFalseAlarmProbability({ ...common, rules: ["we-1"], rng: createRng(10) });
    const alarmsFour = simulateFalseAlarmProbability({ ...common, rules: ["we-1", "we-2", "we-3", "we-4"], rng: createRng(11) });
    expect(alarmsFour.probability).toBeGreaterThan(alarmsOne.probability);
  });

  test("false alarms of the four Western Electric rules over a long window agree with ARL 91.75", () => {
    // Run lengths of the four rules are close to geometric once past the first few points, so over
    // m = 200 the chance of no false alarm is near exp(−200/91.75) = 0.113; the zero-state start (no
    // history to complete a run) makes the first points a little quieter. Tolerance 0.03 covers
    // that and four standard errors (0.0057 each) of 3000 runs.
    const result = simulateFalseAlarmProbability({
      m: 200,
      rules: ["we-1", "we-2", "we-3", "we-4"],
      evaluate: evaluateRules,
      rng: createRng(12),
      runs: 3000,
    });
    expect(Math.abs(1 - result.probability - Math.exp(-200 / 91.75))).toBeLessThan(0.03);
  });
});
