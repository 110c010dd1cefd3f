/**
 * Attributes charts (Montgomery, Introduction to Statistical Quality Control, §7.2–7.3; NIST/SEMATECH
 * e-Handbook §6.3.3):
 * - p: p̂ᵢ = dᵢ/nᵢ, CL p̄ = Σd/Σn over the baseline, σᵢ = √(p̄(1 − p̄)/nᵢ): per-subgroup limits when the
 *   sample sizes vary; limits truncated to [0, 1].
 * - np: dᵢ, CL n·p̄, σ = √(n·p̄(1 − p̄)); needs one sample size n (the centre line would vary otherwise:
 *   use the p chart for varying sizes); limits truncated to [0, n].
 * - c: cᵢ, CL c̄, σ = √c̄ (Poisson); sizes are ignored (equal areas of opportunity by definition).
 * - u: uᵢ = cᵢ/nᵢ with nᵢ inspection units, CL ū = Σc/Σn, σᵢ = √(ū/nᵢ): per-subgroup limits.
 * ChartParameters.center holds p̄ (p, np), c̄ (c) or ū (u); sigma is NaN (it follows from the centre).
 */
import { assertDefectivesWithinSizes } from "../data";
import { SpcInputError, type AttributesData, type ChartData, type ChartParameters, type StatisticSeries } from "../types";
import { resolveBaseline } from "./baseline";
import { requireAttributes, type EstimateOptions } from "./chart-input";
import { constantSigma, limitSeries } from "./series";
import { summaryArray, type SubgroupSummaries } from "./summaries";

export type AttributesChart = "p" | "np" | "c" | "u";

/** The one sample size of an np chart, or an error naming the first subgroup of another size. */
function commonSampleSize(sizes: Float64Array, expected?: number): number {
  const size = expected ?? sizes[0]!;
  const index = sizes.findIndex((value) => value !== size);
  if (index >= 0) {
    throw new SpcInputError(
      `subgroup ${index} has sample size ${sizes[index]} where ${size} is expected (the np chart needs one sample size; use the p chart)`,
      index,
    );
  }
  return size;
}

function checkedAttributes(chart: AttributesChart, data: ChartData): AttributesData {
  const attributes = requireAttributes(data, chart);
  if (chart === "p" || chart === "np") assertDefectivesWithinSizes(attributes.counts, attributes.sizes);
  return attributes;
}

export function estimateAttributes(chart: AttributesChart, data: ChartData, options: EstimateOptions): ChartParameters {
  const attributes = checkedAttributes(chart, data);
  const subgroupSize = chart === "np" ? commonSampleSize(attributes.sizes) : 1;
  const baseline = resolveBaseline(attributes.counts.length, options.baseline);
  let countTotal = 0;
  let sizeTotal = 0;
  for (let index = 0; index < attributes.counts.length; index++) {
    if (baseline.used[index] === 1) {
      countTotal += attributes.counts[index]!;
      sizeTotal += chart === "c" ? 1 : attributes.sizes[index]!;
    }
  }
  return { chart, center: countTotal / sizeTotal, sigma: NaN, subgroupSize, baseline: baseline.summary };
}

/** The plotted statistic from the counts (and their sizes for p, np and u) under frozen parameters. */
export function attributesSeries(chart: AttributesChart, summaries: SubgroupSummaries, parameters: ChartParameters): StatisticSeries {
  const counts = summaryArray(summaries, "counts", chart);
  const count = counts.length;
  const rate = parameters.center;
  switch (chart) {
    case "p":
    case "u": {
      const sizes = summaryArray(summaries, "sizes", chart);
      if (chart === "p") assertDefectivesWithinSizes(counts, sizes);
      const points = rates(counts, sizes);
      const sigma = new Float64Array(count);
      const variance = chart === "p" ? rate * (1 - rate) : rate;
      for (let index = 0; index < count; index++) sigma[index] = Math.sqrt(variance / sizes[index]!);
      return limitSeries({
        key: chart,
        points,
        center: rate,
        sigma,
        floor: 0,
        ceiling: chart === "p" ? 1 : Infinity,
        zoneRulesByDefault: true,
      });
    }
    case "np": {
      const sizes = summaryArray(summaries, "sizes", chart);
      assertDefectivesWithinSizes(counts, sizes);
      const size = commonSampleSize(sizes, parameters.subgroupSize);
      return limitSeries({
        key: "np",
        points: counts,
        center: size * rate,
        sigma: constantSigma(count, Math.sqrt(size * rate * (1 - rate))),
        floor: 0,
        ceiling: size,
        zoneRulesByDefault: true,
      });
    }
    case "c":
      return limitSeries({
        key: "c",
        points: counts,
        center: rate,
        sigma: constantSigma(count, Math.sqrt(rate)),
        floor: 0,
        zoneRulesByDefault: true,
      });
  }
}

/** The plotted value of p and u charts: defectives (p) or defects (u) per unit inspected, countᵢ / sizeᵢ. */
export function rates(counts: Float64Array, sizes: Float64Array): Float64Array {
  const points = new Float64Array(counts.length);
  for (let index = 0; index < counts.length; index++) points[index] = counts[index]! / sizes[index]!;
  return points;
}
