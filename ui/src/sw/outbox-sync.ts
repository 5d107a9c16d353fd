import { indexedDbPersistence } from '../api/outbox-core';
import { sendFromWorker } from './send-from-worker';

/**
 * Loaded by the service worker (Workbox importScripts; built by `outboxWorker` in vite.config.ts). A Background Sync
 * for the outbox asks the open tabs to send (under the sign-in and with the passwords they hold); with no tab open,
 * the worker sends it itself (send-from-worker.ts). A failed attempt rejects, so the browser tries the sync again.
 */
interface SyncEvent extends Event {
  tag: string;
  waitUntil(p: Promise<unknown>): void;
}
interface WorkerScope {
  addEventListener(type: 'sync', fn: (e: SyncEvent) => void): void;
  clients: { matchAll(o: { type: 'window'; includeUncontrolled: boolean }): Promise<{ postMessage(m: unknown): void }[]> };
}
const scope = self as unknown as WorkerScope;

scope.addEventListener('sync', (event) => {
  if (event.tag !== 'cj-outbox') return;
  event.waitUntil(
    (async () => {
      const tabs = await scope.clients.matchAll({ type: 'window', includeUncontrolled: true });
      if (tabs.length) {
        tabs.forEach((c) => c.postMessage({ type: 'cj-outbox-flush' }));
        return;
      }
      if (!(await sendFromWorker({ fetch: (i, init) => fetch(i, init), persistence: indexedDbPersistence }))) {
        throw new Error('The outbox is still waiting for the server.');
      }
    })(),
  );
});
