/**
 * Periodogram and the dominant period of a cycle.
 *
 * Periodogram at the Fourier frequencies f_j = j/N (Schuster 1898; e.g. Brockwell & Davis, Time
 * Series: Theory and Methods, 2nd ed., §10.1):
 *   I(f_j) = (1/N) |Σ_t (x_t − x̄) e^{−2πi f_j t}|²,   j = 1..m,  m = ⌊(N − 1)/2⌋
 * (the zero frequency carries only the mean; the Nyquist frequency, period 2, is left out because
 * alternation is read by the mixture pattern, not as a cycle).
 * The dominant period is N/ĵ at the largest ordinate. Its strength is Fisher's g = I(f_ĵ)/Σ_j I(f_j),
 * the share of the variance in that one frequency, and its p-value is Fisher's exact test for a
 * periodic component in white noise (Fisher, R.A. (1929), "Tests of significance in harmonic
 * analysis", Proc. Royal Society A 125, 54–59; formula as given in Brockwell & Davis §10.2):
 *   P(G > g) = Σ_{k=1}^{⌊1/g⌋} (−1)^{k−1} C(m, k) (1 − k g)^{m−1}.
 * The alternating sum is clamped to [0, 1] against rounding (it is exact algebra but can lose digits
 * when p is near 1, where only "not significant" matters).
 *
 * Refusals (thrown SpcInputError): fewer than 5 values (m must be at least 2), a non-finite value,
 * constant data. Cost: O(N·m) by direct summation (no FFT needed at chart lengths).
 */
import gammaln from "@stdlib/math-base-special-gammaln";
import { SpcInputError } from "../types";
import { centered, requireFiniteValues } from "./input";

export interface Periodogram {
  /** frequencies[j − 1] = j/N, cycles per subgroup. */
  readonly frequencies: Float64Array;
  readonly ordinates: Float64Array;
}

export interface DominantPeriod {
  /** Period in subgroups, N/ĵ (not necessarily an integer). */
  readonly period: number;
  /** Fourier index ĵ (cycles over the whole series). */
  readonly harmonic: number;
  /** Fisher's g: the share of the variance at the peak, in (0, 1]. */
  readonly strength: number;
  /** Fisher's test of "no periodic component" (white noise). */
  readonly pValue: number;
}

export function periodogram(values: Float64Array): Periodogram {
  requireFiniteValues(values, "periodogram", 5);
  const count = values.length;
  const { deviations, sumOfSquares } = centered(values);
  if (sumOfSquares === 0) throw new SpcInputError("periodogram: the values are constant");
  const harmonics = Math.floor((count - 1) / 2);
  const frequencies = new Float64Array(harmonics);
  const ordinates = new Float64Array(harmonics);
  for (let harmonic = 1; harmonic <= harmonics; harmonic++) {
    const angle = (2 * Math.PI * harmonic) / count;
    let real = 0;
    let imaginary = 0;
    for (let index = 0; index < count; index++) {
      const deviation = deviations[index] as number;
      real += deviation * Math.cos(angle * index);
      imaginary -= deviation * Math.sin(angle * index);
    }
    frequencies[harmonic - 1] = harmonic / count;
    ordinates[harmonic - 1] = (real * real + imaginary * imaginary) / count;
  }
  return { frequencies, ordinates };
}

/** Fisher's exact p-value for the largest of m periodogram ordinates having share g. */
export function fisherGPValue(g: number, harmonics: number): number {
  let sum = 0;
  const terms = Math.min(Math.floor(1 / g), harmonics);
  for (let k = 1; k <= terms; k++) {
    const logBinomial = gammaln(harmonics + 1) - gammaln(k + 1) - gammaln(harmonics - k + 1);
    const term = Math.exp(logBinomial + (harmonics - 1) * Math.log1p(-k * g));
    sum += k % 2 === 1 ? term : -term;
  }
  return Math.min(1, Math.max(0, sum));
}

/** The strongest cycle in a series, its share of the variance and Fisher's p-value. */
export function dominantPeriod(values: Float64Array): DominantPeriod {
  const { ordinates } = periodogram(values);
  let best = 0;
  let total = 0;
  for (let position = 0; position < ordinates.length; position++) {
    total += ordinates[position] as number;
    if ((ordinates[position] as number) > (ordinates[best] as number)) best = position;
  }
  // Constant data were refused. A series whose variance sits only at the Nyquist frequency (pure
  // alternation) leaves only rounding noise at the other frequencies (Parseval: Σ I(f) over all
  // frequencies is Σ(x − x̄)²), and has no cycle to report.
  if (total <= 1e-12 * centered(values).sumOfSquares) throw new SpcInputError("dominantPeriod: the only variation is a period-2 alternation");
  const strength = (ordinates[best] as number) / total;
  const harmonic = best + 1;
  return { period: values.length / harmonic, harmonic, strength, pValue: fisherGPValue(strength, ordinates.length) };
}
