/**
 * Word-parallel form of the run-rule scanner, for the batch evaluation of a whole series.
 *
 * Why a second form: issue 3 asks for all eight Nelson tests on 1,000,000 points in at most 10 times a
 * bare pass summing the points, and the point-by-point scanner (scanner.ts) spends several times that on
 * its per-point history updates. Here one pass turns each point into condition bits (above / below the
 * centre, beyond ±1σ and ±2σ, beyond the limits, an increase, a decrease, missing), 32 points to a 32-bit
 * word, with no branch that depends on the data: the zone by arithmetic where sigma is one for the
 * word, by comparisons otherwise and wherever the arithmetic cannot be sure. Each rule is then a few bitwise
 * operations per word for 32 points at once: "n in a row" is an AND of the word with itself shifted by
 * 1, 2, 4, ... points (bits carried in from the previous word, so runs cross word boundaries), and
 * "k of m" a boolean formula over the shifted words. Firings are built only at the set bits, which are
 * rare, by the scanner's own `emitFirings`.
 *
 * The rules and every convention are those of definitions.ts (Western Electric 1956; Nelson 1984, JQT
 * 16(4)); scanner.ts stays their single definition, used as is by the incremental form and the rule
 * stream. A property test (test/unit/spc/rules/batch-scanner.test.ts) holds this form equal to the
 * scanner, firing for firing, on random series with missing points, points exactly on the boundaries and
 * the centre, varying limits and sigma, floors above center − kσ and every subset of rules. Input the
 * scanner would refuse (a non-finite point, a negative sigma) is left to the scanner, which throws its
 * own error.
 *
 * Cost: about ten floating-point operations and six comparisons per point, some 150 integer operations
 * per 32 points, and a few operations per firing; no allocation but the firings. A series flagged
 * `uniformLimits` (the charts module sets it where limits are fixed) has its arrays not read: its first
 * point's sigma and limits serve throughout, and limits at exactly center ± 3σ are read off the zone
 * (on 1,000,000 individuals that took the scan from about 7.1 to 5.5 ms).
 */
import {
  PATTERN_ABOVE_LIMIT,
  PATTERN_BELOW_LIMIT,
  PATTERN_EIGHT_BEYOND,
  PATTERN_EIGHT_ON_ONE_SIDE,
  PATTERN_FIFTEEN_WITHIN,
  PATTERN_FIVE_STEPS_ONE_WAY,
  PATTERN_FOUR_OF_FIVE,
  PATTERN_NINE_ON_ONE_SIDE,
  PATTERN_THIRTEEN_ALTERNATIONS,
  PATTERN_TWO_OF_THREE,
  emitFirings,
  type FiringSink,
  type ScanArrays,
} from "./scanner";

const WORD = 32;

/**
 * `current` moved `by` points later (1 ≤ by ≤ 31): bit j then says what bit j − by said, the bits moved
 * past the start of the word coming from the end of `previous` (the word of the 32 points before).
 */
function carried(current: number, previous: number, by: number): number {
  return (current << by) | (previous >>> (32 - by));
}

/** The `count` (≤ 31) bits ending at bit `bit` of `current`, the earlier ones from `previous`, as the low bits. */
function bitsEndingAt(current: number, previous: number, bit: number, count: number): number {
  const shift = bit - count + 1;
  const window = shift >= 0 ? current >>> shift : (current << -shift) | (previous >>> (WORD + shift));
  return window & ((1 << count) - 1);
}

/** Whether the `count` points ending at bit `bit` hold one above and one below the centre line. */
function bothSides(
  above: number,
  aboveBefore: number,
  below: number,
  belowBefore: number,
  bit: number,
  count: number,
): boolean {
  return bitsEndingAt(above, aboveBefore, bit, count) !== 0 && bitsEndingAt(below, belowBefore, bit, count) !== 0;
}

/**
 * 2 of 3 beyond a boundary with the newest among them: `newest` the condition word, `before` the previous
 * word, `validOne` whether the point before is present (a missing point restarts the window).
 */
function twoOfThree(newest: number, before: number, validOne: number): number {
  return newest & (carried(newest, before, 1) | (carried(newest, before, 2) & validOne));
}

/** 4 of 5 with the newest among them; `validOne..` whether the 1, 2, 3 points before are all present. */
function fourOfFive(newest: number, before: number, validOne: number, validOneTwo: number, validOneToThree: number): number {
  const one = carried(newest, before, 1);
  const two = carried(newest, before, 2) & validOne;
  const three = carried(newest, before, 3) & validOneTwo;
  const four = carried(newest, before, 4) & validOneToThree;
  // The newest and at least 3 of the 4 before it.
  return newest & ((one & two & (three | four)) | (three & four & (one | two)));
}

/** First index after the last missing point among the 4 points before `index` (0 if none): where an early k-of-m window starts. */
function stretchStartAt(points: Float64Array, index: number): number {
  for (let back = 1; back <= 4 && index - back >= 0; back++) {
    const value = points[index - back]!;
    if (value !== value) return index - back + 1;
  }
  return 0;
}

/** Positions of the beyond-the-limits words in the array `limitWords` fills. */
const LIMIT_UP = 0;
const LIMIT_DOWN = 1;

/**
 * The beyond-the-limits words of the points base .. base + count − 1 into `limits` (LIMIT_UP,
 * LIMIT_DOWN), each point compared with its own limits, or with `upperLimit` and `lowerLimit` for all
 * when `uniformLimits`. False when a point's sigma is not `deviation` (the word's zones by arithmetic,
 * made with that sigma, are then wrong; NaN never matches); a flagged series is not checked.
 */
function limitWords(
  arrays: ScanArrays,
  base: number,
  count: number,
  uniformLimits: boolean,
  upperLimit: number,
  lowerLimit: number,
  deviation: number,
  limits: Int32Array,
): boolean {
  const { points, ucl, lcl, sigma } = arrays;
  let limitUp = 0;
  let limitDown = 0;
  let differs = 0;
  for (let bit = 0; bit < count; bit++) {
    const position = base + bit;
    const value = points[position]!;
    limitUp |= +(value > (uniformLimits ? upperLimit : ucl[position]!)) << bit;
    limitDown |= +(value < (uniformLimits ? lowerLimit : lcl[position]!)) << bit;
    differs |= +(!uniformLimits && sigma[position]! !== deviation);
  }
  limits[LIMIT_UP] = limitUp;
  limits[LIMIT_DOWN] = limitDown;
  return differs === 0;
}

/**
 * Feeds `sink` the firings of the rules in `rules` (a rule mask, scanner.ts) over the whole of `arrays`,
 * in the scanner's order. Returns false, part way, when a point is not finite or a sigma negative: the
 * caller then discards what it got and runs the scanner, which decides (and throws its error).
 */
export function scanWords(arrays: ScanArrays, rules: number, center: number, floor: number, sink: FiringSink): boolean {
  const { points, ucl, lcl, sigma } = arrays;
  const length = points.length;
  // Previous word of each condition (and of the runs built by doubling), for the bits carried across.
  let previousValue = Number.NaN;
  let aboveBefore = 0;
  let belowBefore = 0;
  let aboveTwoBefore = 0;
  let belowTwoBefore = 0;
  let aboveFourBefore = 0;
  let belowFourBefore = 0;
  let beyondOneUpBefore = 0;
  let beyondOneDownBefore = 0;
  let beyondTwoUpBefore = 0;
  let beyondTwoDownBefore = 0;
  let validBefore = 0;
  let increaseBefore = 0;
  let decreaseBefore = 0;
  let increaseTwoBefore = 0;
  let decreaseTwoBefore = 0;
  let alternationBefore = 0;
  let alternationTwoBefore = 0;
  let alternationFourBefore = 0;
  let withinBefore = 0;
  let withinTwoBefore = 0;
  let withinFourBefore = 0;
  let withinEightBefore = 0;
  let beyondBefore = 0;
  let beyondTwoBefore = 0;
  let beyondFourBefore = 0;

  // Most series have one sigma for every point. The zone of a point is then found by arithmetic rather
  // than by a comparison with each boundary: t = (value − (center − 4σ)) / σ puts the boundaries
  // center − 2σ, center − σ, center, center + σ, center + 2σ at t = 2 .. 6, and the integer part of t
  // (0 .. 7) is the zone. Its three bits go into three words, from which the six zone conditions follow
  // by bitwise operations per word. t carries rounding errors, and so do the boundaries the scanner
  // compares with; both are bounded by `margin` (a few units in the last place of the largest magnitude
  // involved, in sigmas). A word is redone point by point by exact comparisons when it holds
  // a point whose t lies within `margin` of an integer (a boundary, or center ± 3σ) or outside 0 .. 8
  // (beyond 4σ, infinite, NaN), a step that is zero (a tie) or NaN (after a missing point, or the first
  // point), or a sigma of its own (limitWords, not checked on a series flagged uniformLimits): rare
  // on measured data, so the branch on it is well predicted. The first two tests share one comparison (`sure`). Comparisons with the boundaries cost about as much as the
  // arithmetic, but the zone takes three bits where they take six, and a decrease no bit of its own.
  const sigma0 = length > 0 ? sigma[0]! : Number.NaN;
  const start = center - 4 * sigma0;
  const inverse = 1 / sigma0;
  const margin = 1e-12 + (16 * Number.EPSILON * (Math.abs(center) + 4 * sigma0)) / sigma0;
  const arithmeticZones = sigma0 > 0 && margin < 1e-6;
  const nearBoundary = 0.5 - margin;
  const lowerOneMask = center - sigma0 >= floor ? -1 : 0;
  const lowerTwoMask = center - 2 * sigma0 >= floor ? -1 : 0;
  const limits = new Int32Array(2);
  // Where the series says its limits are uniform (the charts module sets it when they are the same by
  // construction), the first point's limits serve every point, and when they are center ± 3σ exactly
  // (as limitSeries computes them) the zone says it too: zone 7 is beyond the upper limit, zone 0 below
  // the lower one, points near ±3σ being redone like those near any boundary. Otherwise limitWords
  // compares each point with its limits in a second loop over the word.
  const uniformLimits = arrays.uniformLimits === true;
  const upperLimit = length > 0 ? ucl[0]! : Number.NaN;
  const lowerLimit = length > 0 ? lcl[0]! : Number.NaN;
  const limitsAreZones =
    uniformLimits && upperLimit === center + 3 * sigma0 && lowerLimit === center - 3 * sigma0;

  // Module constants read in the loop cost a context load and a check that they are initialised.
  const word = WORD;
  for (let base = 0; base < length; base += word) {
    const count = Math.min(word, length - base);
    const present = count === word ? -1 : (1 << count) - 1;
    let above = 0;
    let below = 0;
    let beyondOneUp = 0;
    let beyondOneDown = 0;
    let beyondTwoUp = 0;
    let beyondTwoDown = 0;
    let limitUp = 0;
    let limitDown = 0;
    let increase = 0;
    let decrease = 0;
    let invalid = 0;
    let notWithin = 0;
    const previousBefore = previousValue;
    let exact = +!arithmeticZones;
    let low = 0;
    let middle = 0;
    let high = 0;
    if (arithmeticZones) {
      for (let bit = 0; bit < count; bit++) {
        const position = base + bit;
        const value = points[position]!;
        const t = (value - start) * inverse;
        const zone = t | 0;
        const step = value - previousValue;
        // Positive when t is off the integers by more than the margin and the step is not zero (nor NaN).
        const sure = (nearBoundary - Math.abs(t - zone - 0.5)) * Math.abs(step);
        exact |= +!(sure > 0) | (zone & ~7);
        low |= (zone & 1) << bit;
        middle |= ((zone >> 1) & 1) << bit;
        high |= (zone >> 2) << bit;
        increase |= +(step > 0) << bit;
        previousValue = value;
      }
      if (limitsAreZones) {
        limitUp = high & middle & low;
        limitDown = present & ~(high | middle | low);
      } else if (limitWords(arrays, base, count, uniformLimits, upperLimit, lowerLimit, sigma0, limits)) {
        limitUp = limits[LIMIT_UP]!;
        limitDown = limits[LIMIT_DOWN]!;
      } else {
        exact = 1;
      }
    }
    if (exact === 0) {
      // Zones 4 .. 7 (binary 1xx) are above the centre, 5 .. 7 beyond +1σ, 6 and 7 beyond +2σ; zones
      // 0 .. 2 are beyond −1σ, 0 and 1 beyond −2σ (where those boundaries are above the floor).
      above = high;
      below = present & ~high;
      beyondOneUp = high & (middle | low);
      beyondTwoUp = high & middle;
      beyondOneDown = below & ~(middle & low) & lowerOneMask;
      beyondTwoDown = below & ~middle & lowerTwoMask;
      notWithin = below & ~lowerOneMask;
      // Every step of the word is a number and not zero (else the word is redone): a step that is not
      // an increase is a decrease.
      decrease = present & ~increase;
    } else {
      // The word redone point by point by exact comparisons, with each point's own sigma, as the scanner
      // compares (same expressions, so the same doubles). The words the arithmetic pass filled start over.
      limitUp = 0;
      limitDown = 0;
      increase = 0;
      previousValue = previousBefore;
      for (let bit = 0; bit < count; bit++) {
        const position = base + bit;
        const value = points[position]!;
        const deviation = sigma[position]!;
        // An infinite point or a negative sigma: the scanner decides (and throws).
        if (deviation < 0 || (value - value !== 0 && value === value)) return false;
        // A NaN sigma makes every comparison with a boundary false; a lower boundary under the floor is
        // never passed, and a point below the centre there is not within 1σ.
        const lowerOne = center - deviation;
        const lowerTwo = center - 2 * deviation;
        const lowerOneDefined = +(lowerOne >= floor);
        above |= +(value > center) << bit;
        below |= +(value < center) << bit;
        beyondOneUp |= +(value > center + deviation) << bit;
        beyondTwoUp |= +(value > center + 2 * deviation) << bit;
        beyondOneDown |= (+(value < lowerOne) & lowerOneDefined) << bit;
        beyondTwoDown |= (+(value < lowerTwo) & +(lowerTwo >= floor)) << bit;
        notWithin |= (+!(deviation >= 0) | (+(value < center) & (lowerOneDefined ^ 1))) << bit;
        limitUp |= +(value > ucl[position]!) << bit;
        limitDown |= +(value < lcl[position]!) << bit;
        increase |= +(value > previousValue) << bit;
        decrease |= +(value < previousValue) << bit;
        invalid |= +(value !== value) << bit;
        previousValue = value;
      }
    }
    const valid = present & ~invalid;

    // n in a row on one side: runs of 2, 4, 8 by doubling, then 9.
    const aboveTwo = above & carried(above, aboveBefore, 1);
    const aboveFour = aboveTwo & carried(aboveTwo, aboveTwoBefore, 2);
    const aboveEight = aboveFour & carried(aboveFour, aboveFourBefore, 4);
    const aboveNine = aboveEight & carried(above, aboveBefore, 8);
    const belowTwo = below & carried(below, belowBefore, 1);
    const belowFour = belowTwo & carried(belowTwo, belowTwoBefore, 2);
    const belowEight = belowFour & carried(belowFour, belowFourBefore, 4);
    const belowNine = belowEight & carried(below, belowBefore, 8);

    // Nelson 3: 5 increases (or decreases) in a row.
    const increaseTwo = increase & carried(increase, increaseBefore, 1);
    const increaseFive =
      increaseTwo & carried(increaseTwo, increaseTwoBefore, 2) & carried(increase, increaseBefore, 4);
    const decreaseTwo = decrease & carried(decrease, decreaseBefore, 1);
    const decreaseFive =
      decreaseTwo & carried(decreaseTwo, decreaseTwoBefore, 2) & carried(decrease, decreaseBefore, 4);

    // Nelson 4: 12 alternating pairs of successive steps in a row (13 non-zero steps changing direction).
    const steps = increase | decrease;
    const alternation =
      steps & carried(steps, increaseBefore | decreaseBefore, 1) & (increase ^ carried(increase, increaseBefore, 1));
    const alternationTwo = alternation & carried(alternation, alternationBefore, 1);
    const alternationFour = alternationTwo & carried(alternationTwo, alternationTwoBefore, 2);
    const alternationEight = alternationFour & carried(alternationFour, alternationFourBefore, 4);
    const alternationTwelve = alternationEight & carried(alternationFour, alternationFourBefore, 8);

    // k of m beyond a boundary, the newest point among them. A missing point restarts the window: a
    // bit k points back counts only if the k − 1 points between are present.
    const validOne = carried(valid, validBefore, 1);
    const validOneTwo = validOne & carried(valid, validBefore, 2);
    const validOneToThree = validOneTwo & carried(valid, validBefore, 3);
    const twoOfThreeBeyond =
      twoOfThree(beyondTwoUp, beyondTwoUpBefore, validOne) | twoOfThree(beyondTwoDown, beyondTwoDownBefore, validOne);
    const fourOfFiveBeyond =
      fourOfFive(beyondOneUp, beyondOneUpBefore, validOne, validOneTwo, validOneToThree) |
      fourOfFive(beyondOneDown, beyondOneDownBefore, validOne, validOneTwo, validOneToThree);

    // Nelson 7: 15 within 1σ in a row (the sides are checked at the rare candidates).
    const within = valid & ~(beyondOneUp | beyondOneDown | notWithin);
    const withinTwo = within & carried(within, withinBefore, 1);
    const withinFour = withinTwo & carried(withinTwo, withinTwoBefore, 2);
    const withinEight = withinFour & carried(withinFour, withinFourBefore, 4);
    const withinFifteen = withinEight & carried(withinEight, withinEightBefore, 7);

    // Nelson 8: 8 beyond 1σ in a row, either side (the sides are checked at the rare candidates).
    const beyond = beyondOneUp | beyondOneDown;
    const beyondTwo = beyond & carried(beyond, beyondBefore, 1);
    const beyondFour = beyondTwo & carried(beyondTwo, beyondTwoBefore, 2);
    const beyondEight = beyondFour & carried(beyondFour, beyondFourBefore, 4);

    const candidates =
      limitUp |
      limitDown |
      aboveEight |
      belowEight |
      increaseFive |
      decreaseFive |
      alternationTwelve |
      twoOfThreeBeyond |
      fourOfFiveBeyond |
      withinFifteen |
      beyondEight;
    for (let pending = candidates; pending !== 0; pending &= pending - 1) {
      const bit = 31 - Math.clz32(pending & -pending);
      const index = base + bit;
      let patterns =
        ((limitUp >>> bit) & 1) * PATTERN_ABOVE_LIMIT +
        ((limitDown >>> bit) & 1) * PATTERN_BELOW_LIMIT +
        (((aboveEight | belowEight) >>> bit) & 1) * PATTERN_EIGHT_ON_ONE_SIDE +
        (((aboveNine | belowNine) >>> bit) & 1) * PATTERN_NINE_ON_ONE_SIDE +
        (((increaseFive | decreaseFive) >>> bit) & 1) * PATTERN_FIVE_STEPS_ONE_WAY +
        ((alternationTwelve >>> bit) & 1) * PATTERN_THIRTEEN_ALTERNATIONS +
        ((twoOfThreeBeyond >>> bit) & 1) * PATTERN_TWO_OF_THREE +
        ((fourOfFiveBeyond >>> bit) & 1) * PATTERN_FOUR_OF_FIVE;
      // Nelson 7 and 8 need a point above and one below the centre among the last 15 (8) points.
      if (((withinFifteen >>> bit) & 1) === 1 && bothSides(above, aboveBefore, below, belowBefore, bit, 15)) {
        patterns |= PATTERN_FIFTEEN_WITHIN;
      }
      if (((beyondEight >>> bit) & 1) === 1 && bothSides(above, aboveBefore, below, belowBefore, bit, 8)) {
        patterns |= PATTERN_EIGHT_BEYOND;
      }
      if (patterns === 0) continue;
      const stretchStart =
        (patterns & (PATTERN_TWO_OF_THREE | PATTERN_FOUR_OF_FIVE)) !== 0 ? stretchStartAt(points, index) : 0;
      emitFirings(sink, rules, patterns, index, stretchStart, ((above >>> bit) & 1) === 1);
    }

    aboveBefore = above;
    belowBefore = below;
    aboveTwoBefore = aboveTwo;
    belowTwoBefore = belowTwo;
    aboveFourBefore = aboveFour;
    belowFourBefore = belowFour;
    beyondOneUpBefore = beyondOneUp;
    beyondOneDownBefore = beyondOneDown;
    beyondTwoUpBefore = beyondTwoUp;
    beyondTwoDownBefore = beyondTwoDown;
    validBefore = valid;
    increaseBefore = increase;
    decreaseBefore = decrease;
    increaseTwoBefore = increaseTwo;
    decreaseTwoBefore = decreaseTwo;
    alternationBefore = alternation;
    alternationTwoBefore = alternationTwo;
    alternationFourBefore = alternationFour;
    withinBefore = within;
    withinTwoBefore = withinTwo;
    withinFourBefore = withinFour;
    withinEightBefore = withinEight;
    beyondBefore = beyond;
    beyondTwoBefore = beyondTwo;
    beyondFourBefore = beyondFour;
  }
  return true;
}
