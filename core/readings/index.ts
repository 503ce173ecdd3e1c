// Checks on stage readings as they are entered.
export { checkReading, FUTURE_TOLERANCE_MS, type ReadingCheck, type ReadingCheckInput, type ReadingWarning, type ReadingWarningCode } from './plausibility';
