// The full view of one photo: fills the screen, pinch zoom and pan (pointer events; zoom buttons and the
// wheel too), a close button in thumb reach, the time and caption (editable), and delete.
import { useEffect, useRef, useState } from 'preact/hooks';
import type { PhotoRecord } from '../../../core';
import { formatTime } from '../../format';
import { usePhotoUrl } from './use-photo-url';
import { FITTED, panned, pinched, stepped, transformOf, type Point, type ZoomView } from './zoom';

interface Props {
  photo: PhotoRecord;
  timeZone: string;
  onClose(): void;
  onDelete(photo: PhotoRecord): void;
  onCaption(photo: PhotoRecord, caption: string): Promise<string | undefined>;
}

/** The full view, as a dialog over the screen. */
export function PhotoViewer({ photo, timeZone, onClose, onDelete, onCaption }: Props) {
  const [attempt, setAttempt] = useState(0);
  const pic = usePhotoUrl(photo.sha256, attempt);
  const [view, setView] = useState<ZoomView>(FITTED);
  const [caption, setCaption] = useState(photo.caption ?? '');
  const [note, setNote] = useState<string>();
  const closeRef = useRef<HTMLButtonElement>(null);
  const pointers = useRef(new Map<number, Point>());
  const pinch = useRef<{ from: ZoomView; a: Point; b: Point } | undefined>(undefined);

  useEffect(() => {
    closeRef.current?.focus();
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && onClose();
    addEventListener('keydown', onKey);
    return () => removeEventListener('keydown', onKey);
  }, []);

  const pts = () => [...pointers.current.values()];
  function down(e: PointerEvent) {
    // Only the picture is dragged: capturing a press on a button would take its click away.
    if (!(e.target instanceof HTMLImageElement)) return;
    (e.currentTarget as HTMLElement).setPointerCapture(e.pointerId);
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const [a, b] = pts();
    if (b) pinch.current = { from: view, a, b };
  }
  function move(e: PointerEvent) {
    const before = pointers.current.get(e.pointerId);
    if (!before) return;
    const now = { x: e.clientX, y: e.clientY };
    pointers.current.set(e.pointerId, now);
    const [a, b] = pts();
    if (b && pinch.current) setView(pinched(pinch.current.from, pinch.current.a, pinch.current.b, a, b));
    else if (!b) setView((v) => panned(v, now.x - before.x, now.y - before.y));
  }
  function up(e: PointerEvent) {
    pointers.current.delete(e.pointerId);
    if (pointers.current.size < 2) pinch.current = undefined;
  }

  return (
    <div class="photo-viewer" role="dialog" aria-modal="true" aria-label={`Photo taken ${formatTime(photo.taken_ms, timeZone)}`}>
      <div class="photo-viewer-bar">
        <button type="button" ref={closeRef} class="primary" onClick={onClose}>Close</button>
        <button type="button" onClick={() => setView((v) => stepped(v, 1.5))} aria-label="Zoom in">＋</button>
        <button type="button" onClick={() => setView((v) => stepped(v, 1 / 1.5))} aria-label="Zoom out">－</button>
      </div>
      <div class="photo-stage" onPointerDown={down} onPointerMove={move} onPointerUp={up} onPointerCancel={up}
        onWheel={(e) => { e.preventDefault(); setView((v) => stepped(v, e.deltaY < 0 ? 1.25 : 0.8)); }}
        onDblClick={() => setView((v) => (v.scale > 1 ? FITTED : stepped(v, 2.5)))}>
        {pic.state === 'here' && <img src={pic.url} alt={photo.caption || 'Photo'} draggable={false} style={{ transform: transformOf(view) }} />}
        {pic.state === 'loading' && <p aria-busy="true">Opening the photo…</p>}
        {pic.state === 'missing' && (
          <div class="photo-missing">
            <p role="status">{pic.message}</p>
            <button type="button" onClick={() => setAttempt(attempt + 1)}>Try again</button>
          </div>
        )}
      </div>
      <div class="photo-viewer-info">
        <p>Taken {formatTime(photo.taken_ms, timeZone)} · {photo.width_px} × {photo.height_px} px{photo.original ? ' · original kept' : ''}</p>
        <label for="photo-caption-edit">Caption</label>
        <div class="photo-caption-row">
          <input id="photo-caption-edit" type="text" maxLength={500} value={caption} onInput={(e) => setCaption((e.target as HTMLInputElement).value)} />
          <button type="button" onClick={async () => setNote(await onCaption(photo, caption))}>Save caption</button>
        </div>
        {note && <p role="status">{note}</p>}
        <button type="button" class="danger wide" onClick={() => onDelete(photo)}>Delete photo</button>
      </div>
    </div>
  );
}
