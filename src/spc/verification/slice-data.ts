/**
 * Subgroups a..b−1 of chart data as chart data of their own (views, no copy for attributes; offsets
 * rebased for variables), so a verification window can be charted from a fresh start: an EWMA or CUSUM
 * restarts at the centre, and no run rule reaches back before the adjustment.
 */
import { SpcInputError, type ChartData } from "../types";
import { subgroupCount } from "../data";

export function sliceSubgroups(data: ChartData, start: number, end: number): ChartData {
  const total = subgroupCount(data);
  if (!(Number.isInteger(start) && Number.isInteger(end) && start >= 0 && start < end && end <= total)) {
    throw new SpcInputError(`subgroups ${start}..${end - 1} are not inside the ${total} subgroups of the data`, start);
  }
  if (data.kind === "attributes") {
    return { kind: "attributes", counts: data.counts.subarray(start, end), sizes: data.sizes.subarray(start, end) };
  }
  const first = data.offsets[start]!;
  const offsets = Uint32Array.from(data.offsets.subarray(start, end + 1), (offset) => offset - first);
  return { kind: "variables", values: data.values.subarray(first, data.offsets[end]!), offsets };
}
