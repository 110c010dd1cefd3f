/**
 * Evidence for a shift that does not trust the centre line: the likelihood-ratio statistic for one
 * change in the mean of a normal sequence with both means unknown and σ known (Hawkins, D.M. (1977),
 * "Testing a sequence of observations for a shift in location", JASA 72, 180–186; Worsley, K.J. (1979),
 * "On the likelihood ratio test for a shift in location of normal populations", JASA 74, 365–367;
 * both from memory). On standardised points z₁..z_T (σ = 1), splitting after k points,
 *   ℓ(k) = k(T − k)/(2T) · (z̄₁..ₖ − z̄ₖ₊₁..T)²,   statistic = max over k = 1..T−1.
 * The step estimator of Samuel et al. (change-point/step.ts) measures the new level against a known
 * in-control centre; when the limits were computed from data that already contain the shift, that centre
 * lies between the two levels and the step statistic sees only part of the change. This one compares the
 * two segments with each other, so it sees all of it. NaN points count as 0 (the caller's convention for
 * points set aside). Cost: O(T) with prefix sums.
 */
export function segmentShiftLogLikelihood(standardised: Float64Array): number {
  const count = standardised.length;
  let total = 0;
  for (const value of standardised) total += Number.isNaN(value) ? 0 : value;
  let best = 0;
  let prefix = 0;
  for (let split = 1; split < count; split++) {
    const value = standardised[split - 1]!;
    prefix += Number.isNaN(value) ? 0 : value;
    const difference = prefix / split - (total - prefix) / (count - split);
    best = Math.max(best, ((split * (count - split)) / (2 * count)) * difference * difference);
  }
  return best;
}
