// The page's side of the photo worker: one worker per picture, ended when it answers.
import type { PreparedPhoto, ResizeReply, ResizeRequest } from './resize-protocol';

/** Prepares `file` in a new worker: resized JPEG with its hash and pixel size, the original when asked. */
export function prepareInWorker(file: Blob, keepOriginal: boolean): Promise<PreparedPhoto> {
  const worker = new Worker(new URL('./resize-worker.ts', import.meta.url), { type: 'module', name: 'photo-resize' });
  return new Promise<PreparedPhoto>((resolve, reject) => {
    worker.onmessage = (e: MessageEvent<ResizeReply>) => {
      worker.terminate();
      if (e.data.type === 'done') resolve(e.data.photo);
      else reject(new RangeError(e.data.message));
    };
    worker.onerror = () => {
      worker.terminate();
      reject(new RangeError('The picture could not be resized on this phone. Try another picture.'));
    };
    worker.postMessage({ file, keepOriginal } satisfies ResizeRequest);
  });
}
