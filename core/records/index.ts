// Records shared by storage and sync: plain-data types, revisions (hybrid logical clock), validation.
export * from './types';
export * from './photo-types';
export { RecordValidationError, describeValue } from './validation-error';
export { textProblem, textProblemWords, textRefusal, cleanText, jsonTextProblem, TEXT_RULE_WORDS, type TextProblem } from './text';
export { MAX_TIME_MS, MAX_TEXT_LENGTH, isUuid } from './checks';
export { formatRev, parseRev, isRev, nextRev, compareRev, maxRev, REV_MAX_WALL_MS, REV_MAX_COUNTER, type RevParts } from './hlc';
export { validateEnvelope, validateSeen, MAX_SEEN } from './envelope';
export { validateSiteBody, isTimeZone, MAX_AREA_KM2, MAX_JUMP_LIMIT_M, MIN_DATUM_ELEVATION_M, MAX_DATUM_ELEVATION_M } from './validate-site';
export { validateReadingBody, MAX_ABS_STAGE_M } from './validate-reading';
export { validateGaugingBody } from './validate-gauging';
export { validateRatingBody } from './validate-rating';
export { validateAnalysisBody } from './validate-analysis';
export { validateLoggerDayBody, MAX_LOGGER_DAY_VALUES, MAX_ABS_CORRECTION_M } from './validate-logger-day';
export { validateDraftBody } from './validate-draft';
export { validatePhotoBody, isSha256Hex } from './validate-photo';
export { validateBody, validateRecord, validateSyncRecord, validateConflictBody, isSyncKind } from './validate-record';
export { toSyncRecord, fromSyncRecord } from './sync-record';
export { READING_SOURCE_CODES, readingSourceOfCode, type ReadingSourceCode } from './source-codes';
