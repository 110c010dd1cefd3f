/**
 * Average run lengths of the rules by seeded simulation, against published values.
 *
 * Each run feeds standard normal points shifted by δ (the plotted statistic's sigma is 1; centre 0,
 * limits ±3) one at a time to the stream form of the evaluator until any of the rules fires; the run
 * length is the number of points fed. Zero-state ARL, as in the sources.
 *
 * Tolerance: the Monte Carlo standard error of the mean run length, SE = s/√N (s the sample standard
 * deviation of the N run lengths). The estimate must lie within 4 SE of the published value (a correct
 * engine fails this with probability about 6e-5, and the seeds are fixed, so the result is reproducible),
 * and N is chosen so that 4 SE is at most 4% of the value: tight enough to tell the rules apart (for
 * example 8 in a row, C14 = 152.73, against Nelson's 9 in a row, whose in-control ARL is far larger).
 *
 * Sources:
 * - C1, C12, C13, C14: Champ, C.W. & Woodall, W.H. (1987), "Exact results for Shewhart control charts with
 *   supplementary runs rules", Technometrics 29, 393–399, Table 1 — published (secondary), as quoted in
 *   /work/shared/reference/published-values.md §2a. Their runs rules may fire before the window is
 *   full, as ours do (definitions.ts, convention 5).
 * - C1234 (all four Western Electric rules), 91.75 in control: computed by an independent Markov chain
 *   that reproduces every published C1–C14 value (published-values.md §2a); also published (secondary)
 *   in the Wikipedia article "Western Electric rules" ("one out of every 91.75 observations").
 * - C1 also has the closed form 1 / [Φ(−3−δ) + 1 − Φ(3−δ)] (published-values.md §2a), checked here with
 *   the stdlib normal CDF.
 */
import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import { describe, expect, test } from "vitest";
import { NELSON_RULES, type RuleId } from "@/shared/constants";
import { createRng } from "@/src/spc/random";
import { createRuleStream } from "@/src/spc/rules";

const individuals = { key: "x", center: 0, floor: Number.NEGATIVE_INFINITY, zoneRulesByDefault: true } as const;

/** Mean run length and its Monte Carlo standard error over `runs` seeded runs. */
function simulateArl(rules: readonly RuleId[], shift: number, runs: number, seed: number) {
  const rng = createRng(seed);
  let sum = 0;
  let sumOfSquares = 0;
  for (let run = 0; run < runs; run++) {
    const stream = createRuleStream(individuals, rules);
    let length = 0;
    let fired = false;
    while (!fired) {
      length++;
      fired = stream.push(rng.normal() + shift, 3, -3, 1).length > 0;
    }
    sum += length;
    sumOfSquares += length * length;
  }
  const mean = sum / runs;
  const variance = (sumOfSquares - runs * mean * mean) / (runs - 1);
  return { mean, standardError: Math.sqrt(variance / runs) };
}

const C1: RuleId[] = ["we-1"];
const C12: RuleId[] = ["we-1", "we-2"];
const C13: RuleId[] = ["we-1", "we-3"];
const C14: RuleId[] = ["we-1", "we-4"];
const C1234: RuleId[] = ["we-1", "we-2", "we-3", "we-4"];

describe("average run lengths (seeded simulation)", () => {
  test("the closed form for rule 1 alone gives the published 370.40 and 43.89", () => {
    const arl = (shift: number) => 1 / (normalCdf(-3 - shift, 0, 1) + 1 - normalCdf(3 - shift, 0, 1));
    expect(arl(0)).toBeCloseTo(370.4, 1); // to the printed 2 decimals, ±0.005 after rounding: 370.398
    expect(arl(1)).toBeCloseTo(43.89, 2);
  });

  test.each([
    { label: "C1, rule 1 alone, in control: 370.40", rules: C1, shift: 0, published: 370.4, runs: 12_000, seed: 1 },
    { label: "C1, rule 1 alone, 1σ shift: 43.89", rules: C1, shift: 1, published: 43.89, runs: 20_000, seed: 2 },
    { label: "C1234, Western Electric 1–4, in control: 91.75", rules: C1234, shift: 0, published: 91.75, runs: 20_000, seed: 3 },
    { label: "C1234, Western Electric 1–4, 1σ shift: 9.22", rules: C1234, shift: 1, published: 9.22, runs: 20_000, seed: 4 },
    { label: "C12, rules 1 and 2, in control: 225.44", rules: C12, shift: 0, published: 225.44, runs: 12_000, seed: 5 },
    { label: "C13, rules 1 and 3, 1σ shift: 12.66", rules: C13, shift: 1, published: 12.66, runs: 20_000, seed: 6 },
    { label: "C14, rules 1 and 4, in control: 152.73", rules: C14, shift: 0, published: 152.73, runs: 12_000, seed: 7 },
  ])("$label", ({ rules, shift, published, runs, seed }) => {
    const { mean, standardError } = simulateArl(rules, shift, runs, seed);
    expect(4 * standardError).toBeLessThan(0.04 * published);
    expect(Math.abs(mean - published)).toBeLessThan(4 * standardError);
  });

  test("the Nelson set signals much sooner in control than the Western Electric set (it has more tests)", () => {
    // Not a published figure: a consistency check that more tests raise the false-alarm rate.
    const nelson = simulateArl(NELSON_RULES, 0, 4_000, 8);
    expect(nelson.mean).toBeLessThan(91.75 - 4 * nelson.standardError);
  });
});
