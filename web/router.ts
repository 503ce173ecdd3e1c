// Hash routes (#/sites, #/record/…): they work from the precached shell with no server involved.
import { useEffect, useState } from 'preact/hooks';

/** The current route: the path after '#', split into decoded segments ('#/sites/abc' → ['sites', 'abc']). */
export interface Route {
  path: string;
  segments: string[];
  /** True when a segment is not valid percent-encoding (a damaged link): no page matches it. */
  malformed: boolean;
}

/** Props every screen receives: the route and the named parts its pattern matched (e.g. siteId). */
export interface ScreenProps {
  route: Route;
  params: Readonly<Record<string, string>>;
}

/** The route of a location hash ('' and '#' mean the sites list). Never throws on a damaged link. */
export function routeOf(hash: string): Route {
  const raw = hash.replace(/^#/, '') || '/sites';
  const path = raw.startsWith('/') ? raw : `/${raw}`;
  let malformed = false;
  const segments = path.split('/').filter(Boolean).map((s) => {
    try {
      return decodeURIComponent(s);
    } catch {
      malformed = true;
      return s;
    }
  });
  return { path, segments, malformed };
}

/** The current route, re-rendering on navigation. */
export function useRoute(): Route {
  const [route, setRoute] = useState(() => routeOf(location.hash));
  useEffect(() => {
    const onChange = () => setRoute(routeOf(location.hash));
    addEventListener('hashchange', onChange);
    return () => removeEventListener('hashchange', onChange);
  }, []);
  return route;
}

/**
 * The named parts of `segments` when they fit `pattern` ('sites/:siteId/edit'), else undefined: literal
 * parts must be equal, ':name' parts take any one segment.
 */
export function matchRoute(pattern: string, segments: readonly string[]): Record<string, string> | undefined {
  const parts = pattern.split('/').filter(Boolean);
  if (parts.length !== segments.length) return undefined;
  const params: Record<string, string> = {};
  for (let i = 0; i < parts.length; i++) {
    if (parts[i].startsWith(':')) params[parts[i].slice(1)] = segments[i];
    else if (parts[i] !== segments[i]) return undefined;
  }
  return params;
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
