// The file name a photo is written under by the office's `freshet photos`, and named by in the `photos`
// column of the CSV tables: the time it was taken in the site's zone, the kind of record it belongs to and
// the photo's id, with the extension of its type. Only letters, digits, "-", "_" and "."; never a path.
import type { PhotoRecord, SiteRecord } from '../records/index';
import { isoWithOffsetFormatter } from './iso-times';

const EXTENSION: Readonly<Record<string, string>> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };

/** The extension (without the dot) for a photo's media type. */
export function photoExtension(type: string): string {
  return EXTENSION[type] ?? 'bin';
}

/**
 * A function naming photos for one site: "20260601-093000_reading_<photo id>.jpg" (taken time, wall
 * clock in `timeZone`), and "…_original.<ext>" for the kept original.
 */
export function photoNamer(timeZone: string): (photo: Pick<PhotoRecord, 'id' | 'taken_ms' | 'owner' | 'type'>, original?: { type: string }) => string {
  const iso = isoWithOffsetFormatter(timeZone);
  return (photo, original) => {
    // "2026-06-01T09:30:00+12:00" → "20260601-093000"
    const local = iso(photo.taken_ms).slice(0, 19).replace(/[-:]/g, '').replace('T', '-');
    const id = photo.id.replace(/[^0-9a-f-]/g, '_');
    const kind = photo.owner.kind.replace(/[^a-z-]/g, '_');
    return original ? `${local}_${kind}_${id}_original.${photoExtension(original.type)}` : `${local}_${kind}_${id}.${photoExtension(photo.type)}`;
  };
}

/** The photo file names of each record of a site (by the id of the record they belong to), as `freshet photos` names them. */
export function photoFilesByOwner(data: { site: Pick<SiteRecord, 'timeZone'>; photos: readonly PhotoRecord[] }): Map<string, string[]> {
  const name = photoNamer(data.site.timeZone);
  const out = new Map<string, string[]>();
  for (const p of data.photos) {
    const list = out.get(p.owner.id);
    if (list) list.push(name(p));
    else out.set(p.owner.id, [name(p)]);
  }
  return out;
}
