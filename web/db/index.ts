// web/db: the only way screens read and write stored records. Every save is validated, written in one
// transaction and resolves only once durable; deletion is a tombstone that restore undoes.
export { openFreshetDb, getDb, type FreshetDb } from './connection';
export { DB_NAME, DB_VERSION, type FreshetDB, type MetaKey, type MetaValues, type SeriesChunk } from './schema';
export { StorageError, storageMessage, toStorageError, type StorageFailure } from './errors';
export { onDbEvent, onRecordsChanged, type DbEvent, type RecordsChange } from './events';
export { storageState, type StorageState } from './persist';
export { deviceId, observeRev } from './clock';
export { changedSince, type ReadOptions, type SaveInput } from './records';
export { saveSite, getSite, deleteSite, restoreSite, listSites } from './sites';
export { getReading, listReadings, latestReading, latestReadings, readingBefore } from './readings';
export {
  saveReading, deleteReading, restoreReading, importReadings, withReadingsWrite, putReadingsInTx, addReadingsInTx,
  DEFAULT_IMPORT_BATCH, type SaveReadingOptions, type ImportOptions, type ImportProgress, type ImportDuplicate, type ImportResult,
  type OtherStore, type ReadingsTx,
} from './readings-write';
export { readingsWithDischarge, seriesWithDischarge, type SeriesWithDischarge } from './discharge-read';
export { readingSeries, type ReadingSeries } from './series-read';
export type { ReadingWithDischarge } from '../../core/readings/index';
export { READING_SOURCE_CODES, readingSourceOfCode, type ReadingSourceCode } from '../../core/records/index';
export {
  importLoggerRecord, listLoggerDays, type LoggerImportInput, type LoggerImportResult, type LoggerImportDuplicate,
  type LoggerImportProgress, type LoggerImportOptions,
} from './logger-days';
export { saveGauging, getGauging, deleteGauging, restoreGauging, listGaugings } from './gaugings';
export { saveRating, getRating, deleteRating, restoreRating, listRatings, ratingInForceAt, ratingsAndGaugings } from './ratings';
export { saveAnalysis, getAnalysis, deleteAnalysis, restoreAnalysis, listAnalyses } from './analyses';
export { saveDraft, getDraft, discardDraft, listDrafts } from './drafts';
export { saveConflict, dismissConflict, listConflicts } from './conflicts';
export { getMeta, setMeta } from './meta';
export { settleConflict } from './conflicts';
export { applyIncoming, previewIncoming, STORE_OF_KIND, syncedVersion, type IncomingResult } from './sync-merge';
export {
  acknowledge, exportBundle, markExported, markOf, MAX_BUNDLE_RECORDS, nextOutgoing, noteAttempt, waitingCount, type ExportFile,
} from './outbox';
export { bundleBytes } from './outbox';
export { dropSetAside, listSetAside, noteStatedLimit, refusedAsTooLarge, searchRefused, setAsideRefused, type SetAsideView } from './outbox-refusals';
export type { OutboxLimits, SetAsideEntry } from './outbox-state';
export { getSyncValue, noteSyncProblem, setSyncValue, updateSyncStatus } from './sync-store';
export { onSyncChanged } from './sync-events';
export type { OutboxEntry, SyncKey, SyncProblem, SyncSettings, SyncStatusRecord, SyncValues } from './schema';
