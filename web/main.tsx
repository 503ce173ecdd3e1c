// Entry point: theme, network watch, service worker, then the app.
import { render } from 'preact';
import { App } from './app/App';
import { applyTheme } from './app/theme';
import { online, probeNetwork, watchOnline } from './app/online';
import { startServiceWorker } from './app/updates';
import './styles.css';

applyTheme();
watchOnline();
render(<App />, document.getElementById('app')!);
startServiceWorker();
// Sync loads after the first paint: it is not needed to show the app, and it keeps the first visit small
// (the triggers load the sync client itself only once an office endpoint is set up).
void import('./sync/triggers').then((m) => m.startSyncTriggers({ online, probe: probeNetwork }));
