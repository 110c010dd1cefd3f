/**
 * Isolation of a single point: how far it stands from the level of its neighbours, in units of their own
 * scatter, and whether the neighbours themselves look in control. A point far out with calm neighbours on
 * both sides is an outlier ("freak", Western Electric Handbook 1956, from memory); a point far out with
 * neighbours that are also off-centre belongs to a shift, a trend or a change in spread.
 * Inputs are standardised points zᵢ = (xᵢ − centre)/σᵢ; NaN points are skipped. Cost: O(radius).
 */
import { SpcInputError } from "../types";

export interface Isolation {
  readonly index: number;
  /** z of the point itself. */
  readonly value: number;
  /** Mean z of the neighbours. */
  readonly neighbourMean: number;
  /** Neighbours' count. */
  readonly neighbours: number;
  /** Mean z² of the neighbours about their own mean: near 1 when their scatter is in control. */
  readonly neighbourMeanSquare: number;
  /** (value − neighbourMean) in units of the in-control σ (1 after standardising). */
  readonly distance: number;
}

/** Isolation of point `index` against up to `radius` defined neighbours on each side. */
export function isolationOf(standardised: Float64Array, index: number, radius = 8): Isolation {
  const value = standardised[index];
  if (value === undefined || Number.isNaN(value)) {
    throw new SpcInputError(`isolation: no defined point at index ${index}`, index);
  }
  const neighbourValues: number[] = [];
  for (let offset = 1; offset <= radius; offset++) {
    for (const position of [index - offset, index + offset]) {
      const neighbour = standardised[position];
      if (neighbour !== undefined && !Number.isNaN(neighbour)) neighbourValues.push(neighbour);
    }
  }
  const neighbourMean =
    neighbourValues.length === 0 ? 0 : neighbourValues.reduce((sum, neighbour) => sum + neighbour, 0) / neighbourValues.length;
  return {
    index,
    value,
    neighbourMean,
    neighbours: neighbourValues.length,
    neighbourMeanSquare:
      neighbourValues.length === 0
        ? 0
        : neighbourValues.reduce((sum, neighbour) => sum + (neighbour - neighbourMean) ** 2, 0) / neighbourValues.length,
    distance: Math.abs(value - neighbourMean),
  };
}
