/**
 * Evidence checks for candidate causes. Every test returns
 * `{ test, statistic, df?, pValue, effect, sentence }` (EvidenceResult) and refuses unusable input
 * (non-finite values, too few observations, constant data) by throwing SpcInputError with a message
 * that says why; each file states its own refusals.
 */
export { formatPValue, formatAmount, type EvidenceLabels, type EvidenceResult } from "./sentence";
export { oneWayAnova, type AnovaEffect, type LevelComparisonEffect } from "./anova";
export { kruskalWallis, type KruskalWallisEffect } from "./kruskal-wallis";
export { welchTTest, type MeanChangeEffect } from "./welch-t";
export { varianceRatioTest, type Alternative, type SpreadChangeEffect } from "./f-test";
export { brownForsythe, brownForsytheBeforeAfter, type SpreadComparisonEffect } from "./brown-forsythe";
export { pearsonCorrelation, type CorrelationEffect } from "./pearson";
export { spearmanCorrelation, averageRanks } from "./spearman";
export { mannKendall, mannKendallVariance, type TrendEffect } from "./mann-kendall";
export { groupByLevel, beforeAfterGroups, median, type Group, type LevelSummary, type LargestGap } from "./groups";
export { autocorrelation, whiteNoiseBand } from "./autocorrelation";
export { periodogram, dominantPeriod, fisherGPValue, type Periodogram, type DominantPeriod } from "./periodogram";
