// A Preact hook for the screens (kept out of the storage folder, which holds no UI): reads records for a screen and reads them again whenever records of the given kinds change (in this
// tab or another). A late answer for an older request is dropped, never shown over a newer one; the
// previous answer stays shown while a new one is read.
import { useEffect, useState } from 'preact/hooks';
import type { RecordKind } from '../../core';
import { onRecordsChanged } from '../db';
import { plainError } from '../plain-words';

/** The state of a read: loading, the value, or an error in plain words (never a save message or an internal name). */
export type Loaded<T> = { state: 'loading' } | { state: 'ready'; value: T } | { state: 'failed'; message: string };

/** Runs `read` now, when `deps` change, and after any change to records of `kinds`. */
export function useRecords<T>(read: () => Promise<T>, kinds: RecordKind[], deps: unknown[]): Loaded<T> {
  const [loaded, setLoaded] = useState<Loaded<T>>({ state: 'loading' });
  useEffect(() => {
    let latest = 0;
    let live = true;
    const run = () => {
      const ticket = ++latest;
      read().then(
        (value) => live && ticket === latest && setLoaded({ state: 'ready', value }),
        (err: unknown) => live && ticket === latest && setLoaded({ state: 'failed', message: plainError(err, { doing: 'read' }) }),
      );
    };
    // The last answer stays on screen until the new one arrives, so live figures do not flicker.
    run();
    const stop = onRecordsChanged((c) => {
      if (c.kinds.some((k) => kinds.includes(k))) run();
    });
    return () => {
      live = false;
      stop();
    };
  }, deps);
  return loaded;
}
