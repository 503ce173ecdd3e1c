// Hash routes (#/sites, #/record/…): they work from the precached shell with no server involved.
import { useEffect, useState } from 'preact/hooks';

/** The current route: the path after '#', split into segments ('#/sites/abc' → ['sites', 'abc']). */
export interface Route {
  path: string;
  segments: string[];
}

function readRoute(): Route {
  const raw = location.hash.replace(/^#/, '') || '/sites';
  const path = raw.startsWith('/') ? raw : `/${raw}`;
  return { path, segments: path.split('/').filter(Boolean).map(decodeURIComponent) };
}

/** The current route, re-rendering on navigation. */
export function useRoute(): Route {
  const [route, setRoute] = useState(readRoute);
  useEffect(() => {
    const onChange = () => setRoute(readRoute());
    addEventListener('hashchange', onChange);
    return () => removeEventListener('hashchange', onChange);
  }, []);
  return route;
}

/** Builds a link target from path segments: href('sites', id) → '#/sites/<id>'. */
export function href(...segments: string[]): string {
  return `#/${segments.map(encodeURIComponent).join('/')}`;
}

/** Goes to a route; `replace` keeps the back button from returning to the current one. */
export function navigate(target: string, replace = false): void {
  if (replace) {
    history.replaceState(null, '', target);
    dispatchEvent(new HashChangeEvent('hashchange'));
  } else {
    location.hash = target.replace(/^#/, '');
  }
}
