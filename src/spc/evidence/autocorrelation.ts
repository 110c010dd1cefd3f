/**
 * Sample autocorrelation function, as defined by Box & Jenkins, Time Series Analysis: Forecasting
 * and Control (1970/1976), §2.1.5: r_k = c_k / c_0 with
 *   c_k = (1/N) Σ_{t=1}^{N−k} (x_t − x̄)(x_{t+k} − x̄),
 * the divisor N (not N − k) keeping the sequence positive semi-definite. Under independence r_k has
 * standard error about 1/√N (Bartlett's approximation, same source), which `whiteNoiseBand` returns
 * as the 95 % band 1.96/√N.
 *
 * Refusals (thrown SpcInputError): fewer than 3 values, a non-finite value (the message names its
 * index), a lag outside 1..N−1, or constant data (c_0 = 0: no autocorrelation is defined).
 * Cost: O(N · maxLag).
 */
import { SpcInputError } from "../types";
import { centered, requireFiniteValues } from "./input";

/** r_0..r_maxLag (r_0 = 1). */
export function autocorrelation(values: Float64Array, maxLag: number): Float64Array {
  requireFiniteValues(values, "autocorrelation", 3);
  const count = values.length;
  if (!(Number.isInteger(maxLag) && maxLag >= 1 && maxLag <= count - 1)) {
    throw new SpcInputError(`maxLag must be an integer from 1 to ${count - 1}, got ${maxLag}`);
  }
  const { deviations, sumOfSquares } = centered(values);
  if (sumOfSquares === 0) throw new SpcInputError("autocorrelation: the values are constant");
  const result = new Float64Array(maxLag + 1);
  for (let lag = 0; lag <= maxLag; lag++) {
    let sum = 0;
    for (let index = 0; index + lag < count; index++) sum += (deviations[index] as number) * (deviations[index + lag] as number);
    result[lag] = sum / sumOfSquares;
  }
  return result;
}

/** Half-width of the approximate 95 % band for r_k of independent data: 1.96/√N (Bartlett). */
export function whiteNoiseBand(count: number): number {
  return 1.96 / Math.sqrt(count);
}
