/**
 * A stored signal as the API answers it: the domain's view plus the rule in words, so a line system can
 * show an operator what fired without a table of rule ids.
 */
import type { TSignalView } from "@/src/signals";
import { RULE_DEFINITIONS } from "@/src/spc/rules";

export function signalAnswer(signal: TSignalView) {
  return { ...signal, ruleDescription: RULE_DEFINITIONS[signal.rule].summary };
}

/**
 * Whether a signal returned by an append was opened by it or extended: appendSubgroups stamps a new
 * signal's detectedAt with the call's `now`, while an extended one keeps its earlier detectedAt.
 */
export function signalChange(signal: TSignalView, now: Date): "created" | "extended" {
  return signal.detectedAt.getTime() === now.getTime() ? "created" : "extended";
}
