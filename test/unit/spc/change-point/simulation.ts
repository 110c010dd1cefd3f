/**
 * Seeded simulation of change-point accuracy, in the design of Samuel, Pignatiello & Calvin (1998)
 * and Perry & Pignatiello (2006) as we recall it (from memory): a known number of in-control points,
 * then the change, and the series is cut at the first point beyond the 3-sigma limits after the
 * change (the chart's signal). Runs with a false alarm before the change are drawn again, as those
 * papers do, because the estimator is only used after a true signal.
 */
export interface ChangeScenario {
  /** Points in control: the true last in-control index is lastInControl = inControlCount − 1. */
  readonly inControlCount: number;
  /** Draws point `index` (0-based) given whether the change has happened. */
  readonly draw: (index: number, changed: boolean) => number;
  /** Whether a plotted value is beyond the control limits. */
  readonly beyondLimits: (value: number, index: number) => boolean;
  /** Longest series kept before giving up on a signal (the run is then cut there). */
  readonly maximumLength: number;
}

export interface Accuracy {
  readonly bias: number;
  readonly meanAbsoluteError: number;
  readonly withinOne: number;
  readonly withinThree: number;
  /** Fraction of runs whose confidence window contains the true change point. */
  readonly coverage: number;
  /** Mean width (end − start + 1) of the confidence window. */
  readonly meanWindowWidth: number;
}

interface Estimate {
  readonly index: number;
  readonly confidenceSet: { readonly start: number; readonly end: number };
}

/** One series that ends at the first signal after the change. */
export function drawSignalledSeries(scenario: ChangeScenario): Float64Array {
  for (;;) {
    const values: number[] = [];
    let falseAlarm = false;
    for (let index = 0; index < scenario.maximumLength; index++) {
      const changed = index >= scenario.inControlCount;
      const value = scenario.draw(index, changed);
      values.push(value);
      if (scenario.beyondLimits(value, index)) {
        if (!changed) falseAlarm = true;
        break;
      }
    }
    if (!falseAlarm) return Float64Array.from(values);
  }
}

export function measureAccuracy(
  scenario: ChangeScenario,
  estimate: (values: Float64Array) => Estimate,
  runs: number,
): Accuracy {
  const truth = scenario.inControlCount - 1;
  let errorSum = 0;
  let absoluteErrorSum = 0;
  let withinOne = 0;
  let withinThree = 0;
  let covered = 0;
  let widthSum = 0;
  for (let run = 0; run < runs; run++) {
    const result = estimate(drawSignalledSeries(scenario));
    const error = result.index - truth;
    errorSum += error;
    absoluteErrorSum += Math.abs(error);
    if (Math.abs(error) <= 1) withinOne++;
    if (Math.abs(error) <= 3) withinThree++;
    if (result.confidenceSet.start <= truth && truth <= result.confidenceSet.end) covered++;
    widthSum += result.confidenceSet.end - result.confidenceSet.start + 1;
  }
  return {
    bias: errorSum / runs,
    meanAbsoluteError: absoluteErrorSum / runs,
    withinOne: withinOne / runs,
    withinThree: withinThree / runs,
    coverage: covered / runs,
    meanWindowWidth: widthSum / runs,
  };
}
