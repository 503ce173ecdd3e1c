// Entry point: theme, network watch, service worker, then the app.
import { render } from 'preact';
import { App } from './app/App';
import { applyTheme } from './app/theme';
import { watchOnline } from './app/online';
import { startServiceWorker } from './app/updates';
import './styles.css';

applyTheme();
watchOnline();
render(<App />, document.getElementById('app')!);
startServiceWorker();
// Sync loads after the first paint: it is not needed to show the app, and it keeps the first visit small.
void import('./sync/triggers').then((m) => m.startSyncTriggers());
