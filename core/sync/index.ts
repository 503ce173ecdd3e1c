// Sync merge rules, pure: which version of a record wins, which are kept for review, which are flagged.
export { descends, ownKeptBases, seenAfter, stampOf, type VersionStamp } from './ancestry';
export { AHEAD_TOLERANCE_MS, isAhead } from './ahead';
export { decide, type Decision, type DecideOptions } from './decide';
export { frontierOf, mergeIntoFrontier, recordKey, type Frontier } from './frontier';
export { readPushAnswer, retryAfter_ms, retryDelay_ms, RETRY_FIRST_MS, RETRY_MAX_MS, type PushAnswer, type PushOutcome } from './answer';
export { byRevision, winningVersion, winsOver } from './winner';
export { applyPlan, planMerge, type AheadFlag, type FrontierChange, type MergePlan, type MergeSummary } from './plan';
export { readRefusal, type PushRefusal } from './refusal';
