// The app frame: top bar, the screen for the current route, the bottom bar and the update notice.
import { useEffect, useRef } from 'preact/hooks';
import { MainNav } from '../components/MainNav';
import { UpdateNotice } from '../components/UpdateNotice';
import { useRoute } from '../router';
import { useStore } from '../store';
import { AREAS } from './areas';
import { online } from './online';
import { screenFor } from './routes';
import { acceptUpdate, updateStatus } from './updates';

const acceptNow = () => void acceptUpdate();
const later = () => updateStatus.set({ kind: 'current' });
const failureSeen = () => updateStatus.set({ kind: 'ready' });

/** The whole app. */
export function App() {
  const route = useRoute();
  const isOnline = useStore(online);
  const update = useStore(updateStatus);
  const mainRef = useRef<HTMLElement>(null);
  const { area, title, Screen, params } = screenFor(route);
  useEffect(() => {
    // Move focus to the new screen's heading so screen readers announce where the user is.
    const heading = mainRef.current?.querySelector<HTMLElement>('#screen-title');
    if (heading && document.activeElement !== heading && route.path !== '/') heading.focus({ preventScroll: true });
    document.title = `${title} · Freshet`;
    scrollTo(0, 0);
  }, [route.path]);
  return (
    <div class="shell">
      <a class="skip-link" href="#main">Skip to content</a>
      <header class="topbar">
        <h1>Freshet</h1>
        <span class="net" role="status" aria-label={isOnline ? 'Network available' : 'No network: records stay on this phone'}>
          {isOnline ? 'Online' : 'Offline'}
        </span>
      </header>
      <main id="main" ref={mainRef} tabIndex={-1}>
        <Screen route={route} params={params} />
      </main>
      <UpdateNotice status={update} onAccept={acceptNow} onLater={later} onFailureSeen={failureSeen} />
      <MainNav items={AREAS} current={area} />
    </div>
  );
}

