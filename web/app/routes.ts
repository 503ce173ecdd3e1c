// Which screen shows for which route: one table of path patterns. Screens with heavy code load on
// first use; a path that matches no pattern (or a damaged link) shows the "no such page" screen.
import type { ComponentType } from 'preact';
import { matchRoute, type Route, type ScreenProps } from '../router';
import { lazyScreen } from '../components/LazyScreen';
import About from '../screens/About';
import NotFound from '../screens/NotFound';
import { areaOf, type AreaId } from './areas';
import { probeNetwork } from './online';

// Reloading the app comes back when the service worker holds it, or when the network answers; otherwise a
// reload would land on the browser's own "no connection" page, so the screen keeps its message instead.
const retry = {
  reloadIsSafe: async () => (typeof navigator !== 'undefined' && !!navigator.serviceWorker?.controller) || (await probeNetwork()),
};

interface RouteEntry {
  /** Path segments; ':name' matches any one segment and passes it as params.name. */
  pattern: string;
  area: AreaId;
  Screen: ComponentType<ScreenProps>;
}

/** What shows for a route: the screen, the area lit in the bottom bar (none for a missing page), the title, the params. */
export interface RouteMatch {
  Screen: ComponentType<ScreenProps>;
  area: AreaId | undefined;
  title: string;
  params: Record<string, string>;
}

const Sites = lazyScreen<ScreenProps>(() => import('../screens/Sites'), retry);
const SiteForm = lazyScreen<ScreenProps>(() => import('../screens/SiteForm'), retry);
const SiteReadings = lazyScreen<ScreenProps>(() => import('../screens/SiteReadings'), retry);
const Record = lazyScreen<ScreenProps>(() => import('../screens/Record'), retry);
const Storm = lazyScreen<ScreenProps>(() => import('../screens/Storm'), retry);
const Data = lazyScreen<ScreenProps>(() => import('../screens/Data'), retry);
const Sync = lazyScreen<ScreenProps>(() => import('../screens/Sync'), retry);
const Ratings = lazyScreen<ScreenProps>(() => import('../screens/Ratings'), retry);
const Gaugings = lazyScreen<ScreenProps>(() => import('../screens/Gaugings'), retry);
const LoggerImport = lazyScreen<ScreenProps>(() => import('../screens/LoggerImport'), retry);

/** Every page, literal patterns before the ones with a parameter in the same place. */
export const ROUTES: readonly RouteEntry[] = [
  { pattern: 'sites', area: 'sites', Screen: Sites },
  { pattern: 'sites/new', area: 'sites', Screen: SiteForm },
  { pattern: 'sites/:siteId', area: 'sites', Screen: SiteReadings },
  { pattern: 'sites/:siteId/edit', area: 'sites', Screen: SiteForm },
  { pattern: 'sites/:siteId/ratings', area: 'sites', Screen: Ratings },
  { pattern: 'sites/:siteId/ratings/new', area: 'sites', Screen: Ratings },
  { pattern: 'sites/:siteId/ratings/fit', area: 'sites', Screen: Ratings },
  { pattern: 'sites/:siteId/ratings/import', area: 'sites', Screen: Ratings },
  { pattern: 'sites/:siteId/ratings/:ratingId', area: 'sites', Screen: Ratings },
  { pattern: 'sites/:siteId/gaugings', area: 'sites', Screen: Gaugings },
  { pattern: 'sites/:siteId/gaugings/new', area: 'sites', Screen: Gaugings },
  { pattern: 'sites/:siteId/gaugings/:gaugingId', area: 'sites', Screen: Gaugings },
  { pattern: 'sites/:siteId/gaugings/:gaugingId/edit', area: 'sites', Screen: Gaugings },
  { pattern: 'record', area: 'record', Screen: Record },
  { pattern: 'record/:siteId', area: 'record', Screen: Record },
  { pattern: 'record/:siteId/:readingId', area: 'record', Screen: Record },
  { pattern: 'storm', area: 'storm', Screen: Storm },
  { pattern: 'storm/:siteId', area: 'storm', Screen: Storm },
  { pattern: 'data', area: 'data', Screen: Data },
  { pattern: 'data/logger', area: 'data', Screen: LoggerImport },
  { pattern: 'data/logger/:siteId', area: 'data', Screen: LoggerImport },
  { pattern: 'sync', area: 'sync', Screen: Sync },
  { pattern: 'about', area: 'about', Screen: About },
];

/** The screen, area, title and params for a route. */
export function screenFor(route: Route): RouteMatch {
  if (!route.malformed) {
    for (const r of ROUTES) {
      const params = matchRoute(r.pattern, route.segments);
      if (params) return { Screen: r.Screen, area: r.area, title: areaOf(r.area).title, params };
    }
  }
  return { Screen: NotFound, area: undefined, title: 'No such page', params: {} };
}
