/**
 * The single-pass run-rule scanner shared by the batch evaluation and the incremental (live) form.
 *
 * Every rule of Western Electric (1956) and Nelson (1984) (definitions.ts: the rules and the conventions)
 * is decided from bit histories updated once per point: for each of "above the centre", "below",
 * "beyond 1σ above", "beyond 1σ below", "beyond 2σ above", "beyond 2σ below", "within 1σ", "increase
 * from the previous point" and "decrease", bit j of the history says whether that held j points ago
 * (15 bits are kept: the longest window). A rule is then a mask test: 9 in a row above is
 * `(above & 0x1FF) === 0x1FF`, 2 of 3 beyond 2σ a count of set bits among 3. Cost: a few integer
 * operations per point, no branch that depends on noise, no allocation except one small object per
 * firing, no window rescanned.
 *
 * The state is bounded by construction: whether a rule fires at point i, and where its window starts,
 * depends only on the points i − 14 .. i, so a scanner fed those points alone gives the same answer as
 * one fed the whole history.
 */
import type { RuleId, StatisticKey } from "../../../shared/constants";
import { SpcInputError } from "../types";
import { LONGEST_RULE_WINDOW, ruleOrder } from "./definitions";

/** One rule firing at one point: the window of the rule ending at `index` starts at `windowStart`. */
export interface Firing {
  readonly rule: RuleId;
  readonly chart: StatisticKey;
  readonly index: number;
  readonly windowStart: number;
  readonly side?: "above" | "below";
}

const bit = (rule: RuleId): number => 1 << ruleOrder(rule);
const WE_1 = bit("we-1");
const WE_2 = bit("we-2");
const WE_3 = bit("we-3");
const WE_4 = bit("we-4");
const NELSON_1 = bit("nelson-1");
const NELSON_2 = bit("nelson-2");
const NELSON_3 = bit("nelson-3");
const NELSON_4 = bit("nelson-4");
const NELSON_5 = bit("nelson-5");
const NELSON_6 = bit("nelson-6");
const NELSON_7 = bit("nelson-7");
const NELSON_8 = bit("nelson-8");
const LIMIT_RULES = WE_1 | NELSON_1;
const RUN_RULES = ~LIMIT_RULES;

/** Number of set bits in 0..31: the count of points beyond a boundary among the last 3 or 5. */
const BITS_SET = Uint8Array.from({ length: 32 }, (_, mask) => {
  let count = 0;
  for (let rest = mask; rest !== 0; rest >>= 1) count += rest & 1;
  return count;
});

/** Bits kept in each history: one per point of the longest window (15). */
const HISTORY = (1 << LONGEST_RULE_WINDOW) - 1;

export function ruleMask(rules: readonly RuleId[]): number {
  let mask = 0;
  for (const rule of rules) mask |= bit(rule);
  return mask;
}

/** The arrays of a statistic series the scanner reads. */
export interface ScanArrays {
  readonly points: Float64Array;
  readonly ucl: Float64Array;
  readonly lcl: Float64Array;
  readonly sigma: Float64Array;
}

export class RuleScanner {
  private readonly chart: StatisticKey;
  private readonly rules: number;
  private readonly center: number;
  private readonly floor: number;
  /** First index of the current stretch of values (the first index fed, or just after the last NaN). */
  private stretchStart: number;
  private previous = Number.NaN;
  private above = 0;
  private below = 0;
  private oneAbove = 0;
  private oneBelow = 0;
  private twoAbove = 0;
  private twoBelow = 0;
  private within = 0;
  private rising = 0;
  private falling = 0;

  constructor(chart: StatisticKey, rules: number, center: number, floor: number, firstIndex = 0) {
    this.chart = chart;
    this.stretchStart = firstIndex;
    this.rules = rules;
    this.center = center;
    this.floor = floor;
  }

  /**
   * Feed positions `from` .. `to` − 1 of the arrays; `offset` + position is the point's index in the
   * whole series. Firings are appended to `out` in index order.
   */
  scan(arrays: ScanArrays, from: number, to: number, offset: number, out: Firing[]): void {
    const { points, ucl, lcl, sigma } = arrays;
    const { rules, center, floor, chart } = this;
    // Module constants copied to locals: the loop then reads registers, not the module context.
    const bitsSet = BITS_SET;
    const history = HISTORY;
    const limitRules = (rules & LIMIT_RULES) !== 0;
    const runRules = (rules & RUN_RULES) !== 0;
    const we1 = (rules & WE_1) !== 0;
    const we2 = (rules & WE_2) !== 0;
    const we3 = (rules & WE_3) !== 0;
    const we4 = (rules & WE_4) !== 0;
    const nelson1 = (rules & NELSON_1) !== 0;
    const nelson2 = (rules & NELSON_2) !== 0;
    const nelson3 = (rules & NELSON_3) !== 0;
    const nelson4 = (rules & NELSON_4) !== 0;
    const nelson5 = (rules & NELSON_5) !== 0;
    const nelson6 = (rules & NELSON_6) !== 0;
    const nelson7 = (rules & NELSON_7) !== 0;
    const nelson8 = (rules & NELSON_8) !== 0;
    let stretchStart = this.stretchStart;
    let previous = this.previous;
    let above = this.above;
    let below = this.below;
    let oneAbove = this.oneAbove;
    let oneBelow = this.oneBelow;
    let twoAbove = this.twoAbove;
    let twoBelow = this.twoBelow;
    let within = this.within;
    let rising = this.rising;
    let falling = this.falling;

    for (let position = from; position < to; position++) {
      const value = points[position]!;
      const index = offset + position;
      if (!(value - value === 0)) {
        if (value !== value) {
          // No value by definition: every run and window restarts after it.
          stretchStart = index + 1;
          previous = Number.NaN;
          above = below = oneAbove = oneBelow = twoAbove = twoBelow = within = rising = falling = 0;
          continue;
        }
        throw new SpcInputError(`${chart}: point ${index} is not finite (${value})`, index);
      }

      if (limitRules && (value > ucl[position]! || value < lcl[position]!)) {
        const side = value > ucl[position]! ? "above" : "below";
        if (we1) out.push({ rule: "we-1", chart, index, windowStart: index, side });
        if (nelson1) out.push({ rule: "nelson-1", chart, index, windowStart: index, side });
      }
      if (!runRules) continue;

      const deviation = sigma[position]!;
      if (deviation < 0) throw new SpcInputError(`${chart}: sigma at point ${index} is negative (${deviation})`, index);
      // Zone boundaries. A lower boundary below the floor is undefined: nothing is beyond it, and a point
      // below the centre is not known to be within 1σ. A NaN sigma makes every zone comparison false.
      const upperOne = center + deviation;
      const lowerOne = center - deviation;
      const lowerTwo = center - 2 * deviation;
      const lowerOneDefined = lowerOne >= floor;
      const beyondOneLower = lowerOneDefined ? lowerOne : Number.NEGATIVE_INFINITY;
      const withinOneLower = lowerOneDefined ? lowerOne : center;
      const beyondTwoLower = lowerTwo >= floor ? lowerTwo : Number.NEGATIVE_INFINITY;
      // Flags as 0/1 arithmetic rather than branches: on noisy data they are coin flips, and
      // mispredicted branches would cost several times the rest.
      const step = value - previous; // NaN after a restart: neither an increase nor a decrease
      above = ((above << 1) | +(value > center)) & history;
      below = ((below << 1) | +(value < center)) & history;
      oneAbove = ((oneAbove << 1) | +(value > upperOne)) & history;
      oneBelow = ((oneBelow << 1) | +(value < beyondOneLower)) & history;
      twoAbove = ((twoAbove << 1) | +(value > center + 2 * deviation)) & history;
      twoBelow = ((twoBelow << 1) | +(value < beyondTwoLower)) & history;
      within = ((within << 1) | (+(value <= upperOne) & +(value >= withinOneLower))) & history;
      rising = ((rising << 1) | +(step > 0)) & history;
      falling = ((falling << 1) | +(step < 0)) & history;
      previous = value;

      // Firing checks, each rarely true so its branch is well predicted. Masks: 0xff = the last 8
      // points, 0x1ff = 9, 0x1f = 5, 0x7 = 3, 0x1fff = 13, 0xfff = 12.
      const sameSide = (above & 0xff) === 0xff ? 1 : (below & 0xff) === 0xff ? -1 : 0;
      if (sameSide !== 0) {
        const side = sameSide > 0 ? "above" : "below";
        if (we4) out.push({ rule: "we-4", chart, index, windowStart: index - 7, side });
        if (nelson2 && ((sameSide > 0 ? above : below) & 0x1ff) === 0x1ff) {
          out.push({ rule: "nelson-2", chart, index, windowStart: index - 8, side });
        }
      }
      if (nelson3 && ((rising & 0x1f) === 0x1f || (falling & 0x1f) === 0x1f)) {
        out.push({ rule: "nelson-3", chart, index, windowStart: index - 5 });
      }
      // 13 successive differences, none zero, each of the opposite sign to the one before.
      if (nelson4 && ((rising | falling) & 0x1fff) === 0x1fff && ((rising ^ (rising >> 1)) & 0xfff) === 0xfff) {
        out.push({ rule: "nelson-4", chart, index, windowStart: index - 13 });
      }
      // k of m: the newest point must be one of the k (it completes the pattern); only one side can
      // hold it, so the two products never both count.
      const twoOfThree = (twoAbove & 1) * bitsSet[twoAbove & 0x7]! + (twoBelow & 1) * bitsSet[twoBelow & 0x7]!;
      if (twoOfThree >= 2) {
        const side = (twoAbove & 1) === 1 ? "above" : "below";
        const windowStart = Math.max(stretchStart, index - 2);
        if (we2) out.push({ rule: "we-2", chart, index, windowStart, side });
        if (nelson5) out.push({ rule: "nelson-5", chart, index, windowStart, side });
      }
      const fourOfFive = (oneAbove & 1) * bitsSet[oneAbove & 0x1f]! + (oneBelow & 1) * bitsSet[oneBelow & 0x1f]!;
      if (fourOfFive >= 4) {
        const side = (oneAbove & 1) === 1 ? "above" : "below";
        const windowStart = Math.max(stretchStart, index - 4);
        if (we3) out.push({ rule: "we-3", chart, index, windowStart, side });
        if (nelson6) out.push({ rule: "nelson-6", chart, index, windowStart, side });
      }
      if (nelson7 && within === history && above !== 0 && below !== 0) {
        out.push({ rule: "nelson-7", chart, index, windowStart: index - 14 });
      }
      if (nelson8 && ((oneAbove | oneBelow) & 0xff) === 0xff && (above & 0xff) !== 0 && (below & 0xff) !== 0) {
        out.push({ rule: "nelson-8", chart, index, windowStart: index - 7 });
      }
    }

    this.stretchStart = stretchStart;
    this.previous = previous;
    this.above = above;
    this.below = below;
    this.oneAbove = oneAbove;
    this.oneBelow = oneBelow;
    this.twoAbove = twoAbove;
    this.twoBelow = twoBelow;
    this.within = within;
    this.rising = rising;
    this.falling = falling;
  }
}
