/** Change-point estimators (when did it change?) and their confidence sets. */
export { stepChangePoint, type NormalChangePointOptions, type StepChangePoint } from "./step";
export { driftChangePoint, type DriftChangePoint } from "./drift";
export { poissonChangePoint, type PoissonChangePointOptions, type RateChangePoint } from "./poisson";
export { binomialChangePoint, type BinomialChangePointOptions } from "./binomial";
export { clockWindow, type ClockWindow } from "./clock-window";
export {
  likelihoodThreshold,
  DEFAULT_CONFIDENCE_LEVEL,
  type ChangePointWindow,
  type ChangePointConfidenceSet,
  type ChangePointSummary,
} from "./profile";
