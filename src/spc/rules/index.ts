/**
 * Run rules: the four Western Electric rules (Statistical Quality Control Handbook, 1956) and Nelson's
 * eight tests (Nelson 1984, Journal of Quality Technology 16(4)). Conventions in definitions.ts.
 */
export { RULE_DEFINITIONS, RULE_SETS, LONGEST_RULE_WINDOW, type RuleDefinition } from "./definitions";
export { resolveRuleSet } from "./rule-set";
export { indexRanges } from "./index-ranges";
export { planRules, type RuleOptions, type SkippedRule } from "./applicability";
export { evaluateRules, ruleFirings, type RuleEvaluation } from "./evaluate";
export { firingsAt, createRuleStream, RULE_TAIL_LENGTH, type RuleStream } from "./incremental";
export { mergeFirings, continuesSignal } from "./merge";
export type { Firing } from "./scanner";
