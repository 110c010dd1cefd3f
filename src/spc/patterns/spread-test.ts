/**
 * Did the process variation change over a stretch of subgroups? A test of the variance against the
 * in-control σ of the frozen limits, read from the data behind the R, S or MR chart:
 * - subgroups of 2 or more: the pooled within-subgroup variance, Σ(nᵢ − 1)sᵢ²/σ² ~ χ² with Σ(nᵢ − 1)
 *   degrees of freedom in control (the χ² test for a variance, NIST/SEMATECH e-Handbook §1.3.5.8);
 * - individuals: the moving ranges, S = Σ MRᵢ²/(2σ²) over k moving ranges. Each term is χ²₁ in control,
 *   but neighbouring moving ranges share a point (correlation of the squares 1/4), so Var S = 3k − 1 and
 *   S is approximated by c·χ²_ν with c = (3k − 1)/(2k), ν = 2k²/(3k − 1), matching mean and variance
 *   (Satterthwaite, F.E. (1946), "An approximate distribution of estimates of variance components",
 *   Biometrics Bulletin 2(6), 110–114).
 * Returns the variance ratio (estimated variance over σ²) and the two one-sided p-values. Cost: O(points).
 */
import chisquareCdf from "@stdlib/stats-base-dists-chisquare-cdf";
import { subgroupMeans, subgroupSizes } from "../data";
import type { VariablesData } from "../types";

export interface SpreadTest {
  readonly ratio: number;
  /** P(a ratio this large or larger | in control). */
  readonly pIncrease: number;
  /** P(a ratio this small or smaller | in control). */
  readonly pDecrease: number;
}

/** Test of the variation in subgroups start..end (inclusive); undefined when it has no degrees of freedom. */
export function spreadTest(data: VariablesData, sigma: number, start: number, end: number): SpreadTest | undefined {
  const sizes = subgroupSizes(data);
  const individuals = sizes.every((size) => size === 1);
  let scaled = 0;
  let terms = 0;
  if (individuals) {
    for (let index = Math.max(1, start); index <= end; index++) {
      const range = data.values[index]! - data.values[index - 1]!;
      scaled += (range * range) / (2 * sigma * sigma);
      terms += 1;
    }
    if (terms === 0) return undefined;
    const scale = (3 * terms - 1) / (2 * terms);
    const df = (2 * terms * terms) / (3 * terms - 1);
    return testOf(scaled / scale, df, scaled / terms);
  }
  const means = subgroupMeans(data);
  for (let index = start; index <= end; index++) {
    for (let position = data.offsets[index]!; position < data.offsets[index + 1]!; position++) {
      scaled += (data.values[position]! - means[index]!) ** 2 / (sigma * sigma);
    }
    terms += sizes[index]! - 1;
  }
  return terms === 0 ? undefined : testOf(scaled, terms, scaled / terms);
}

function testOf(statistic: number, df: number, ratio: number): SpreadTest {
  const below = chisquareCdf(statistic, df);
  return { ratio, pIncrease: 1 - below, pDecrease: below };
}
