// web/db: the only way screens read and write stored records. Every save is validated, written in one
// transaction and resolves only once durable; deletion is a tombstone that restore undoes. This surface
// is what the app uses (test/web/layers.test.ts holds it to that); tests import the internal modules.
export { StorageError } from './errors';
export { onRecordsChanged } from './events';
export { storageState, type StorageState } from './persist';
export { deviceId } from './clock';
export { saveSite, getSite, deleteSite, listSites } from './sites';
export { getReading, listReadings, latestReading, latestReadings, readingBefore } from './readings';
export { saveReading, deleteReading, restoreReading, importReadings, type ImportProgress } from './readings-write';
export { readingsWithDischarge, seriesWithDischarge, stageRecordIn, type SeriesWithDischarge } from './discharge-read';
export { latestStageTime } from './series-read';
export type { ReadingWithDischarge } from '../../core/readings/index';
export { importLoggerRecord, type LoggerImportResult } from './logger-days';
export { saveGauging, getGauging, deleteGauging, listGaugings } from './gaugings';
export { saveRating, deleteRating, restoreRating, listRatings, ratingInForceAt, ratingsAndGaugings } from './ratings';
export { saveAnalysis, deleteAnalysis, listAnalyses } from './analyses';
export { savePhoto, deletePhoto, restorePhoto, setPhotoCaption, listPhotosOf, listPhotosAtSite } from './photos';
export { photoBytesSummary } from './photo-bytes';
export { saveDraft, discardDraft, listDrafts } from './drafts';
export { listConflicts } from './conflicts';
export { settleConflict } from './conflicts';
export { applyIncoming, previewIncoming, syncedVersion, type IncomingResult } from './sync-merge';
export { acknowledge, exportBundle, markExported, nextOutgoing, noteAttempt, waitingCount } from './outbox';
export { dropSetAside, listSetAside, searchRefused, type SetAsideView } from './outbox-refusals';
export { getSyncValue, noteSyncProblem, setSyncValue, updateSyncStatus } from './sync-store';
export { onSyncChanged } from './sync-events';
export type { SyncSettings, SyncStatusRecord } from './schema';
