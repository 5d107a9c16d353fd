import { useSyncExternalStore } from 'react';
import { freshness } from '../../api/freshness';

function subscribe(l: () => void) {
  window.addEventListener('online', l);
  window.addEventListener('offline', l);
  return () => {
    window.removeEventListener('online', l);
    window.removeEventListener('offline', l);
  };
}

/** What the browser says about the network (it can say "online" while the server is out of reach). */
export function useOnline(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => navigator.onLine,
    () => true,
  );
}

/** The oldest time among the figures on screen that the tablet answered from its cache, or null when all are fresh. */
export function useFiguresAsOf(): string | null {
  return useSyncExternalStore(freshness.subscribe, freshness.oldest, freshness.oldest);
}
