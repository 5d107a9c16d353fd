import type { TokenPair } from '@crankjournal/shared-types';
import { httpErrorOf, NetworkError } from '../api/errors';
import { OUTBOX_CHANNEL, sendInOrder, type OutboxPersistence, type OutboxState, type SendRequest } from '../api/outbox-core';

export interface WorkerSendDeps {
  fetch: typeof fetch;
  persistence: OutboxPersistence;
  now?: () => Date;
  /** Called after the pass wrote the outbox (default: a message on the outbox channel). */
  changed?: () => void;
}

/** A fresh access token (and who it is for) from the refresh cookie; null when there is no sign-in to refresh. */
async function refreshed(f: typeof fetch): Promise<TokenPair | null> {
  let res: Response;
  try {
    res = await f('/api/auth/refresh', { method: 'POST', credentials: 'same-origin' });
  } catch {
    throw new NetworkError('Cannot reach the Crankjournal server.');
  }
  return res.ok ? ((await res.json()) as TokenPair) : null;
}

/**
 * Sends the outbox from the service worker when no tab is open (a Background Sync): reads the stored outbox, takes an
 * access token through the refresh cookie, and sends the waiting items of that person in order with the same pass as
 * the page (`sendInOrder`), so refused items are kept with the server's reason exactly as the page keeps them.
 * Answers true when nothing is left to retry now (all sent or refused, or no sign-in to send under: then the items
 * wait for the next sign-in), false when the server could not be reached or erred (the browser retries the sync).
 */
export async function sendFromWorker(deps: WorkerSendDeps): Promise<boolean> {
  const f = deps.fetch;
  let state: OutboxState = (await deps.persistence.load()) ?? { pending: [], failed: [] };
  if (state.pending.length === 0) return true;
  let session: TokenPair | null;
  try {
    session = await refreshed(f);
  } catch {
    return false;
  }
  if (!session) return true;
  let token = session.accessToken;
  const user = session.user;

  const send: SendRequest = async (req) => {
    for (let again = true; ; again = false) {
      const headers: Record<string, string> = { authorization: `Bearer ${token}` };
      let body: BodyInit | undefined;
      if (req.blob) {
        headers['content-type'] = req.contentType || req.blob.type || 'application/octet-stream';
        body = req.blob;
      } else if (req.body !== undefined) {
        headers['content-type'] = 'application/json';
        body = JSON.stringify(req.body);
      }
      let res: Response;
      try {
        res = await f(`/api${req.path}`, { method: req.method, headers, body });
      } catch {
        throw new NetworkError('Cannot reach the Crankjournal server.');
      }
      if (res.status === 401 && again) {
        const next = await refreshed(f);
        if (next && next.user.id === user.id) {
          token = next.accessToken;
          continue;
        }
      }
      if (!res.ok) throw await httpErrorOf(res);
      if (res.status === 204) return undefined;
      return (res.headers.get('content-type') ?? '').includes('json') ? res.json() : res.text();
    }
  };

  const done = await sendInOrder({
    state: () => state,
    write: async (next) => {
      state = next;
      await deps.persistence.save(next);
    },
    send,
    now: deps.now ?? (() => new Date()),
    mine: (item) => item.userId === null || item.userId === user.id,
    // Secrets live only in an open tab's memory: with no tab, an item that needs one is shown as not sent.
    secretOf: () => undefined,
    forgetSecret: () => undefined,
    onSent: () => undefined,
  });
  (deps.changed ?? announceChange)();
  return done;
}

function announceChange() {
  if (typeof BroadcastChannel === 'undefined') return;
  const c = new BroadcastChannel(OUTBOX_CHANNEL);
  c.postMessage({ type: 'changed' });
  c.close();
}
