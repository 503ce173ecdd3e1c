// Plain-data record types stored on the phone and exchanged with the office. All values SI, times UTC
// epoch milliseconds; every type here is JSON-able (no Dates, Maps or class instances).
import type { DatedShift, MeasurementGrade, RatingSegment } from '../rating/index';
import type { UnitSystem } from '../units';
import type { PointVelocities } from '../gauging/vertical-velocity';
import type { EventPoints } from '../hydrograph/series';
import type { EventSummary } from '../hydrograph/summary';
import type { PhotoBody } from './photo-types';

/** Fields every stored record carries: id (UUID), rev (hybrid-logical-clock string), updated_ms, tombstone. */
export interface RecordEnvelope {
  /** UUID string (lower-case, 36 characters); drafts and conflicts use the same form. */
  id: string;
  /** Revision: fixed-width wall time, counter and device id; a later change sorts higher as a string. */
  rev: string;
  /** When this revision was written on its device, UTC epoch ms. */
  updated_ms: number;
  /** Present (and true) when the record was deleted: a tombstone that syncs like any change. */
  deleted?: true;
  /**
   * The versions from other devices this one was built on: at most one revision per device (the latest),
   * never this revision's own device. Absent on a first version. Sync uses it to tell an edit that knew
   * an earlier version from a concurrent change (core/sync/ancestry.ts).
   */
  seen?: string[];
}

/** A point on the Earth in decimal degrees (WGS 84). */
export interface LatLon {
  lat: number;
  lon: number;
}

/** A satellite position fix taken with a reading: degrees, horizontal accuracy in m, fix time UTC ms. */
export interface GpsFix extends LatLon {
  accuracy_m: number;
  time_ms: number;
}

/** A gauging station: its identity, datum, zone, display units and the jump limit for plausibility warnings. */
export interface SiteBody {
  /** Short code the office uses for the station, e.g. "FX-104". */
  code: string;
  name: string;
  /** Catchment area upstream of the gauge, km². */
  area_km2?: number;
  /** Gauge datum: what it is tied to, and its elevation in m above the named vertical datum. */
  datum?: { description: string; elevation_m?: number };
  location?: LatLon;
  /** IANA time zone used to show and enter times at this site, e.g. "Pacific/Auckland". */
  timeZone: string;
  /** Units the screens show for this site; storage stays SI. */
  displayUnits: UnitSystem;
  /** A stage change larger than this (m) since the previous reading earns a plausibility warning. */
  jumpLimit_m: number;
}

/** All reading sources (where a stage reading came from), in the order screens list them: the one list. */
export const READING_SOURCES = ['staff', 'wire-weight', 'crest-stage', 'logger'] as const;
/** All reading quality grades (the reader's own judgement), best first: the one list. */
export const READING_QUALITIES = ['good', 'fair', 'poor', 'estimated'] as const;

/** Where a stage reading came from. */
export type ReadingSource = (typeof READING_SOURCES)[number];

/** The reader's own judgement of a reading. */
export type ReadingQuality = (typeof READING_QUALITIES)[number];

/** True when x names a reading source. */
export function isReadingSource(x: unknown): x is ReadingSource {
  return (READING_SOURCES as readonly unknown[]).includes(x);
}

/** True when x names a reading quality. */
export function isReadingQuality(x: unknown): x is ReadingQuality {
  return (READING_QUALITIES as readonly unknown[]).includes(x);
}

/** A stage reading: gauge height (m above gauge datum) at a time (UTC ms) at one site. */
export interface ReadingBody {
  siteId: string;
  time_ms: number;
  stage_m: number;
  source: ReadingSource;
  quality: ReadingQuality;
  /** Who read the gauge (free text, may be empty). */
  observer: string;
  note: string;
  /** Plausibility warnings shown when the reading was saved, one sentence each. */
  warnings: string[];
  gps?: GpsFix;
  /**
   * Present when this reading is a check beside the logger: the value the logger showed at the same
   * time, m above gauge datum. The reading itself stays the gauge's value; logger − staff is the drift.
   */
  loggerCheck?: { logger_m: number };
}

/** A check used to correct a logger record: the gauge (staff) value and the logger's, m, at time_ms (UTC). */
export interface LoggerDayCheck {
  time_ms: number;
  staff_m: number;
  logger_m: number;
  /** The stored check reading it came from, when there is one. */
  readingId?: string;
}

/**
 * One site and UTC day of a logger record, kept as one record of compact arrays (a logger's values are
 * machine records nobody edits one at a time). The raw values and the corrections are both kept, with
 * the checks the corrections came from, so a correction can be redone; stage = raw + correction.
 */
export interface LoggerDayBody {
  siteId: string;
  /** UTC day index: floor(time_ms / 86 400 000). */
  day: number;
  /** Times as whole ms after the start of the UTC day (0 ≤ t < 86 400 000), strictly ascending. */
  offset_ms: number[];
  /** Logger values as read from the file, converted to m above gauge datum. */
  raw_m: number[];
  /** Drift correction at each time, m (0 where none was applied). */
  correction_m: number[];
  /** The checks the corrections came from, oldest first (empty when none). */
  checks: LoggerDayCheck[];
  /** Name of the file the values came from. */
  fileName: string;
  note: string;
}

/** How a discharge measurement was made. */
export type GaugingMethod = 'velocity-area' | 'acoustic-profiler' | 'volumetric' | 'dilution' | 'float' | 'other';
/** All gauging methods. */
export const GAUGING_METHODS: readonly GaugingMethod[] = [
  'velocity-area', 'acoustic-profiler', 'volumetric', 'dilution', 'float', 'other',
];
/** All measurement grades, best first. */
export const GAUGING_GRADES: readonly MeasurementGrade[] = ['excellent', 'good', 'fair', 'poor'];

/** One vertical of a velocity–area gauging: station and depth in m, mean velocity in m/s. */
export interface RecordedVertical {
  station_m: number;
  depth_m: number;
  velocity_mps: number;
  /** Cosine correction for flow not normal to the section, 0–1. */
  angleCoefficient?: number;
  /** The point velocities (m/s) the mean velocity was worked out from, when they were typed. */
  observed?: PointVelocities;
}

/** A discharge measurement: mean stage (m), measured discharge (m³/s), method and grade. */
export interface GaugingBody {
  siteId: string;
  time_ms: number;
  meanStage_m: number;
  discharge_m3s: number;
  method: GaugingMethod;
  grade: MeasurementGrade;
  observer: string;
  note: string;
  verticals?: RecordedVertical[];
}

/** Fit statistics kept with a rating fitted from gaugings. */
export interface RatingFitStats {
  /** Standard error of estimate in log space, as percent. */
  standardError_pct: number;
  /** Number of gaugings the fit used. */
  gaugingCount: number;
  warnings: string[];
}

/** A stage–discharge rating in force from validFrom_ms; shifts are dated stage-variable curves (m). */
export interface RatingBody {
  siteId: string;
  validFrom_ms: number;
  /** Power-law segments Q = C·(h + shift − e)^b, sorted by fromStage_m ascending. */
  segments: RatingSegment[];
  /** Lowest and highest gauged stage, m. */
  gaugedRange_m?: [number, number];
  /** Dated shifts (time_ms ascending), in the shape core `shiftAt` reads. */
  shifts: DatedShift[];
  /** Ids of the gaugings the rating was fitted from (empty when entered by hand). */
  fittedFrom: string[];
  fit?: RatingFitStats;
  note: string;
}

/** The four key times of a storm event, UTC ms (the hydrograph core's EventPoints). */
export type AnalysisKeyPoints = EventPoints;

/** A JSON value (what drafts and method parameters may hold). */
export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

/** The figures a storm analysis produced (summarizeEvent's result without its notes): m³/s, m³, mm, ratios. */
export type AnalysisResults = Omit<EventSummary, 'notes'>;

/** A saved storm analysis: the window (UTC ms), the separation method and its parameters, key points, results. */
export interface AnalysisBody {
  siteId: string;
  from_ms: number;
  to_ms: number;
  /** Separation method as a plain tagged object, e.g. { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 }. */
  method: { kind: string; [parameter: string]: JsonValue };
  points: AnalysisKeyPoints;
  area_km2?: number;
  rainfall_mm?: number;
  results: AnalysisResults;
  note: string;
}

/** A half-filled form kept so nothing typed is lost: the form's name, its site and fields as JSON. */
export interface DraftBody {
  /** Which form this is, e.g. "reading" or "gauging". */
  form: string;
  siteId?: string;
  fields: { [key: string]: JsonValue };
}

/** The body of each record kind that syncs with the office. */
export interface SyncBodies {
  site: SiteBody;
  reading: ReadingBody;
  gauging: GaugingBody;
  rating: RatingBody;
  analysis: AnalysisBody;
  'logger-day': LoggerDayBody;
  photo: PhotoBody;
}

/** Kinds of records that sync with the office. */
export type SyncKind = keyof SyncBodies;
/** All kinds that sync, in a fixed order. */
export const SYNC_KINDS: readonly SyncKind[] = ['site', 'reading', 'gauging', 'rating', 'analysis', 'logger-day', 'photo'];

/** The unit of exchange: one record as it travels in a bundle; body holds the fields plus updated_ms. */
export type SyncRecord<K extends SyncKind = SyncKind> = {
  [P in K]: { kind: P; id: string; rev: string; deleted?: true; body: SyncBodies[P] & { updated_ms: number; seen?: string[] } };
}[K];

/** Why a version was kept for review: changed on two sides since they last agreed, or dated ahead of the clock. */
export type ConflictReason = 'concurrent' | 'ahead';

/** A losing version kept for review after a merge: the record it lost to and when it was found (UTC ms). */
export interface ConflictBody {
  kind: SyncKind;
  recordId: string;
  losing: SyncRecord;
  winnerRev: string;
  found_ms: number;
  /** Absent means 'concurrent' (conflicts written before the reason was kept). */
  reason?: ConflictReason;
}

/** A stored site. */
export type SiteRecord = RecordEnvelope & SiteBody;
/** A stored stage reading. */
export type ReadingRecord = RecordEnvelope & ReadingBody;
/** A stored gauging. */
export type GaugingRecord = RecordEnvelope & GaugingBody;
/** A stored rating. */
export type RatingRecord = RecordEnvelope & RatingBody;
/** A stored storm analysis. */
export type AnalysisRecord = RecordEnvelope & AnalysisBody;
/** A stored day of a logger record. */
export type LoggerDayRecord = RecordEnvelope & LoggerDayBody;
/** A stored photo record (the bytes are kept apart, by their SHA-256). */
export type PhotoRecord = RecordEnvelope & PhotoBody;
/** A stored draft (local only, never synced). */
export type DraftRecord = RecordEnvelope & DraftBody;
/** A stored conflict (local only, never synced). */
export type ConflictRecord = RecordEnvelope & ConflictBody;

/** The stored record of each kind, including the local-only kinds. */
export interface StoredRecords {
  site: SiteRecord;
  reading: ReadingRecord;
  gauging: GaugingRecord;
  rating: RatingRecord;
  analysis: AnalysisRecord;
  'logger-day': LoggerDayRecord;
  photo: PhotoRecord;
  draft: DraftRecord;
  conflict: ConflictRecord;
}

/** Every record kind the phone stores. */
export type RecordKind = keyof StoredRecords;
