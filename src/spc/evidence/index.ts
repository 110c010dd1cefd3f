/** Evidence checks for candidate causes, and cycle helpers. */
export { autocorrelation, whiteNoiseBand } from "./autocorrelation";
export { periodogram, dominantPeriod, fisherGPValue, type Periodogram, type DominantPeriod } from "./periodogram";
