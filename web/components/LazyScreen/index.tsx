// Loads a screen's code on first use, so heavy screens (plots, analysis) stay out of the first visit.
import type { ComponentType } from 'preact';
import { useEffect, useState } from 'preact/hooks';

/** Wraps a dynamic import of a screen module whose default export is the screen component. */
export function lazyScreen<P extends object>(load: () => Promise<{ default: ComponentType<P> }>): ComponentType<P> {
  let loaded: ComponentType<P> | undefined;
  return function LazyScreen(props: P) {
    const [Screen, setScreen] = useState<ComponentType<P> | undefined>(() => loaded);
    const [error, setError] = useState<string>();
    useEffect(() => {
      if (loaded) return;
      let live = true;
      load().then(
        (m) => {
          loaded = m.default;
          if (live) setScreen(() => m.default);
        },
        (err: unknown) => live && setError(String(err)),
      );
      return () => {
        live = false;
      };
    }, []);
    if (error) return <p class="callout bad" role="alert">This screen could not be loaded: {error}</p>;
    if (!Screen) return <p aria-busy="true">Loading…</p>;
    return <Screen {...props} />;
  };
}
