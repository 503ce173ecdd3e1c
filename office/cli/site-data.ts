// A bundle's records gathered per site for the exports: the latest revision of each record (the higher
// rev wins, as in the merge rule), tombstones dropped, and each reading's discharge through the rating
// in force at its time with that rating's dated shifts (core's withDischarge).
import { compareRev, fromSyncRecord, withDischarge } from '../../core/index';
import type { AnalysisRecord, GaugingRecord, RatingRecord, ReadingExportRow, ReadingRecord, SiteRecord, SyncRecord } from '../../core/index';

/** One site's records from a bundle: readings with discharge (oldest first), gaugings, ratings (by start), analyses. */
export interface SiteData {
  site: SiteRecord;
  readings: ReadingExportRow[];
  gaugings: GaugingRecord[];
  ratings: RatingRecord[];
  analyses: AnalysisRecord[];
}

/** The latest live revision of every record in `records`, by kind. */
function latest(records: readonly SyncRecord[]): SyncRecord[] {
  const best = new Map<string, SyncRecord>();
  for (const r of records) {
    const key = `${r.kind}\u0000${r.id}`;
    const old = best.get(key);
    if (!old || compareRev(r.rev, old.rev) > 0) best.set(key, r);
  }
  return [...best.values()].filter((r) => r.deleted !== true);
}

/** Every site in the bundle with its records, sites in code order; records of sites not in the bundle are left out. */
export function sitesOf(records: readonly SyncRecord[]): SiteData[] {
  const live = latest(records);
  const sites = new Map<string, SiteData & { rawReadings: ReadingRecord[] }>();
  for (const r of live) {
    if (r.kind === 'site') sites.set(r.id, { site: fromSyncRecord(r), readings: [], rawReadings: [], gaugings: [], ratings: [], analyses: [] });
  }
  for (const r of live) {
    if (r.kind === 'site') continue;
    const s = sites.get(r.body.siteId);
    if (!s) continue;
    if (r.kind === 'reading') s.rawReadings.push(fromSyncRecord(r));
    else if (r.kind === 'gauging') s.gaugings.push(fromSyncRecord(r));
    else if (r.kind === 'rating') s.ratings.push(fromSyncRecord(r));
    else if (r.kind === 'analysis') s.analyses.push(fromSyncRecord(r));
  }
  return [...sites.values()]
    .sort((a, b) => a.site.code.localeCompare(b.site.code))
    .map(({ rawReadings, ...s }) => {
      rawReadings.sort((a, b) => a.time_ms - b.time_ms || a.source.localeCompare(b.source));
      s.gaugings.sort((a, b) => a.time_ms - b.time_ms);
      s.ratings.sort((a, b) => a.validFrom_ms - b.validFrom_ms);
      s.analyses.sort((a, b) => a.from_ms - b.from_ms);
      return { ...s, readings: withDischarge(s.ratings, rawReadings) };
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
