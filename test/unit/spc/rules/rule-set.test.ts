/** Rule-set specifications (issue 3: "--rules nelson|we|<ids>"). Exact comparisons. */
import { describe, expect, test } from "vitest";
import { NELSON_RULES, RULE_IDS, WESTERN_ELECTRIC_RULES } from "@/shared/constants";
import { resolveRuleSet } from "@/src/spc/rules";
import { SpcInputError } from "@/src/spc/types";

describe("resolveRuleSet", () => {
  test.each([
    ["nelson", [...NELSON_RULES]],
    ["we", [...WESTERN_ELECTRIC_RULES]],
    [" WE ", [...WESTERN_ELECTRIC_RULES]],
    ["nelson-3, we-1,nelson-3", ["we-1", "nelson-3"]],
    ["nelson,we", [...RULE_IDS]],
    ["we-4,,nelson-8", ["we-4", "nelson-8"]],
  ])("%j → canonical order, no duplicates", (spec, expected) => {
    expect(resolveRuleSet(spec)).toEqual(expected);
  });

  test("an unknown id throws SpcInputError naming it, its position and the valid ids", () => {
    expect(() => resolveRuleSet("we-1, nelson-9")).toThrow(SpcInputError);
    expect(() => resolveRuleSet("we-1, nelson-9")).toThrow(
      /unknown rule "nelson-9" \(item 2 of the rule list\); valid: nelson, we, we-1, we-2, we-3, we-4, nelson-1/,
    );
  });

  test("an empty specification throws", () => {
    expect(() => resolveRuleSet(" , ")).toThrow(/no rules named/);
  });
});
