/**
 * Which limit version applies to which points. The set in force for a point is the highest version whose
 * `appliesFrom` is at or before the point's sequence. Each version in force over some points forms one
 * segment [from, to): a fresh chart, on which run rules, the EWMA and the CUSUM start again.
 */

export interface TVersioned {
  readonly id: number;
  readonly version: number;
  readonly appliesFrom: number;
}

export interface TSegment<T extends TVersioned> {
  readonly limitSet: T;
  readonly from: number;
  /** End, exclusive; Infinity for the segment that new points join. */
  readonly to: number;
}

/** Segments in sequence order; versions superseded everywhere have none. */
export function limitSegments<T extends TVersioned>(limitSets: readonly T[]): TSegment<T>[] {
  const byVersion = [...limitSets].sort((a, b) => a.version - b.version);
  const segments: TSegment<T>[] = [];
  byVersion.forEach((limitSet, position) => {
    let to = Infinity;
    for (const later of byVersion.slice(position + 1)) to = Math.min(to, later.appliesFrom);
    if (limitSet.appliesFrom < to) segments.push({ limitSet, from: limitSet.appliesFrom, to });
  });
  return segments.sort((a, b) => a.from - b.from);
}

/** The segment holding `sequence`, or undefined before the first limit set applies. */
export function segmentAt<T extends TVersioned>(segments: readonly TSegment<T>[], sequence: number): TSegment<T> | undefined {
  return segments.find((segment) => segment.from <= sequence && sequence < segment.to);
}
