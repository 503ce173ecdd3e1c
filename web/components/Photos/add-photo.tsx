// Adding photos: the camera (a file input with capture) or a chosen picture (a second input without it),
// whether to keep the original too, and a caption for the next photo. Each chosen file is prepared in the
// photo worker (resized, hashed); the screen decides where the prepared photo goes.
import { useState } from 'preact/hooks';
import type { PendingPhoto } from './keep';
import { takenTime } from './keep';

interface Props {
  /** Prefix for element ids, unique on the screen. */
  idPrefix: string;
  /** What the photos are of, for the labels, e.g. "this reading". */
  ofWhat: string;
  /** A warning to show before another photo is taken (little room left). */
  warning?: string;
  /** Called with each photo once prepared; resolves when the screen has dealt with it. */
  onPrepared(p: PendingPhoto): Promise<void>;
}

let counter = 0;

/** The two inputs, the keep-original box, the caption for the next photo, and the preparing status. */
export function AddPhoto({ idPrefix, ofWhat, warning, onPrepared }: Props) {
  const [keepOriginal, setKeepOriginal] = useState(false);
  const [caption, setCaption] = useState('');
  const [busy, setBusy] = useState<string>();
  const [problem, setProblem] = useState<string>();

  async function take(input: HTMLInputElement) {
    const files = [...(input.files ?? [])];
    input.value = '';
    if (files.length === 0) return;
    setProblem(undefined);
    // The worker's bridge loads only now, with the first photo (the first visit never carries it).
    const { prepareInWorker } = await import('../../photos/resize-in-worker');
    for (let i = 0; i < files.length; i++) {
      setBusy(files.length > 1 ? `Preparing photo ${i + 1} of ${files.length}…` : 'Preparing the photo…');
      const prepared = await prepareInWorker(files[i], keepOriginal);
      if ('refused' in prepared) setProblem(prepared.refused);
      else {
        await onPrepared({ key: `p${++counter}`, prepared, taken_ms: takenTime(files[i]), caption });
        if (prepared.originalNotKept) setProblem(prepared.originalNotKept);
        setCaption('');
      }
    }
    setBusy(undefined);
  }

  return (
    <div class="photo-add">
      {warning && <p class="callout warn" role="status">{warning}</p>}
      <label for={`${idPrefix}-caption`}>
        Caption for the next photo <span class="hint">optional, e.g. “weed across the control”</span>
      </label>
      <input id={`${idPrefix}-caption`} type="text" maxLength={500} value={caption} onInput={(e) => setCaption((e.target as HTMLInputElement).value)} />
      <div class="photo-buttons">
        <label class="button" for={`${idPrefix}-camera`}>
          Take photo
          <input id={`${idPrefix}-camera`} class="sr-only" type="file" accept="image/*" capture="environment" aria-label={`Take a photo of ${ofWhat}`}
            disabled={!!busy} onChange={(e) => void take(e.target as HTMLInputElement)} />
        </label>
        <label class="button" for={`${idPrefix}-choose`}>
          Choose photos
          <input id={`${idPrefix}-choose`} class="sr-only" type="file" accept="image/*" multiple aria-label={`Choose photos of ${ofWhat}`}
            disabled={!!busy} onChange={(e) => void take(e.target as HTMLInputElement)} />
        </label>
      </div>
      <label class="choice">
        <input type="checkbox" checked={keepOriginal} onChange={(e) => setKeepOriginal((e.target as HTMLInputElement).checked)} />
        Keep the original picture too (uses more room)
      </label>
      {busy && <p role="status" aria-busy="true">{busy}</p>}
      {problem && <p class="callout bad" role="alert">{problem}</p>}
    </div>
  );
}
