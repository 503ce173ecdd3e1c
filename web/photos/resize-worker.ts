// The photo worker: decodes, resizes, encodes and hashes one chosen picture off the main thread, so the
// form stays responsive with a 12-megapixel camera file. Loaded only when a photo is first chosen.
/// <reference lib="webworker" />
import { preparePhoto } from './resize';
import type { ResizeReply, ResizeRequest } from './resize-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (e: MessageEvent<ResizeRequest>) => {
  preparePhoto(e.data.file, e.data.keepOriginal).then(
    (photo) => scope.postMessage({ type: 'done', photo } satisfies ResizeReply),
    (err: unknown) => {
      const message = err instanceof RangeError ? err.message : 'The picture could not be resized on this phone. Try another picture.';
      scope.postMessage({ type: 'failed', message } satisfies ResizeReply);
    },
  );
};
