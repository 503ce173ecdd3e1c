// Loading stored records into a screen: a load state that survives re-renders, re-read when records change.
import { useEffect, useState } from 'preact/hooks';
import type { RecordKind } from '../../../core';
import { onRecordsChanged } from '../../db';

/** A read from web/db: still loading, done with a value, or failed with a plain sentence. */
export type Load<T> = { status: 'loading' } | { status: 'ready'; value: T } | { status: 'failed'; message: string };

/** Runs load whenever deps change and returns its state (loading again meanwhile); a late answer for old deps is dropped. */
export function useLoad<T>(load: () => Promise<T>, deps: unknown[]): Load<T> {
  const [state, setState] = useState<Load<T>>({ status: 'loading' });
  useEffect(() => {
    let current = true;
    setState((s) => (s.status === 'loading' ? s : { status: 'loading' }));
    load().then(
      (value) => current && setState({ status: 'ready', value }),
      (e: unknown) => current && setState({ status: 'failed', message: e instanceof Error ? e.message : String(e) }),
    );
    return () => {
      current = false;
    };
  }, deps);
  return state;
}

/** A number that goes up whenever records of one of `kinds` are saved or deleted (here or in another tab). */
export function useRecordsVersion(...kinds: RecordKind[]): number {
  const [version, setVersion] = useState(0);
  const key = kinds.join(',');
  useEffect(
    () =>
      onRecordsChanged((change) => {
        if (change.kinds.some((k) => kinds.includes(k))) setVersion((v) => v + 1);
      }),
    [key],
  );
  return version;
}
