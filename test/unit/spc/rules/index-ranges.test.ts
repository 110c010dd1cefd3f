import { describe, expect, test } from "vitest";
import { indexRanges } from "@/src/spc/rules";

// Ranges of consecutive indices written "first–last" are common practice in reports of flagged points.
describe("indexRanges", () => {
  test.each([
    { name: "no indices", indices: [], ranges: [] },
    { name: "one index", indices: [7], ranges: ["7"] },
    { name: "a run and single points", indices: [0, 1, 2, 3, 4, 9, 12, 13], ranges: ["0–4", "9", "12–13"] },
    { name: "a gap of one", indices: [3, 5], ranges: ["3", "5"] },
  ])("$name", ({ indices, ranges }) => {
    expect(indexRanges(indices)).toEqual(ranges);
  });
});
