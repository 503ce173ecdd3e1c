// The whole IndexedDB schema as one type: a wrong store, index or value fails to compile.
import type { DBSchema, IDBPTransaction, StoreNames } from 'idb';
import type {
  AnalysisRecord, ConflictRecord, DraftRecord, GaugingRecord, LoggerDayRecord, PhotoRecord, RatingRecord, ReadingRecord, SiteRecord,
} from '../../core/records/index';
import type { PhotoBytesEntry } from './photo-bytes-entry';
import type { Bundle } from '../../core/exchange/index';
import type { OutboxLimits, SetAsideEntry } from './outbox-state';

/** Name of the app's database. */
export const DB_NAME = 'freshet';
/** Current schema version: the highest step of the upgrade ladder in upgrade.ts. */
export const DB_VERSION = 4;

/** Values kept in the meta store, by key: device id and last revision issued (the pull cursor is in `sync`). */
export interface MetaValues {
  /** This browser profile's device id (a UUID), generated once. */
  deviceId: string;
  /** The highest revision this device has issued or seen; the clock continues from it. */
  lastRev: string;
}

/**
 * One site-day of the compact series derived from the readings store: the non-deleted readings of a site
 * whose time falls in one UTC day, sorted by time (then id), as parallel arrays. Local only and never
 * synced: it is rebuilt from readings, and every write to readings updates it in the same transaction.
 */
export interface SeriesChunk {
  siteId: string;
  /** UTC day index: floor(time_ms / 86 400 000). */
  day: number;
  /** Reading times, UTC ms, ascending. */
  time_ms: Float64Array;
  /** Stages, m above gauge datum. */
  stage_m: Float64Array;
  /** Reading sources as READING_SOURCE_CODES. */
  source: Uint8Array;
  /** Reading ids, so an edited, moved or deleted reading can be found in its chunk. */
  id: string[];
}

/** The office endpoint: its base URL (https, or http on this machine) and the device's bearer token. */
export interface SyncSettings {
  base: string;
  token: string;
}

/** A failed exchange, in words for the screen: what went wrong, whether the user must act, when (UTC ms). */
export interface SyncProblem {
  message: string;
  /** 'retry': the app tries again by itself; 'fix': the user must change something (token, address). */
  kind: 'retry' | 'fix';
  at_ms: number;
}

/** Where sync stands: the last success and the last problem (UTC ms), the last file export. */
export interface SyncStatusRecord {
  lastSuccess_ms?: number;
  lastProblem?: SyncProblem;
  lastExport_ms?: number;
}

/**
 * Values in the sync store (version 2), by key. Marks are "<rev> <kind> <id>" keys: every record of this
 * device whose key sorts above `acked` still waits for the office.
 */
export interface SyncValues {
  settings: SyncSettings;
  /** Mark of the last record the office acknowledged (201/200 to a push that carried it). */
  acked: string;
  /** Mark of the last record written to a file of changes. */
  exported: string;
  /** The office's pull cursor (opaque), stored in the transaction that merged what it covers. */
  cursor: string;
  status: SyncStatusRecord;
  /** What sizes the next bundle (outbox-state.ts). */
  outboxLimits: OutboxLimits;
  /** Record versions kept out of bundles, with their reasons (outbox-state.ts). */
  setAside: SetAsideEntry[];
}

/** Keys of the sync store. */
export type SyncKey = keyof SyncValues;

/**
 * A bundle made for the office and not yet acknowledged. It is sent again, unchanged and under the same
 * id (the Idempotency-Key), until the office answers 201 or 200; then the acked mark moves to `through`.
 */
export interface OutboxEntry {
  /** The bundle's id. */
  id: string;
  bundle: Bundle;
  /** Mark of the last record in the bundle. */
  through: string;
  created_ms: number;
  attempts: number;
  /** Earliest time for the next automatic attempt, UTC ms. */
  nextAttempt_ms: number;
}

/** Keys of the meta store. */
export type MetaKey = keyof MetaValues & string;

/** The Freshet database, version 4. */
export interface FreshetDB extends DBSchema {
  sites: { key: string; value: SiteRecord; indexes: { 'by-code': string; 'by-rev': string } };
  readings: {
    key: string;
    value: ReadingRecord;
    indexes: {
      'by-site-time': [string, number];
      /** Duplicate checks: a logger import skips a (site, source, time) already stored. */
      'by-site-source-time': [string, string, number];
      'by-rev': string;
    };
  };
  gaugings: { key: string; value: GaugingRecord; indexes: { 'by-site-time': [string, number]; 'by-rev': string } };
  ratings: { key: string; value: RatingRecord; indexes: { 'by-site-from': [string, number]; 'by-rev': string } };
  analyses: { key: string; value: AnalysisRecord; indexes: { 'by-site-from': [string, number]; 'by-rev': string } };
  drafts: { key: string; value: DraftRecord; indexes: { 'by-form': string } };
  conflicts: { key: string; value: ConflictRecord; indexes: { 'by-record': string } };
  meta: { key: string; value: MetaValues[MetaKey] };
  /** Derived from readings, local only, never synced (see SeriesChunk); key [siteId, day]. */
  series: { key: [string, number]; value: SeriesChunk };
  /** Version 2: sync settings, marks, cursor and status (local only). */
  sync: { key: SyncKey; value: SyncValues[SyncKey] };
  /** Version 2: bundles made for the office and not yet acknowledged, by bundle id, oldest first. */
  outbox: { key: string; value: OutboxEntry; indexes: { 'by-created': number } };
  /** Logger records, one record per site and UTC day (since version 3); they sync as kind 'logger-day'. */
  loggerDays: { key: string; value: LoggerDayRecord; indexes: { 'by-site-day': [string, number]; 'by-rev': string } };
  /** Photo records (since version 4); they sync as kind 'photo'. The bytes are in photoBytes. */
  photos: {
    key: string;
    value: PhotoRecord;
    indexes: { 'by-owner': string; 'by-site-taken': [string, number]; 'by-sha256': string; 'by-rev': string };
  };
  /** Photo bytes by SHA-256 (since version 4): local only, shared by every photo record naming them. */
  photoBytes: { key: string; value: PhotoBytesEntry };
}

/**
 * A readwrite transaction of the readings writer: it holds the readings, series and meta stores and the
 * other stores its opener asked for. Typed over every store, so the opener's own stores are reachable;
 * asking for a store outside its scope throws NotFoundError at run time.
 */
export type ReadingsTx = IDBPTransaction<FreshetDB, StoreNames<FreshetDB>[], 'readwrite'>;
