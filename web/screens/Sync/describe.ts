// Plain words for a record version in the review list: what it is and its main figures, in the site's
// zone and units. Never the stored field names.
import type { ConflictRecord, SiteRecord, SyncRecord } from '../../../core';
import { formatQuantity, formatTime } from '../../format';
import { MS_PER_DAY } from '../../../core/time/index';

/** What kind of record it is, in words. */
export const KIND_WORDS: Record<SyncRecord['kind'], string> = {
  site: 'Site', reading: 'Stage reading', gauging: 'Gauging', rating: 'Rating', analysis: 'Storm analysis',
  'logger-day': 'Logger record (one day)', photo: 'Photo',
};

/** Lines describing one version: its main fields in words, "Deleted" for a tombstone. */
export function describeVersion(v: SyncRecord, sites: ReadonlyMap<string, SiteRecord>): string[] {
  if (v.deleted) return ['Deleted'];
  const b = v.body as unknown as Record<string, unknown>;
  const site = typeof b.siteId === 'string' ? sites.get(b.siteId) : undefined;
  const zone = site?.timeZone ?? 'UTC';
  const units = site?.displayUnits ?? 'metric';
  const when = (t: unknown) => (typeof t === 'number' ? `${formatTime(t, zone)} (${zone})` : '—');
  const text = (t: unknown) => (typeof t === 'string' && t.trim() ? t : '—');
  switch (v.kind) {
    case 'site':
      return [`Code: ${text(b.code)}`, `Name: ${text(b.name)}`, `Time zone: ${text(b.timeZone)}`];
    case 'reading':
      return [`Time: ${when(b.time_ms)}`, `Stage: ${formatQuantity('stage', b.stage_m as number, units)}`, `Source: ${text(b.source)}`, `Note: ${text(b.note)}`];
    case 'gauging':
      return [`Time: ${when(b.time_ms)}`, `Mean stage: ${formatQuantity('stage', b.meanStage_m as number, units)}`, `Discharge: ${formatQuantity('discharge', b.discharge_m3s as number, units)}`, `Note: ${text(b.note)}`];
    case 'rating':
      return [`In force from: ${when(b.validFrom_ms)}`, `Segments: ${Array.isArray(b.segments) ? b.segments.length : 0}`, `Shifts: ${Array.isArray(b.shifts) ? b.shifts.length : 0}`, `Note: ${text(b.note)}`];
    case 'analysis':
      return [`From: ${when(b.from_ms)}`, `To: ${when(b.to_ms)}`, `Note: ${text(b.note)}`];
    case 'logger-day': {
      const offsets = Array.isArray(b.offset_ms) ? b.offset_ms.length : 0;
      const day = typeof b.day === 'number' ? b.day * MS_PER_DAY : undefined;
      return [`Day starting: ${when(day)}`, `Values: ${offsets}`, `File: ${text(b.fileName)}`, `Note: ${text(b.note)}`];
    }
    case 'photo': {
      const kb = typeof b.bytes === 'number' ? `${Math.max(1, Math.round(b.bytes / 1024))} KB` : '—';
      return [`Taken: ${when(b.taken_ms)}`, `Size: ${kb}`, `Caption: ${text(b.caption)}`];
    }
    default: {
      const never: never = v;
      return [String(never)];
    }
  }
}

/** Why the version is up for review, in words. */
export function reasonWords(c: ConflictRecord): string {
  return c.reason === 'ahead'
    ? 'A version dated ahead of this device’s clock (a phone with a wrong date?) replaced this one. It is in use; check it.'
    : 'Changed here and elsewhere since the two last agreed. The later change is in use; this one was kept.';
}
