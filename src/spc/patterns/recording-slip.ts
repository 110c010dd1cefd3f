/**
 * Recording slips: which value was probably meant when a hand-written or hand-typed reading stands apart
 * from its neighbours.
 *
 * Method: enumerate every value one keying slip away from the printed decimal string, for the four
 * slips most often seen in manual data entry (a transposed pair of adjacent digits, a decimal point
 * moved one or two places, a digit left out, a digit typed twice), and keep the candidates that land
 * within `tolerance` standard deviations of the neighbours' level. Transpositions and omissions are the
 * commonest single-keystroke errors in studies of copied and keyed text (Damerau 1964, "A technique for computer
 * detection and correction of spelling errors", Communications of the ACM 7(3), 171–176, which counts
 * insertion, deletion, substitution and transposition of adjacent characters as the single errors to
 * consider; cited from memory). A substituted digit is left out on purpose: with ten choices per position it explains almost
 * any value and so tells the investigator nothing.
 *
 * Ranking: nearest to the neighbours' level first, where a dropped digit counts half a sigma further
 * than it is, because it has to guess the missing digit (one of ten) while the other three slips only
 * reorder or repeat what was written; ties go to the simpler slip (the order of `RECORDING_SLIPS`).
 * Cost: O(L²·10) for a string of L characters.
 *
 * Example: `recordingSlipCandidates("2.26", { level: 2.62, sigma: 0.02 })[0]` →
 * `{ slip: "transposed-digits", text: "2.62", value: 2.62, distance: 0 }`.
 */
import { SpcInputError } from "../types";

export const RECORDING_SLIPS = [
  "transposed-digits",
  "misplaced-decimal",
  "doubled-digit",
  "dropped-digit",
] as const;
export type RecordingSlip = (typeof RECORDING_SLIPS)[number];

export interface SlipCandidate {
  readonly slip: RecordingSlip;
  /** The corrected decimal string. */
  readonly text: string;
  readonly value: number;
  /** |value − level| / sigma. */
  readonly distance: number;
}

export interface SlipContext {
  /** Level of the neighbouring points (e.g. their mean). */
  readonly level: number;
  /** Standard deviation of one value around that level; must be > 0. */
  readonly sigma: number;
  /** Largest distance from the level, in sigma, for a candidate to count. Default 1.5. */
  readonly tolerance?: number;
}

const PLAIN_DECIMAL = /^-?(\d+\.?\d*|\.\d+)$/;

/**
 * Readings with more digits than this were not keyed by hand (they come from an instrument or a
 * computation), and with so many digits some one-slip variant lands near any level by chance.
 */
export const MAXIMUM_KEYED_DIGITS = 7;

/** Candidate corrections of `printed`, best first; empty when no single slip explains it. */
export function recordingSlipCandidates(printed: string, context: SlipContext): SlipCandidate[] {
  const { level, sigma } = context;
  const tolerance = context.tolerance ?? 1.5;
  if (!Number.isFinite(level)) throw new SpcInputError("recording slip: the neighbours' level must be finite");
  if (!(sigma > 0) || !Number.isFinite(sigma)) {
    throw new SpcInputError("recording slip: sigma must be a finite number above 0");
  }
  const text = printed.trim();
  if (!PLAIN_DECIMAL.test(text) || text.replace(/[^0-9]/g, "").length > MAXIMUM_KEYED_DIGITS) return [];
  const sign = text.startsWith("-") ? "-" : "";
  const body = sign ? text.slice(1) : text;
  const printedValue = Number(text);

  const best = new Map<number, SlipCandidate>();
  const consider = (slip: RecordingSlip, candidateBody: string) => {
    if (candidateBody === body || !PLAIN_DECIMAL.test(candidateBody)) return;
    const candidateText = sign + candidateBody;
    const value = Number(candidateText);
    if (!Number.isFinite(value) || value === printedValue) return;
    const distance = Math.abs(value - level) / sigma;
    if (distance > tolerance) return;
    const known = best.get(value);
    // The same value reached by two slips is listed once, under the simpler one.
    if (!known || rankOf(slip) < rankOf(known.slip)) {
      best.set(value, { slip, text: normalise(candidateText), value, distance });
    }
  };

  for (const candidate of transpositions(body)) consider("transposed-digits", candidate);
  for (const candidate of decimalMoves(body)) consider("misplaced-decimal", candidate);
  for (const candidate of doubledDigitRemovals(body)) consider("doubled-digit", candidate);
  for (const candidate of droppedDigitInsertions(body)) consider("dropped-digit", candidate);

  return [...best.values()].sort(
    (first, second) => score(first) - score(second) || rankOf(first.slip) - rankOf(second.slip),
  );
}

/** Half a sigma of handicap for a guessed digit (see the ranking note above). */
const GUESSED_DIGIT_PENALTY = 0.5;

function score(candidate: SlipCandidate): number {
  return candidate.distance + (candidate.slip === "dropped-digit" ? GUESSED_DIGIT_PENALTY : 0);
}

function rankOf(slip: RecordingSlip): number {
  return RECORDING_SLIPS.indexOf(slip);
}

/** Strip redundant leading zeros and a trailing point, keeping at least one digit before the point. */
function normalise(text: string): string {
  const sign = text.startsWith("-") ? "-" : "";
  let body = sign ? text.slice(1) : text;
  if (body.endsWith(".")) body = body.slice(0, -1);
  if (body.startsWith(".")) body = `0${body}`;
  body = body.replace(/^0+(?=\d)/, "");
  return sign + body;
}

/** Swap each pair of adjacent digits (the decimal point between them stays where it is). */
function transpositions(body: string): string[] {
  const digitPositions = [...body].flatMap((character, position) => (character === "." ? [] : [position]));
  const results: string[] = [];
  for (let k = 0; k + 1 < digitPositions.length; k += 1) {
    const left = digitPositions[k]!;
    const right = digitPositions[k + 1]!;
    if (body[left] === body[right]) continue;
    const characters = [...body];
    characters[left] = body[right]!;
    characters[right] = body[left]!;
    results.push(characters.join(""));
  }
  return results;
}

/** The same digits with the decimal point moved one or two places either way (×10, ×100, ÷10, ÷100). */
function decimalMoves(body: string): string[] {
  const point = body.indexOf(".");
  const digits = body.replace(".", "");
  const pointAt = point === -1 ? digits.length : point;
  const results: string[] = [];
  for (const move of [-2, -1, 1, 2]) {
    const target = pointAt + move;
    if (target < 0) results.push(`0.${"0".repeat(-target)}${digits}`);
    else if (target >= digits.length) results.push(digits + "0".repeat(target - digits.length));
    else results.push(`${digits.slice(0, target)}.${digits.slice(target)}`);
  }
  return results;
}

/** Remove one of two equal adjacent digits (adjacent in the digit sequence, across a point too). */
function doubledDigitRemovals(body: string): string[] {
  const results: string[] = [];
  for (let position = 0; position < body.length; position += 1) {
    const character = body[position]!;
    if (character === ".") continue;
    const next = body[position + 1] === "." ? body[position + 2] : body[position + 1];
    const previous = body[position - 1] === "." ? body[position - 2] : body[position - 1];
    if (character === next || character === previous) {
      results.push(body.slice(0, position) + body.slice(position + 1));
    }
  }
  return results;
}

/** Insert one digit 0–9 at every position, on either side of the point. */
function droppedDigitInsertions(body: string): string[] {
  const results: string[] = [];
  for (let position = 0; position <= body.length; position += 1) {
    for (let digit = 0; digit <= 9; digit += 1) {
      results.push(body.slice(0, position) + String(digit) + body.slice(position));
    }
  }
  return results;
}
