// A bundle's records gathered per site for the exports: the version of each record that wins by core's
// sync rule (frontierOf, as the phone and the receiver merge), tombstones dropped, and the site's stage
// record (spot readings and logger days joined by core's stageRecordWithDischarge, each value with its
// discharge through the rating in force at its time), so the office writes what the phone writes.
import { frontierOf, fromSyncRecord, recordKey, stageExportRows, stageRecordWithDischarge } from '../../core/index';
import type {
  AnalysisRecord, GaugingRecord, LoggerDayRecord, PhotoRecord, RatingRecord, ReadingExportRow, ReadingRecord, SiteRecord, StageRecordWithDischarge,
  SyncRecord,
} from '../../core/index';

/** One site's records: its stage record with discharge, as export rows (oldest first), gaugings, ratings (by start), analyses. */
export interface SiteData {
  site: SiteRecord;
  readings: ReadingExportRow[];
  /** The joined stage record (spot readings and logger values) the rows were made from. */
  stage: StageRecordWithDischarge;
  gaugings: GaugingRecord[];
  ratings: RatingRecord[];
  analyses: AnalysisRecord[];
  /** The site's photos (of the site, its readings and gaugings), oldest taken first. */
  photos: PhotoRecord[];
}

/** The winning live version of every record in `records` (core's sync rule, frontierOf), by kind and id. */
function latest(records: readonly SyncRecord[]): SyncRecord[] {
  const versions = new Map<string, SyncRecord[]>();
  for (const r of records) {
    const key = recordKey(r.kind, r.id);
    const list = versions.get(key);
    if (list) list.push(r);
    else versions.set(key, [r]);
  }
  return [...versions.values()].map((v) => frontierOf(v).winner).filter((r) => r.deleted !== true);
}

/** Every site in the bundle with its records, sites in code order; records of sites not in the bundle are left out. */
export function sitesOf(records: readonly SyncRecord[]): SiteData[] {
  const live = latest(records);
  type Gathered = Omit<SiteData, 'readings' | 'stage'> & { rawReadings: ReadingRecord[]; loggerDays: LoggerDayRecord[] };
  const sites = new Map<string, Gathered>();
  for (const r of live) {
    if (r.kind === 'site') sites.set(r.id, { site: fromSyncRecord(r), rawReadings: [], loggerDays: [], gaugings: [], ratings: [], analyses: [], photos: [] });
  }
  for (const r of live) {
    if (r.kind === 'site') continue;
    const s = sites.get(r.body.siteId);
    if (!s) continue;
    if (r.kind === 'reading') s.rawReadings.push(fromSyncRecord(r));
    else if (r.kind === 'logger-day') s.loggerDays.push(fromSyncRecord(r));
    else if (r.kind === 'gauging') s.gaugings.push(fromSyncRecord(r));
    else if (r.kind === 'rating') s.ratings.push(fromSyncRecord(r));
    else if (r.kind === 'analysis') s.analyses.push(fromSyncRecord(r));
    else if (r.kind === 'photo') s.photos.push(fromSyncRecord(r));
  }
  return [...sites.values()]
    .sort((a, b) => a.site.code.localeCompare(b.site.code))
    .map(({ rawReadings, loggerDays, ...s }) => {
      s.gaugings.sort((a, b) => a.time_ms - b.time_ms);
      s.ratings.sort((a, b) => a.validFrom_ms - b.validFrom_ms);
      s.analyses.sort((a, b) => a.from_ms - b.from_ms);
      s.photos.sort((a, b) => a.taken_ms - b.taken_ms || (a.id < b.id ? -1 : 1));
      const stage = stageRecordWithDischarge(s.ratings, rawReadings, loggerDays);
      return { ...s, stage, readings: stageExportRows(stage) };
    });
}

/** A file-name-safe form of a site code ("PB-03" stays, "A/B 1" becomes "A_B_1"). */
export function fileStem(code: string): string {
  const s = code.replace(/[^\w.-]+/g, '_').replace(/^[.-]+/, '_');
  return s === '' ? 'site' : s.slice(0, 80);
}

/** File-name stems for the sites, in order: the code's stem, with the id's first 8 characters added where two would clash. */
export function siteStems(sites: readonly SiteRecord[]): string[] {
  const stems = sites.map((s) => fileStem(s.code));
  return stems.map((stem, i) => (stems.indexOf(stem) !== stems.lastIndexOf(stem) ? `${stem}_${sites[i].id.slice(0, 8)}` : stem));
}
