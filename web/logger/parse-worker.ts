// The import worker: reads a whole logger file off the main thread (papaparse streaming into core's
// reader) so a 50 MB file never freezes the page. Posts progress, then the result with its arrays
// transferred, or an error in words. Stopping is the page terminating this worker: it writes nothing.
/// <reference lib="webworker" />
import type { LoggerMapping } from '../../core';
import { readLoggerFile } from './read-logger';
import type { ParseReply, ParseRequest } from './parse-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (e: MessageEvent<ParseRequest>) => {
  const { file, mapping } = e.data;
  let lastPost = 0;
  readLoggerFile(file, mapping as LoggerMapping, {
    onProgress: (fraction) => {
      const now = performance.now();
      // At most ~20 progress messages a second: enough for a smooth bar, cheap for the page.
      if (now - lastPost < 50 && fraction < 1) return;
      lastPost = now;
      scope.postMessage({ type: 'progress', fraction } satisfies ParseReply);
    },
  }).then(
    (read) => {
      const s = read.series;
      scope.postMessage({ type: 'done', read } satisfies ParseReply, [s.time_ms.buffer, s.level_m.buffer, s.line.buffer]);
    },
    (err: unknown) => scope.postMessage({ type: 'failed', message: err instanceof Error ? err.message : String(err) } satisfies ParseReply),
  );
};
