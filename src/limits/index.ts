export { reviseLimits, type TLimitRevisionFields } from "./revise";
export { limitSetsFor, limitSetInForce, type TLimitSetView } from "./query";
export { limitSegments, segmentAt, type TSegment } from "./segments";
export { chartParametersOf } from "./parameters";
export { summarySeries, type TSummary, type TSliceStart } from "./series";
