// Sync merge rules, pure: which version of a record wins, which are kept for review, which are flagged.
export { descends, seenAfter, stampOf, type VersionStamp } from './ancestry';
export { AHEAD_TOLERANCE_MS, isAhead } from './ahead';
export { decide, type Decision, type DecideOptions } from './decide';
export { frontierOf, mergeIntoFrontier, recordKey, type Frontier } from './frontier';
export { applyPlan, planMerge, type AheadFlag, type FrontierChange, type MergePlan, type MergeSummary } from './plan';
