// Loads a screen's code on first use, so heavy screens (plots, analysis) stay out of the first visit.
// Offline, a screen whose code has not reached the phone yet cannot load (a very first visit that lost
// its signal before the app was ready to work offline): the screen then says so in plain words and offers
// to try again, reloading the app only when that is safe (reloadIsSafe: the app is held on the phone, or
// the network answers), never into the browser's own "no connection" page.
import type { ComponentType } from 'preact';
import { useEffect, useState } from 'preact/hooks';

/** How a failed load is tried again: whether reloading the whole app would come back (the shell decides). */
export interface LazyRetry {
  reloadIsSafe: () => Promise<boolean>;
}

type Phase = 'loading' | 'missing' | 'still-missing' | 'retrying';

/** Wraps a dynamic import of a screen module whose default export is the screen component. */
export function lazyScreen<P extends object>(load: () => Promise<{ default: ComponentType<P> }>, retry?: LazyRetry): ComponentType<P> {
  let loaded: ComponentType<P> | undefined;
  return function LazyScreen(props: P) {
    const [Screen, setScreen] = useState<ComponentType<P> | undefined>(() => loaded);
    const [phase, setPhase] = useState<Phase>('loading');
    const [attempt, setAttempt] = useState(0);
    useEffect(() => {
      if (loaded) return;
      let live = true;
      load().then(
        (m) => {
          loaded = m.default;
          if (live) setScreen(() => m.default);
        },
        async () => {
          if (!live) return;
          // A browser may keep a failed load's answer: after a first failure only a reload fetches again.
          if (attempt > 0 && retry !== undefined && (await retry.reloadIsSafe())) {
            location.reload();
            return;
          }
          if (live) setPhase(attempt === 0 ? 'missing' : 'still-missing');
        },
      );
      return () => {
        live = false;
      };
    }, [attempt]);
    if (Screen) return <Screen {...props} />;
    if (phase === 'loading' || phase === 'retrying') return <p aria-busy="true">Loading…</p>;
    return (
      <div class="callout bad" role="alert" data-testid="screen-not-here">
        <p>
          This part of Freshet is not on this phone yet. It is fetched the first time it is opened with a connection,
          and after that it works without signal. Your saved records are safe.
        </p>
        {phase === 'still-missing' && <p>Still no connection: connect to a network, then try again.</p>}
        <button type="button" onClick={() => (setPhase('retrying'), setAttempt((n) => n + 1))}>Try again</button>
      </div>
    );
  };
}
