/** Pattern reading: the kind of change behind a chart's signals, its change point and causes to check. */
export { readPatterns, type ReadPatternsOptions } from "./read-patterns";
export { patternReport, type PatternReport, type ChangePointReport } from "./report";
export type { Pattern, PatternChangePoint, PatternEvidence, PatternKind, RecordingSlipReading } from "./pattern";
export { DEFAULT_PATTERN_THRESHOLDS, type PatternThresholds } from "./classify";
export { CAUSES_TO_CHECK, CAUSES_OF_REDUCED_SPREAD, type CauseHint } from "./causes";
export { recordingSlipCandidates, RECORDING_SLIPS, type RecordingSlip, type SlipCandidate } from "./recording-slip";
export { simulatePattern, type SimulatedKind, type SimulationSpec, type SimulatedSeries } from "./simulate";
export { groupIntoEpisodes, EPISODE_GAP, type Episode } from "./episodes";
