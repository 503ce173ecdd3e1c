// Photos of a record (a reading, a gauging, a site): thumbnails, adding by camera or chosen picture, the
// full view with pinch zoom, caption changes and delete with undo. PendingPhotos is the same for a new
// reading not saved yet: the photos are kept once the reading is (see keep.ts).
import { useEffect, useState } from 'preact/hooks';
import type { PhotoOwnerKind, PhotoRecord } from '../../../core';
import { deletePhoto, listPhotosOf, restorePhoto, setPhotoCaption } from '../../db';
import { useRecords } from '../use-records';
import { formatTime } from '../../format';
import { plainError } from '../../plain-words';
import { AddPhoto } from './add-photo';
import { keepPhoto, type PendingPhoto } from './keep';
import { photoRoom } from './room';
import { PendingThumb, StoredThumb } from './thumbs';
import { PhotoViewer } from './viewer';
import './style.css';

export { keepPending, type PendingPhoto } from './keep';

const OF_WHAT: Record<PhotoOwnerKind, string> = { reading: 'this reading', gauging: 'this gauging', site: 'the site' };

/** The room warning, read at first and after each photo. */
function useRoom(): [string | undefined, () => void] {
  const [warning, setWarning] = useState<string>();
  const check = () => void photoRoom().then(setWarning, () => undefined);
  useEffect(check, []);
  return [warning, check];
}

/** The photos of a saved record. */
export function Photos({ siteId, owner, timeZone }: { siteId: string; owner: { kind: PhotoOwnerKind; id: string }; timeZone: string }) {
  const photos = useRecords(() => listPhotosOf(owner.id), ['photo'], [owner.id]);
  const [open, setOpen] = useState<PhotoRecord>();
  const [undo, setUndo] = useState<PhotoRecord>();
  const [message, setMessage] = useState<string>();
  const [warning, checkRoom] = useRoom();
  const list = photos.state === 'ready' ? photos.value : [];

  async function added(p: PendingPhoto) {
    const kept = await keepPhoto(p, siteId, owner);
    setMessage('refused' in kept ? kept.refused : undefined);
    checkRoom();
  }
  async function remove(p: PhotoRecord) {
    setOpen(undefined);
    try {
      await deletePhoto(p.id);
      setUndo(p);
    } catch (err) {
      setMessage(plainError(err, { doing: 'save' }));
    }
  }

  return (
    <section class="card photos" aria-labelledby={`photos-${owner.id}`}>
      <h3 id={`photos-${owner.id}`}>Photos{list.length > 0 ? ` (${list.length})` : ''}</h3>
      {photos.state === 'failed' && <p class="callout bad" role="alert">{photos.message}</p>}
      {list.length > 0 && (
        <ul class="photo-grid" aria-label={`Photos of ${OF_WHAT[owner.kind]}`}>
          {list.map((p) => <StoredThumb key={p.id} photo={p} timeZone={timeZone} onOpen={setOpen} />)}
        </ul>
      )}
      {message && <p class="callout bad" role="alert">{message}</p>}
      <AddPhoto idPrefix={`photo-${owner.id}`} ofWhat={OF_WHAT[owner.kind]} warning={warning} onPrepared={added} />
      {undo && (
        <div class="notice" role="status">
          <p>Photo deleted.</p>
          <button type="button" onClick={async () => {
            setUndo(undefined);
            await restorePhoto(undo.id).catch((err: unknown) => setMessage(plainError(err, { doing: 'save' })));
          }}>Undo</button>
          <button type="button" onClick={() => setUndo(undefined)} aria-label="Dismiss">OK</button>
        </div>
      )}
      {open && (
        <PhotoViewer photo={open} timeZone={timeZone} onClose={() => setOpen(undefined)} onDelete={(p) => void remove(p)}
          onCaption={async (p, caption) => {
            try {
              setOpen(await setPhotoCaption(p, caption.trim()));
              return 'Caption saved.';
            } catch (err) {
              return plainError(err, { doing: 'save' });
            }
          }} />
      )}
    </section>
  );
}

/** Photos chosen on a reading not saved yet: held here until the reading is saved. */
export function PendingPhotos({ value, onChange, timeZone }: { value: PendingPhoto[]; onChange(next: PendingPhoto[]): void; timeZone: string }) {
  const [warning] = useRoom();
  return (
    <section class="card photos" aria-labelledby="pending-photos">
      <h3 id="pending-photos">Photos{value.length > 0 ? ` (${value.length}, kept when the reading is saved)` : ''}</h3>
      {value.length > 0 && (
        <ul class="photo-grid" aria-label="Photos of this reading">
          {value.map((p) => (
            <PendingThumb key={p.key} blob={p.prepared.image.blob} caption={p.caption} when={formatTime(p.taken_ms, timeZone)}
              onRemove={() => onChange(value.filter((x) => x.key !== p.key))} />
          ))}
        </ul>
      )}
      <AddPhoto idPrefix="photo-new" ofWhat="this reading" warning={warning} onPrepared={async (p) => onChange([...value, p])} />
    </section>
  );
}
