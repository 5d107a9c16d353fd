import { createStore, del, get, set, type UseStore } from 'idb-keyval';
import type { IngestResult } from '@crankjournal/shared-types';
import { HttpError, NetworkError } from './errors';

/**
 * The outbox's shapes, where it is kept and the one sending pass, shared by the page (outbox.ts) and the service
 * worker (sw/outbox-sync.ts, which sends when no tab is open). Nothing here reads the page's session or window.
 */

/** The BroadcastChannel on which a change to the stored outbox is announced (open tabs read it again). */
export const OUTBOX_CHANNEL = 'crankjournal-outbox';

export type OutboxKind = 'round' | 'checklist-entry' | 'checklist-photo' | 'checklist-sign' | 'alarm-ack' | 'reading-amendment';

/** One request to make when the server answers. */
export interface OutboxRequest {
  kind: OutboxKind;
  /** What a person reads in the queue ("Round taken 10:15:00", "Checklist item: Oil cups filled"). */
  label: string;
  runId: string | null;
  path: string;
  method: 'POST' | 'PUT';
  /** JSON body. */
  body?: unknown;
  /** Raw body (a photo) with its type. */
  blob?: Blob;
  contentType?: string;
  /** What the item changes, for the screens that mark it "waiting" (checklist and item). */
  ref?: { checklistId?: string; itemKey?: string; alarmId?: string; readingId?: string };
  /** Fields added to the JSON body when the request waits in the outbox (e.g. the time it was signed on the tablet). */
  whenQueued?: Record<string, unknown>;
  /**
   * A body field that holds a secret (a signing password): kept in this tab's memory only, never in IndexedDB. If the
   * tab is reloaded before the item is sent, the item is shown as not sent, to be done again.
   */
  secretField?: string;
}

export interface OutboxItem extends OutboxRequest {
  /** Local id (not sent). */
  id: string;
  /** Who made it: it is sent only under their sign-in. */
  userId: string | null;
  userName: string | null;
  queuedAt: string;
  attempts: number;
  lastTriedAt: string | null;
  /** Why the last attempt did not go through (network, server error). */
  lastError: string | null;
}

/** An item the server refused: not sent again; shown with the server's reason until dismissed. */
export interface RefusedItem extends OutboxItem {
  status: number;
  error: string;
  droppedAt: string;
  /** The server's IngestResult when some readings of a round were refused (the good ones were stored). */
  result: IngestResult | null;
}

export interface OutboxState {
  pending: OutboxItem[];
  failed: RefusedItem[];
}

export interface OutboxSnapshot extends OutboxState {
  sending: boolean;
  /** False until the stored outbox has been read. */
  loaded: boolean;
}

export type SendRequest = (req: OutboxRequest) => Promise<unknown>;

/** Where the outbox is kept between reloads. */
export interface OutboxPersistence {
  load(): Promise<OutboxState | undefined>;
  save(state: OutboxState): Promise<void>;
}

let idbStore: UseStore | null = null;
/** The outbox in IndexedDB (database `crankjournal`, store `outbox`), one record. */
export const indexedDbPersistence: OutboxPersistence = {
  async load() {
    idbStore ??= createStore('crankjournal', 'outbox');
    return get<OutboxState>('state', idbStore);
  },
  async save(state) {
    idbStore ??= createStore('crankjournal', 'outbox');
    if (state.pending.length === 0 && state.failed.length === 0) await del('state', idbStore);
    else await set('state', state, idbStore);
  },
};

/** A v4 UUID. crypto.randomUUID exists only in secure contexts (https, localhost); a tablet on plain http still needs ids. */
export function newClientId(): string {
  const c = globalThis.crypto;
  if (c && typeof c.randomUUID === 'function') return c.randomUUID();
  const b = new Uint8Array(16);
  if (c && typeof c.getRandomValues === 'function') c.getRandomValues(b);
  else for (let i = 0; i < 16; i++) b[i] = Math.floor(Math.random() * 256);
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/** Statuses that mean "try again later" even though they are 4xx: the sign-in ended, a timeout, too many requests. */
const TRANSIENT_4XX = new Set([401, 408, 429]);

function isIngestResult(x: unknown): x is IngestResult {
  return !!x && typeof x === 'object' && 'stored' in x && 'rejected' in x;
}

/** The request with its secret put back into the body (see OutboxRequest.secretField). */
export function withSecret<R extends OutboxRequest>(req: R, secret: string | undefined): R {
  if (!req.secretField || secret === undefined) return req;
  return { ...req, body: { ...(req.body as Record<string, unknown>), [req.secretField]: secret } };
}

/** What one sending pass works on: the page's outbox, or the service worker's copy read from IndexedDB. */
export interface SendPass {
  /** The outbox as it is now (read before each item: one sent or dismissed meanwhile is skipped). */
  state(): OutboxState;
  write(next: OutboxState): Promise<void>;
  send: SendRequest;
  now(): Date;
  /** Whether the item may be sent under the present sign-in (only its maker's). */
  mine(item: OutboxItem): boolean;
  /** The item's secret (a signing password), kept in the open tab's memory only. */
  secretOf(id: string): string | undefined;
  forgetSecret(id: string): void;
  onSent(item: OutboxItem, result: unknown): void;
}

/**
 * Sends every waiting item of the signed-in person, oldest first. A refusal (4xx other than 401, 408, 429) moves the
 * item aside with the server's reason and the pass goes on; the network or a server error stops the pass, keeping
 * that item and the rest. Answers true when nothing of this person's was left for later.
 */
export async function sendInOrder(p: SendPass): Promise<boolean> {
  const ids = p
    .state()
    .pending.filter((q) => p.mine(q))
    .map((q) => q.id);
  for (const id of ids) {
    const item = p.state().pending.find((q) => q.id === id);
    if (!item) continue; // sent or dismissed meanwhile
    const tried = { ...item, attempts: item.attempts + 1, lastTriedAt: p.now().toISOString() };
    const secret = p.secretOf(id);
    if (item.secretField && secret === undefined) {
      // The tab was reloaded or closed: the password was never stored, so this cannot be sent. The person does it again.
      const failed: RefusedItem = {
        ...tried,
        attempts: item.attempts,
        status: 0,
        error: 'Not sent: the tablet was reloaded before the server answered, and a password is never kept on the tablet. Do it again.',
        droppedAt: p.now().toISOString(),
        result: null,
      };
      const s = p.state();
      await p.write({ pending: s.pending.filter((q) => q.id !== id), failed: [...s.failed, failed] });
      continue;
    }
    try {
      const result = await p.send(withSecret(item, secret));
      p.forgetSecret(id);
      const s = p.state();
      await p.write({ ...s, pending: s.pending.filter((q) => q.id !== id) });
      p.onSent(item, result);
    } catch (e) {
      if (e instanceof NetworkError) {
        // Still unreachable: keep this and the rest for the next try.
        await replace(p, { ...tried, lastError: e.message });
        return false;
      }
      if (e instanceof HttpError && e.status >= 400 && e.status < 500 && !TRANSIENT_4XX.has(e.status)) {
        const details = e.body?.details;
        const failed: RefusedItem = {
          ...tried,
          lastError: e.message,
          status: e.status,
          error: e.message,
          droppedAt: p.now().toISOString(),
          result: isIngestResult(details) ? details : null,
        };
        p.forgetSecret(id);
        const s = p.state();
        await p.write({ pending: s.pending.filter((q) => q.id !== id), failed: [...s.failed, failed] });
        // Some readings may have been stored: the run's screens should refresh.
        p.onSent(item, failed.result);
        continue;
      }
      // Server error (5xx) or a transient refusal: keep it, try the others later too.
      await replace(p, { ...tried, lastError: e instanceof Error ? e.message : 'Not sent.' });
      return false;
    }
  }
  return true;
}

function replace(p: SendPass, item: OutboxItem) {
  const s = p.state();
  return p.write({ ...s, pending: s.pending.map((q) => (q.id === item.id ? item : q)) });
}
