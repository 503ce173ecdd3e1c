// Runs the logger file reader in a Web Worker: a promise for the result, progress as it reads, and a
// cancel that terminates the worker (it only reads; nothing is written until the user applies).
import type { LoggerMapping } from '../../core';
import type { LoggerFileRead } from './read-logger';
import type { ParseReply, ParseRequest } from './parse-protocol';

/** A read in progress: its result, and cancel() to stop it (the promise then rejects with an AbortError). */
export interface WorkerRead {
  result: Promise<LoggerFileRead>;
  cancel(): void;
}

/** Reads `file` under `mapping` in a new worker; onProgress gets the fraction read (0–1). */
export function readInWorker(file: Blob, mapping: LoggerMapping, onProgress: (fraction: number) => void): WorkerRead {
  const worker = new Worker(new URL('./parse-worker.ts', import.meta.url), { type: 'module', name: 'logger-file' });
  let settle: { reject(e: unknown): void } | undefined;
  const result = new Promise<LoggerFileRead>((resolve, reject) => {
    settle = { reject };
    worker.onmessage = (e: MessageEvent<ParseReply>) => {
      const m = e.data;
      if (m.type === 'progress') onProgress(m.fraction);
      else {
        worker.terminate();
        if (m.type === 'done') resolve(m.read);
        else reject(new RangeError(m.message));
      }
    };
    worker.onerror = (e) => {
      worker.terminate();
      reject(new Error(`The file reader stopped: ${e.message || 'unknown error'}`));
    };
  });
  worker.postMessage({ file, mapping: JSON.parse(JSON.stringify(mapping)) as LoggerMapping } satisfies ParseRequest);
  return {
    result,
    cancel() {
      worker.terminate();
      settle?.reject(new DOMException('Stopped: nothing was read or written.', 'AbortError'));
    },
  };
}
