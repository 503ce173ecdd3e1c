// Checks on stage readings as they are entered, and stored readings with their discharge.
export { checkReading, FUTURE_TOLERANCE_MS, type ReadingCheck, type ReadingCheckInput, type ReadingWarning, type ReadingWarningCode } from './plausibility';
export { withDischarge, type ReadingWithDischarge } from './with-discharge';
export { joinStageRecord, spotSeriesOf, type SpotSeries, type StageLoggerDay, type StageRecord } from './stage-record';
export { stageRecordWithDischarge, type StageRecordWithDischarge } from './stage-discharge';
