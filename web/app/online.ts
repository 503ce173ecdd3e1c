// Whether the browser believes it has a network, as a store for the top bar.
import { createStore } from '../store';

export const online = createStore<boolean>(typeof navigator === 'undefined' ? true : navigator.onLine);

/** Keeps `online` in step with the browser's online/offline events. */
export function watchOnline(): void {
  addEventListener('online', () => online.set(true));
  addEventListener('offline', () => online.set(false));
}
