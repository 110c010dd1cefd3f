/**
 * The single-pass run-rule scanner shared by the batch evaluation and the incremental (live) form.
 *
 * Every rule of Western Electric (1956) and Nelson (1984) (definitions.ts: the rules and the conventions)
 * is decided from bit histories updated once per point. Each point gets a zone code 0..6 (the number of
 * the boundaries center − 2σ, center − σ, center (≥), center (>), center + σ, center + 2σ it passes, with
 * the strictness of the conventions), plus 7 when it cannot count as within 1σ although inside the
 * boundaries (no sigma, or below the centre where the lower 1σ boundary is under the floor). Lookup
 * tables turn the code into history bits; bit j of a history says whether its condition held j points
 * ago. Two conditions share one integer, the upper side (or increase) in bits 0–14 and the lower side
 * (or decrease) in bits 15–29, so one shift updates both. 15 bits are kept: the longest window. A rule is then a mask test: 9 in a
 * row above is `(sides & 0x1ff) === 0x1ff`. Cost: a few integer operations per point, no branch that
 * depends on noise (on noisy data the flags are coin flips, and mispredicted branches would cost several
 * times the rest), no allocation except one small object per firing, no window rescanned.
 *
 * Two forms exist for speed only: this scanner is the definition, used as is by the incremental form and
 * the rule stream; the batch evaluation runs batch-scanner.ts, which decides 32 points at once with
 * bitwise operations (issue 3's speed target) and is held equal to this scanner, firing for firing, by a
 * property test (test/unit/spc/rules/batch-scanner.test.ts). Both build firings through `emitFirings`.
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
const LIMIT_RULES = bit("we-1") | bit("nelson-1");
const RUN_RULES = ~LIMIT_RULES;

/** One history: a bit per point of the longest window (15 points: 0x7fff). */
const HISTORY = (1 << LONGEST_RULE_WINDOW) - 1;
/** The lower side's history starts at this bit, so two histories fill 30 bits (a small integer for V8). */
const LOWER = LONGEST_RULE_WINDOW;
/** After a shift, keeps the 14 newest bits of each history: bits 1–14 and 16–29. */
const SHIFTED_PAIR = (HISTORY & ~1) | ((HISTORY >>> 1) << (LOWER + 1));

/** History bits per zone code (see the file comment): code % 7 is the zone, code ≥ 7 "not within". */
const zoneTable = (bits: (zone: number, withinUnknown: boolean) => number) =>
  Int32Array.from({ length: 14 }, (_, code) => bits(code % 7, code >= 7));
const SIDE_BITS = zoneTable((zone) => (zone >= 4 ? 1 : 0) | (zone <= 2 ? 1 << LOWER : 0));
const BEYOND_ONE_BITS = zoneTable((zone) => (zone >= 5 ? 1 : 0) | (zone <= 1 ? 1 << LOWER : 0));
const BEYOND_TWO_BITS = zoneTable((zone) => (zone === 6 ? 1 : 0) | (zone === 0 ? 1 << LOWER : 0));
const WITHIN_BITS = zoneTable((zone, withinUnknown) => (zone >= 2 && zone <= 4 && !withinUnknown ? 1 : 0));
/** Direction code +(step > 0) + 2·+(step < 0): an increase in the first history, a decrease in the second. */
const DIRECTION_BITS = Int32Array.from([0, 1, 1 << LOWER]);

const setBits = (mask: number): number => (mask === 0 ? 0 : (mask & 1) + setBits(mask >>> 1));
/**
 * The k-of-m tests of one side in one lookup, indexed by (last 3 beyond-2σ bits) | (last 5 beyond-1σ bits)
 * << 3: bit 0 when the newest point is beyond 2σ and so is at least one other of the last 3 (2 of 3);
 * bit 1 when the newest is beyond 1σ and so are at least 3 others of the last 5 (4 of 5).
 */
const K_OF_M = Uint8Array.from({ length: 256 }, (_, index) => {
  const beyondTwo = index & 0x7;
  const beyondOne = index >>> 3;
  const twoOfThree = (beyondTwo & 1) === 1 && setBits(beyondTwo) >= 2 ? 1 : 0;
  const fourOfFive = (beyondOne & 1) === 1 && setBits(beyondOne) >= 4 ? 2 : 0;
  return twoOfThree | fourOfFive;
});

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
  /** Set when ucl, lcl and sigma hold one value at every point (StatisticSeries.uniformLimits); the batch scan then reads the first. */
  readonly uniformLimits?: boolean;
}

/**
 * Receives each firing (of the scanner's statistic) as it is found, in index order. `order` is the rule's
 * position (ruleOrder), known to the scanner from the rule's bit, so that merging need not look it up.
 */
export type FiringSink = (
  rule: RuleId,
  index: number,
  windowStart: number,
  side: "above" | "below" | undefined,
  order: number,
) => void;

/** Pattern bits computed per point by the scanner (and by the word-parallel batch form, batch-scanner.ts). */
export const PATTERN_ABOVE_LIMIT = 1;
export const PATTERN_BELOW_LIMIT = 2;
export const PATTERN_EIGHT_ON_ONE_SIDE = 4;
export const PATTERN_FIVE_STEPS_ONE_WAY = 8;
export const PATTERN_THIRTEEN_ALTERNATIONS = 16;
export const PATTERN_TWO_OF_THREE = 32;
export const PATTERN_FOUR_OF_FIVE = 64;
export const PATTERN_FIFTEEN_WITHIN = 128;
export const PATTERN_EIGHT_BEYOND = 256;
/** Set with PATTERN_EIGHT_ON_ONE_SIDE when the run on that side has 9 points. */
export const PATTERN_NINE_ON_ONE_SIDE = 512;

/**
 * Append the firings of the requested rules for the patterns completed at `index` (rarely called).
 * `newestAbove` says whether the point at `index` is above the centre line: it gives the side of every
 * one-sided pattern but rule 1, because each of them counts the newest point (a run on one side, or
 * 2 of 3 beyond 2σ / 4 of 5 beyond 1σ with the newest among them). `stretchStart` is the first index
 * after the last missing point (or the first index fed): early k-of-m windows start there.
 */
export function emitFirings(
  sink: FiringSink,
  rules: number,
  patterns: number,
  index: number,
  stretchStart: number,
  newestAbove: boolean,
): void {
  // Plain calls, no closure: a closure made per call costs an allocation (and, under tsx's keepNames,
  // a property definition) per firing.
  if ((patterns & (PATTERN_ABOVE_LIMIT | PATTERN_BELOW_LIMIT)) !== 0) {
    const side = (patterns & PATTERN_ABOVE_LIMIT) !== 0 ? "above" : "below";
    emit(sink, rules, RULE_BIT.we1, "we-1", index, index, side);
    emit(sink, rules, RULE_BIT.nelson1, "nelson-1", index, index, side);
  }
  const side = newestAbove ? "above" : "below";
  if ((patterns & PATTERN_EIGHT_ON_ONE_SIDE) !== 0) {
    emit(sink, rules, RULE_BIT.we4, "we-4", index, index - 7, side);
    if ((patterns & PATTERN_NINE_ON_ONE_SIDE) !== 0) emit(sink, rules, RULE_BIT.nelson2, "nelson-2", index, index - 8, side);
  }
  if ((patterns & PATTERN_FIVE_STEPS_ONE_WAY) !== 0) emit(sink, rules, RULE_BIT.nelson3, "nelson-3", index, index - 5, undefined);
  if ((patterns & PATTERN_THIRTEEN_ALTERNATIONS) !== 0) {
    emit(sink, rules, RULE_BIT.nelson4, "nelson-4", index, index - 13, undefined);
  }
  if ((patterns & PATTERN_TWO_OF_THREE) !== 0) {
    const windowStart = Math.max(stretchStart, index - 2);
    emit(sink, rules, RULE_BIT.we2, "we-2", index, windowStart, side);
    emit(sink, rules, RULE_BIT.nelson5, "nelson-5", index, windowStart, side);
  }
  if ((patterns & PATTERN_FOUR_OF_FIVE) !== 0) {
    const windowStart = Math.max(stretchStart, index - 4);
    emit(sink, rules, RULE_BIT.we3, "we-3", index, windowStart, side);
    emit(sink, rules, RULE_BIT.nelson6, "nelson-6", index, windowStart, side);
  }
  if ((patterns & PATTERN_FIFTEEN_WITHIN) !== 0) emit(sink, rules, RULE_BIT.nelson7, "nelson-7", index, index - 14, undefined);
  if ((patterns & PATTERN_EIGHT_BEYOND) !== 0) emit(sink, rules, RULE_BIT.nelson8, "nelson-8", index, index - 7, undefined);
}

/** Each rule's bit in a rule mask, looked up once. */
const RULE_BIT = {
  we1: bit("we-1"),
  we2: bit("we-2"),
  we3: bit("we-3"),
  we4: bit("we-4"),
  nelson1: bit("nelson-1"),
  nelson2: bit("nelson-2"),
  nelson3: bit("nelson-3"),
  nelson4: bit("nelson-4"),
  nelson5: bit("nelson-5"),
  nelson6: bit("nelson-6"),
  nelson7: bit("nelson-7"),
  nelson8: bit("nelson-8"),
};

function emit(
  sink: FiringSink,
  rules: number,
  ruleBit: number,
  rule: RuleId,
  index: number,
  windowStart: number,
  side: "above" | "below" | undefined,
): void {
  if ((rules & ruleBit) !== 0) sink(rule, index, windowStart, side, 31 - Math.clz32(ruleBit));
}

export class RuleScanner {
  private readonly chart: StatisticKey;
  private readonly rules: number;
  private readonly center: number;
  private readonly floor: number;
  /** Where `scan` appends firings, and the sink that appends them (made once: the stream scans point by point). */
  private out: Firing[] = [];
  private readonly sink: FiringSink = (rule, index, windowStart, side) => {
    const chart = this.chart;
    this.out.push(side === undefined ? { rule, chart, index, windowStart } : { rule, chart, index, windowStart, side });
  };
  /** First index of the current stretch of values (the first index fed, or just after the last NaN). */
  private stretchStart: number;
  private previous = Number.NaN;
  private sides = 0;
  private beyondOne = 0;
  private beyondTwo = 0;
  private within = 0;
  private directions = 0;

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
    const { rules, center, floor, chart, sink } = this;
    this.out = out;
    // Module constants copied to locals: the loop then reads registers, not the module context.
    const sideBits = SIDE_BITS;
    const beyondOneBits = BEYOND_ONE_BITS;
    const beyondTwoBits = BEYOND_TWO_BITS;
    const withinBits = WITHIN_BITS;
    const directionBits = DIRECTION_BITS;
    const kOfM = K_OF_M;
    const history = HISTORY;
    const shiftedPair = SHIFTED_PAIR;
    const runRules = (rules & RUN_RULES) !== 0;
    let stretchStart = this.stretchStart;
    let previous = this.previous;
    let sides = this.sides;
    let beyondOne = this.beyondOne;
    let beyondTwo = this.beyondTwo;
    let within = this.within;
    let directions = this.directions;

    for (let position = from; position < to; position++) {
      const value = points[position]!;
      const index = offset + position;
      if (!(value - value === 0)) {
        if (value !== value) {
          // No value by definition: every run and window restarts after it.
          stretchStart = index + 1;
          previous = Number.NaN;
          sides = beyondOne = beyondTwo = within = directions = 0;
          continue;
        }
        throw new SpcInputError(`${chart}: point ${index} is not finite (${value})`, index);
      }

      // Rule 1 against the series' own limits; pattern families are added below.
      let patterns = +(value > ucl[position]!) | (+(value < lcl[position]!) << 1);
      if (!runRules) {
        if (patterns !== 0) emitFirings(sink, rules, patterns, index, stretchStart, false);
        continue;
      }

      const deviation = sigma[position]!;
      if (deviation < 0) throw new SpcInputError(`${chart}: sigma at point ${index} is negative (${deviation})`, index);
      // Effective zone boundaries (the branches follow sigma and the floor, not the noise). Without a
      // sigma no point is beyond any boundary and none is within 1σ; a lower boundary under the floor is
      // passed by every point, and a point below the centre there is not within 1σ.
      const zonesKnown = deviation >= 0;
      const lowerOne = center - deviation;
      const lowerTwo = center - 2 * deviation;
      const lowerOneDefined = lowerOne >= floor;
      const upperOneBoundary = zonesKnown ? center + deviation : Number.POSITIVE_INFINITY;
      const upperTwoBoundary = zonesKnown ? center + 2 * deviation : Number.POSITIVE_INFINITY;
      const lowerOneBoundary = zonesKnown && lowerOneDefined ? lowerOne : Number.NEGATIVE_INFINITY;
      const lowerTwoBoundary = zonesKnown && lowerTwo >= floor ? lowerTwo : Number.NEGATIVE_INFINITY;
      const withinUnknown = zonesKnown ? (lowerOneDefined ? 0 : +(value < center)) : 1;
      const code =
        +(value >= lowerTwoBoundary) +
        +(value >= lowerOneBoundary) +
        +(value >= center) +
        +(value > center) +
        +(value > upperOneBoundary) +
        +(value > upperTwoBoundary) +
        7 * withinUnknown;
      const step = value - previous; // NaN after a restart: neither an increase nor a decrease
      previous = value;
      sides = ((sides << 1) & shiftedPair) | sideBits[code]!;
      beyondOne = ((beyondOne << 1) & shiftedPair) | beyondOneBits[code]!;
      beyondTwo = ((beyondTwo << 1) & shiftedPair) | beyondTwoBits[code]!;
      within = ((within << 1) & history) | withinBits[code]!;
      directions = ((directions << 1) & shiftedPair) | directionBits[+(step > 0) + 2 * +(step < 0)]!;

      // Which patterns complete at this point, as bits (PATTERN_*, written as literals: a module
      // constant read in the loop costs a context load). Each test is rarely true, so its branch is
      // well predicted; the firings themselves are built outside the loop. Masks: 0xff = the
      // last 8 points, 0x1f = 5, 0xfff = 12, 0x1fff = 13; ">>> 15" reads the lower side's history.
      const below = sides >>> 15;
      const beyondOneBelow = beyondOne >>> 15;
      if ((sides & 0xff) === 0xff || (below & 0xff) === 0xff) {
        patterns |= 4; // PATTERN_EIGHT_ON_ONE_SIDE
        if ((((sides & 1) === 1 ? sides : below) & 0x1ff) === 0x1ff) patterns |= 512; // PATTERN_NINE_ON_ONE_SIDE
      }
      if ((directions & 0x1f) === 0x1f || ((directions >>> 15) & 0x1f) === 0x1f) patterns |= 8; // PATTERN_FIVE_STEPS_ONE_WAY
      if (
        ((directions ^ (directions >>> 1)) & 0xfff) === 0xfff &&
        ((directions | (directions >>> 15)) & 0x1fff) === 0x1fff
      ) {
        patterns |= 16; // PATTERN_THIRTEEN_ALTERNATIONS
      }
      // Bit 0: 2 of 3 beyond 2σ (PATTERN_TWO_OF_THREE = 32); bit 1: 4 of 5 beyond 1σ (PATTERN_FOUR_OF_FIVE = 64).
      const kOfMPatterns =
        kOfM[(beyondTwo & 0x7) | ((beyondOne & 0x1f) << 3)]! | kOfM[((beyondTwo >>> 15) & 0x7) | ((beyondOneBelow & 0x1f) << 3)]!;
      patterns |= kOfMPatterns << 5;
      if (within === history && (sides & history) !== 0 && below !== 0) patterns |= 128; // PATTERN_FIFTEEN_WITHIN
      if (((beyondOne | beyondOneBelow) & 0xff) === 0xff && (sides & 0xff) !== 0 && (below & 0xff) !== 0) {
        patterns |= 256; // PATTERN_EIGHT_BEYOND
      }
      if (patterns !== 0) emitFirings(sink, rules, patterns, index, stretchStart, (sides & 1) === 1);
    }

    this.stretchStart = stretchStart;
    this.previous = previous;
    this.sides = sides;
    this.beyondOne = beyondOne;
    this.beyondTwo = beyondTwo;
    this.within = within;
    this.directions = directions;
  }
}
