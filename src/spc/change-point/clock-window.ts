/**
 * Clock times of a change-point window. A change after last in-control subgroup k happened after
 * subgroup k was taken and no later than subgroup k + 1 was taken; for a window of candidates
 * {start..end} that is (time[start], time[end + 1]]. start = -1 (change before the first point
 * analysed) has no earlier time in the window: `after` is null.
 */
import { SpcInputError } from "../types";
import type { ChangePointWindow } from "./profile";

export interface ClockWindow {
  /** The change happened after this time (null: before the first point analysed). */
  readonly after: number | null;
  /** ... and no later than this time. */
  readonly notLaterThan: number;
}

/** Converts an index window into times, given one timestamp (any numeric clock, e.g. epoch ms) per point. */
export function clockWindow(window: ChangePointWindow, timestamps: Float64Array): ClockWindow {
  const { start, end } = window;
  if (!(Number.isInteger(start) && Number.isInteger(end) && start >= -1 && start <= end)) {
    throw new SpcInputError(`window {${start}, ${end}} must be integers with -1 <= start <= end`);
  }
  const upper = timestamps[end + 1];
  if (upper === undefined) {
    throw new SpcInputError(`window end ${end} needs a timestamp at index ${end + 1}; there are ${timestamps.length}`, end + 1);
  }
  const lower = start === -1 ? null : (timestamps[start] as number);
  if (!Number.isFinite(upper) || (lower !== null && !Number.isFinite(lower))) {
    throw new SpcInputError(`timestamps at the window ends must be finite numbers`, start === -1 ? end + 1 : start);
  }
  return { after: lower, notLaterThan: upper };
}
