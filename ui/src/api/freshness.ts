/**
 * Which screens show figures kept on this tablet instead of fresh ones. The service worker answers an API read from
 * its cache when the server cannot be reached and marks the answer with `x-cj-cached-at` (the time the server sent
 * it); `http.ts` notes that here per path, and a fresh answer for the same path clears it.
 */
type Listener = () => void;

const cachedAt = new Map<string, string>();
const listeners = new Set<Listener>();
let oldest: string | null = null;

function publish() {
  let next: string | null = null;
  for (const t of cachedAt.values()) if (next === null || t < next) next = t;
  if (next === oldest) return;
  oldest = next;
  listeners.forEach((l) => l());
}

export const freshness = {
  /** A read of `path` was answered: from the tablet's cache (`at`, ISO) or fresh from the server (null). */
  note(path: string, at: string | null) {
    if (at) cachedAt.set(path, at);
    else if (!cachedAt.delete(path)) return;
    publish();
  },
  /** The oldest time among the figures on screen that came from the cache, or null when all are fresh. */
  oldest: () => oldest,
  subscribe(l: Listener) {
    listeners.add(l);
    return () => {
      listeners.delete(l);
    };
  },
  clear() {
    cachedAt.clear();
    publish();
  },
};

/** The `x-cj-cached-at` header as ISO (the HTTP date the server sent), or null for a fresh answer. */
export function cachedAtOf(headers: Headers): string | null {
  const raw = headers.get('x-cj-cached-at');
  if (raw === null) return null;
  const t = raw ? new Date(raw) : null;
  return t && !Number.isNaN(t.getTime()) ? t.toISOString() : new Date(0).toISOString();
}
