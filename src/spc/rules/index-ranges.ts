/**
 * Sorted point indices as ranges of consecutive ones, "0–4", "9", "12–20": how the rules' messages and
 * the reports name the points they speak of. Cost: one pass over the indices.
 */
export function indexRanges(indices: readonly number[]): string[] {
  const ranges: string[] = [];
  let first = 0;
  for (let position = 1; position <= indices.length; position++) {
    if (position < indices.length && indices[position] === indices[position - 1]! + 1) continue;
    const start = indices[first]!;
    const end = indices[position - 1]!;
    ranges.push(start === end ? `${start}` : `${start}–${end}`);
    first = position;
  }
  return ranges;
}
