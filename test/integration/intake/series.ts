/**
 * Seeded test series for every chart type (invented data): in control, then a planted shift so that
 * rules fire, written as subgroup inputs with one hour between subgroups.
 */
import type { ChartType } from "@/shared/constants";
import type { TSubgroupInput } from "@/shared/intake";
import { createRng } from "@/src/spc/random";

export const SUBGROUP_SIZE: Record<ChartType, number> = { imr: 1, "xbar-r": 5, "xbar-s": 4, p: 1, np: 200, c: 1, u: 1, ewma: 3, cusum: 1 };

const START = Date.parse("2026-01-05T06:00:00Z");
const HOUR = 3_600_000;

/** A Poisson draw by inversion (small means only; test data). */
function poisson(mean: number, uniform: () => number): number {
  let count = 0;
  let probability = Math.exp(-mean);
  let cumulative = probability;
  const target = uniform();
  while (target > cumulative && count < 1000) {
    count++;
    probability *= mean / count;
    cumulative += probability;
  }
  return count;
}

function binomial(size: number, proportion: number, uniform: () => number): number {
  let count = 0;
  for (let item = 0; item < size; item++) if (uniform() < proportion) count++;
  return count;
}

/** `length` subgroups; from `shiftAt` on the level moves up by `shift` (in σ for measured values, ×(1+shift) for rates). */
export function seededSubgroups(chart: ChartType, length: number, seed: number, shiftAt = Math.floor(length * 0.6), shift = 1.5): TSubgroupInput[] {
  const rng = createRng(seed);
  const uniform = () => rng.uniform();
  return Array.from({ length }, (_, index): TSubgroupInput => {
    const timestamp = new Date(START + index * HOUR).toISOString();
    const shifted = index >= shiftAt;
    switch (chart) {
      case "p": {
        const size = 150 + Math.floor(uniform() * 100);
        return { timestamp, count: binomial(size, shifted ? 0.05 * (1 + shift) : 0.05, uniform), size };
      }
      case "np":
        return { timestamp, count: binomial(200, shifted ? 0.05 * (1 + shift) : 0.05, uniform), size: 200 };
      case "c":
        return { timestamp, count: poisson(shifted ? 6 * (1 + shift / 2) : 6, uniform) };
      case "u": {
        const units = 2 + Math.round(uniform() * 30) / 10;
        return { timestamp, count: poisson(units * (shifted ? 3 * (1 + shift / 2) : 3), uniform), units };
      }
      default: {
        const level = 10 + (shifted ? shift * 0.2 : 0);
        const values = Array.from({ length: SUBGROUP_SIZE[chart] }, () => Math.round((level + 0.2 * rng.normal()) * 1000) / 1000);
        return { timestamp, values, tags: { cavity: String(1 + (index % 4)) } };
      }
    }
  });
}
