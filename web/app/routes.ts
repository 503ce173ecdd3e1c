// Which screen shows for which route. Screens with heavy code load on first use.
import type { ComponentType } from 'preact';
import type { Route } from '../router';
import { lazyScreen } from '../components/LazyScreen';
import About from '../screens/About';

/** Props every screen receives. */
export interface ScreenProps {
  route: Route;
}

interface Entry {
  area: string;
  title: string;
  Screen: ComponentType<ScreenProps>;
}

const Sites = lazyScreen<ScreenProps>(() => import('../screens/Sites'));
const Record = lazyScreen<ScreenProps>(() => import('../screens/Record'));
const Storm = lazyScreen<ScreenProps>(() => import('../screens/Storm'));
const Data = lazyScreen<ScreenProps>(() => import('../screens/Data'));
const Sync = lazyScreen<ScreenProps>(() => import('../screens/Sync'));

/** The screen, its area in the bottom bar and its title for a route. */
export function screenFor(route: Route): Entry {
  switch (route.segments[0]) {
    case 'record':
      return { area: 'record', title: 'Record a reading', Screen: Record };
    case 'storm':
      return { area: 'storm', title: 'Storm runoff', Screen: Storm };
    case 'data':
      return { area: 'data', title: 'Data on this phone', Screen: Data };
    case 'sync':
      return { area: 'sync', title: 'Sync with the office', Screen: Sync };
    case 'about':
      return { area: 'about', title: 'About', Screen: About };
    default:
      return { area: 'sites', title: 'Sites', Screen: Sites };
  }
}
