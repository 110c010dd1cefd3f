export { reevaluateSignals, reevaluateWithin, SIGNAL_TRIGGERS, type TSignalTrigger, type TReevaluationRequest, type TReevaluationOutcome } from "./reevaluate";
export { signalsFor } from "./query";
export type { TSignalView } from "./rows";
