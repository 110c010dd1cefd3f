/** Input checks shared by the evidence tests (one error-message pattern everywhere). */
import { SpcInputError } from "../types";

/** At least `minimum` values, every one finite; the message names the first bad index. */
export function requireFiniteValues(values: ArrayLike<number>, name: string, minimum: number): void {
  if (values.length < minimum) {
    throw new SpcInputError(`${name}: needs at least ${minimum} values, got ${values.length}`);
  }
  for (let index = 0; index < values.length; index++) {
    if (!Number.isFinite(values[index])) {
      throw new SpcInputError(`${name}: value at index ${index} is not a finite number`, index);
    }
  }
}

/** Two arrays that pair up value by value. */
export function requireSameLength(first: ArrayLike<unknown>, second: ArrayLike<unknown>, name: string): void {
  if (first.length !== second.length) {
    throw new SpcInputError(`${name}: the two inputs have ${first.length} and ${second.length} entries`);
  }
}

/** Deviations from the mean and their sum of squares (the building block of ACF and periodogram). */
export function centered(values: ArrayLike<number>): { deviations: Float64Array; sumOfSquares: number } {
  let mean = 0;
  for (let index = 0; index < values.length; index++) mean += values[index] as number;
  mean /= values.length;
  const deviations = Float64Array.from(values, (value) => value - mean);
  let sumOfSquares = 0;
  for (const deviation of deviations) sumOfSquares += deviation * deviation;
  return { deviations, sumOfSquares };
}
