// Loaded by the service worker (Workbox importScripts). A Background Sync for the outbox wakes the open tabs of the
// app, which send what waits in IndexedDB under the sign-in of the person who recorded it.
self.addEventListener('sync', (event) => {
  if (event.tag !== 'cj-outbox') return;
  event.waitUntil(
    self.clients
      .matchAll({ type: 'window', includeUncontrolled: true })
      .then((clients) => clients.forEach((c) => c.postMessage({ type: 'cj-outbox-flush' }))),
  );
});
