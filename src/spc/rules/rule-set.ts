/**
 * Rule-set specifications: "nelson" (Nelson 1984, tests 1–8), "we" (Western Electric 1956, rules 1–4) or
 * a comma-separated list of rule ids and set names, e.g. "we-1, nelson-3". Spaces around items are
 * ignored and letter case does not matter; the result has no duplicates and is in the canonical order
 * of RULE_IDS (shared/constants.ts).
 */
import { RULE_IDS, type RuleId } from "../../../shared/constants";
import { SpcInputError } from "../types";
import { RULE_SETS, ruleOrder } from "./definitions";

const isRuleId = (name: string): name is RuleId => (RULE_IDS as readonly string[]).includes(name);
const isRuleSetName = (name: string): name is keyof typeof RULE_SETS => Object.hasOwn(RULE_SETS, name);

/** The rules a specification names. Throws SpcInputError (with the item's 0-based position) for an unknown name. */
export function resolveRuleSet(spec: string): RuleId[] {
  const names = spec.split(",").map((name) => name.trim().toLowerCase());
  if (names.every((name) => name === "")) {
    throw new SpcInputError(`no rules named; use "nelson", "we" or a list of: ${RULE_IDS.join(", ")}`);
  }
  const rules = new Set<RuleId>();
  names.forEach((name, position) => {
    if (name === "") return;
    if (isRuleSetName(name)) for (const rule of RULE_SETS[name]) rules.add(rule);
    else if (isRuleId(name)) rules.add(name);
    else {
      throw new SpcInputError(
        `unknown rule "${name}" (item ${position + 1} of the rule list); valid: nelson, we, ${RULE_IDS.join(", ")}`,
        position,
      );
    }
  });
  return [...rules].sort((a, b) => ruleOrder(a) - ruleOrder(b));
}
