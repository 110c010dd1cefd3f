/** Detection power and false alarms over a verification window. */
export {
  shewhartMissProbability,
  shewhartSignalProbability,
  shewhartAverageRunLength,
  subgroupsNeeded,
  SHEWHART_LIMIT_WIDTH,
  type SubgroupsNeededOptions,
} from "./shewhart";
export {
  simulateSignalProbability,
  simulateFalseAlarmProbability,
  type RuleEvaluator,
  type SimulationOptions,
  type SimulatedProbability,
} from "./simulate";
