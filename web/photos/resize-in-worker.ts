// The page's side of the photo worker: one worker per picture, ended when it answers.
import type { PreparedPhoto, ResizeReply, ResizeRequest } from './resize-protocol';

/** What the worker gave: the prepared photo, or why the file could not be used (a sentence for the screen). */
export type Prepared = PreparedPhoto | { refused: string };

const FAILED = 'The picture could not be resized on this phone. Try another picture.';

/** Prepares `file` in a new worker: resized JPEG with its hash and pixel size, the original when asked. */
export function prepareInWorker(file: Blob, keepOriginal: boolean): Promise<Prepared> {
  const worker = new Worker(new URL('./resize-worker.ts', import.meta.url), { type: 'module', name: 'photo-resize' });
  return new Promise<Prepared>((resolve) => {
    worker.onmessage = (e: MessageEvent<ResizeReply>) => {
      worker.terminate();
      if (e.data.type === 'done') resolve(e.data.photo);
      else resolve({ refused: e.data.message });
    };
    worker.onerror = () => {
      worker.terminate();
      resolve({ refused: FAILED });
    };
    worker.postMessage({ file, keepOriginal } satisfies ResizeRequest);
  });
}
