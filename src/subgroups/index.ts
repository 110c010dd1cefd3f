export { appendSubgroups, type TAppendOptions, type TAppendResult, type TStoredSubgroup } from "./append";
export { correctValue, correctionsFor, type TCorrectionTarget, type TCorrectionFields, type TCorrectedField } from "./correct";
export { summarize } from "./summaries";
