/**
 * Shape of a stretch of standardised points zᵢ = (xᵢ − centre)/σᵢ: the features that tell a mixture, a
 * stratification and a change in spread apart.
 *
 * - `meanSquare` = mean zᵢ²: 1 in control; ≪ 1 when the points hug the centre (Nelson 1984, test 7),
 *   ≫ 1 when they spread out or avoid the centre.
 * - `withinOne`, `beyondOne`: shares with |z| < 1 and |z| > 1 (0.683 and 0.317 for normal data);
 *   `bothSides` the smaller of the shares above and below among the points beyond 1σ (Nelson's test 8
 *   reads "on both sides of the centre line with none in zone C").
 * - `alternation`: share of successive differences that change sign (2/3 for independent data; Nelson's
 *   test 4 looks for 14 alternations in a row).
 * - `bimodality`: the sample bimodality coefficient BC = (g² + 1)/(k + 3(n−1)²/((n−2)(n−3))) with g the
 *   sample skewness and k the sample excess kurtosis, both bias-corrected; BC > 5/9 ≈ 0.555 (the value of
 *   the uniform distribution) points to two modes (Pfister, Schwarz, Janczyk, Dale & Freeman (2013),
 *   "Good things peak in pairs: a note on the bimodality coefficient", Frontiers in Psychology 4:700).
 * - `centreShare`: share of points within ±0.5 of their own standard deviation around their own mean
 *   (0.383 for normal data; a two-population mixture leaves a hole there). It does not depend on the
 *   limits, so it separates a mixture from a plain increase in spread, which also pushes points out.
 * Points that are NaN (undefined by definition) are skipped. Cost: O(N).
 */
import { SpcInputError } from "../types";

export interface ShapeFeatures {
  readonly count: number;
  readonly mean: number;
  readonly meanSquare: number;
  readonly withinOne: number;
  readonly beyondOne: number;
  readonly bothSides: number;
  readonly alternation: number;
  readonly bimodality: number;
  readonly centreShare: number;
}

/** Shape features of standardised points; needs at least 4 defined points. */
export function shapeFeatures(standardised: Float64Array): ShapeFeatures {
  const values = standardised.filter((value) => !Number.isNaN(value));
  const count = values.length;
  if (count < 4) throw new SpcInputError(`shape features need at least 4 defined points, got ${count}`);
  let sum = 0;
  let sumOfSquares = 0;
  let within = 0;
  let above = 0;
  let below = 0;
  for (const value of values) {
    sum += value;
    sumOfSquares += value * value;
    if (Math.abs(value) < 1) within += 1;
    else if (value > 1) above += 1;
    else if (value < -1) below += 1;
  }
  const mean = sum / count;
  let secondMoment = 0;
  for (const value of values) secondMoment += (value - mean) ** 2;
  const sd = Math.sqrt(secondMoment / (count - 1));
  let thirdSum = 0;
  let fourthSum = 0;
  let centre = 0;
  for (const value of values) {
    const scaled = sd > 0 ? (value - mean) / sd : 0;
    thirdSum += scaled ** 3;
    fourthSum += scaled ** 4;
    if (Math.abs(scaled) < 0.5) centre += 1;
  }
  let turns = 0;
  let comparisons = 0;
  for (let index = 2; index < count; index++) {
    const before = (values[index - 1] as number) - (values[index - 2] as number);
    const after = (values[index] as number) - (values[index - 1] as number);
    if (before === 0 || after === 0) continue;
    comparisons += 1;
    if (Math.sign(before) !== Math.sign(after)) turns += 1;
  }
  return {
    count,
    mean,
    meanSquare: sumOfSquares / count,
    withinOne: within / count,
    beyondOne: (above + below) / count,
    bothSides: above + below === 0 ? 0 : Math.min(above, below) / (above + below),
    alternation: comparisons === 0 ? 0 : turns / comparisons,
    bimodality: sd > 0 ? bimodalityCoefficient(count, thirdSum, fourthSum) : 0,
    centreShare: centre / count,
  };
}

/** BC from the sums of cubed and fourth powers of the standardised deviations (see the file comment). */
function bimodalityCoefficient(count: number, thirdSum: number, fourthSum: number): number {
  const n = count;
  const skewness = (n / ((n - 1) * (n - 2))) * thirdSum;
  // k + 3(n−1)²/((n−2)(n−3)) reduces to the kurtosis term alone.
  const kurtosisTerm = ((n * (n + 1)) / ((n - 1) * (n - 2) * (n - 3))) * fourthSum;
  return (skewness * skewness + 1) / kurtosisTerm;
}
