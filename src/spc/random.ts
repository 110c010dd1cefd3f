/**
 * Seeded random numbers for simulations (ARL checks, power by simulation, classifier calibration,
 * demo data). Pure code never reads a global generator: it takes an `Rng`.
 *
 * Uniforms come from the 32-bit Mersenne Twister (Matsumoto & Nishimura 1998, ACM TOMACS 8(1)) and
 * normals from the improved Ziggurat method (Doornik 2005), both from the stdlib-js packages, fed by
 * the same stream so one seed reproduces a whole run.
 */
import mt19937 from "@stdlib/random-base-mt19937";
import improvedZiggurat from "@stdlib/random-base-improved-ziggurat";

export interface Rng {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
}

/** A reproducible generator: the same seed gives the same sequence on every machine. */
export function createRng(seed: number): Rng {
  // The generator object carries `normalized` (uniform on [0, 1)); its published typings omit it.
  const twister = mt19937.factory({ seed: seed >>> 0 }) as unknown as { normalized: () => number };
  const uniform = twister.normalized;
  const normal = improvedZiggurat.factory({ prng: uniform });
  return { uniform: () => uniform(), normal: () => normal() };
}
