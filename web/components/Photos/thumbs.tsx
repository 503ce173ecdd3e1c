// Thumbnails of photos: each a button that opens the full view, with its time and caption under it.
import type { PhotoRecord } from '../../../core';
import { formatTime } from '../../format';
import { useBlobUrl, usePhotoUrl } from './use-photo-url';

function Face({ url, missing, alt }: { url?: string; missing?: boolean; alt: string }) {
  if (url) return <img src={url} alt={alt} loading="lazy" decoding="async" />;
  return <span class="photo-face-empty">{missing ? 'Not on this phone yet' : '…'}</span>;
}

/** One stored photo as a thumbnail button. */
export function StoredThumb({ photo, timeZone, onOpen }: { photo: PhotoRecord; timeZone: string; onOpen(p: PhotoRecord): void }) {
  const pic = usePhotoUrl(photo.sha256);
  const when = formatTime(photo.taken_ms, timeZone);
  return (
    <li class="photo-thumb">
      <button type="button" onClick={() => onOpen(photo)} aria-label={`Open the photo taken ${when}${photo.caption ? `: ${photo.caption}` : ''}`}>
        <Face url={pic.state === 'here' ? pic.url : undefined} missing={pic.state === 'missing'} alt="" />
      </button>
      <span class="photo-when">{when}</span>
      {photo.caption && <span class="photo-caption">{photo.caption}</span>}
    </li>
  );
}

/** A photo prepared but not yet kept (the new reading form), with a button to leave it out. */
export function PendingThumb({ blob, caption, when, onRemove }: { blob: Blob; caption: string; when: string; onRemove(): void }) {
  const url = useBlobUrl(blob);
  return (
    <li class="photo-thumb">
      <span class="photo-face"><Face url={url} alt={caption || `Photo of ${when}`} /></span>
      <span class="photo-when">{when}</span>
      {caption && <span class="photo-caption">{caption}</span>}
      <button type="button" class="photo-remove" onClick={onRemove}>Leave out</button>
    </li>
  );
}
