import { createStore, del, get, set, type UseStore } from 'idb-keyval';
import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { api, HttpError, NetworkError } from './http';
import { sessionStore } from './session';

/**
 * The tablet's outbox: what a person recorded while the server could not be reached (rounds of readings, amendments
 * of readings, checklist entries and their photos, alarm acknowledgements) waits here, in IndexedDB (photos do not
 * fit in localStorage), and is sent in the order it was made when the server answers again: on `online`, when the
 * live socket reconnects, every 10 s and on "Send now", from whichever screen is open. Rounds keep the clientId of
 * each reading, amendments their own clientId, and checklist entries and photos are puts of one item, so sending one
 * again stores it once. What the server refuses (4xx) is kept with the server's reason until the person dismisses
 * it; it is never dropped silently. An item is sent only under the sign-in of the person who made it.
 */

export const OUTBOX_RETRY_INTERVAL_MS = 10_000;
/** The localStorage key of the earlier queue of rounds; read once and moved into IndexedDB. */
export const LEGACY_STORAGE_KEY = 'crankjournal.offline-rounds';

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

export const sendRequest: SendRequest = (req) =>
  api<unknown>(
    req.path,
    req.blob
      ? { method: req.method, raw: req.blob, headers: { 'content-type': req.contentType || req.blob.type || 'application/octet-stream' } }
      : { method: req.method, body: req.body },
  );

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

const clock = (iso: string) => new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });

/** The outbox request of a round of readings. */
export function roundRequest(runId: string, round: RoundRequest): OutboxRequest {
  return { kind: 'round', label: `Round taken ${clock(round.takenAt)}`, runId, path: `/runs/${runId}/rounds`, method: 'POST', body: round };
}

export type SubmitOutcome<T = IngestResult> = { kind: 'sent'; result: T } | { kind: 'queued'; queued: OutboxItem };

export interface OutboxOptions {
  send?: SendRequest;
  persistence?: OutboxPersistence;
  now?: () => Date;
  /** The signed-in person (default: the session). */
  currentUser?: () => { id: string; displayName: string } | null;
  /** Called after a queued item reached the server (e.g. to refresh the run's queries). */
  onSent?: (item: OutboxItem, result: unknown) => void;
}

export class Outbox {
  private readonly send: SendRequest;
  private readonly persistence: OutboxPersistence;
  private readonly now: () => Date;
  private readonly currentUser: () => { id: string; displayName: string } | null;
  private state: OutboxState = { pending: [], failed: [] };
  private snapshot: OutboxSnapshot = { pending: [], failed: [], sending: false, loaded: false };
  private loaded = false;
  private saving: Promise<void> = Promise.resolve();
  private flushing: Promise<void> | null = null;
  private readonly listeners = new Set<() => void>();
  private readonly sentListeners = new Set<(item: OutboxItem, result: unknown) => void>();
  private stopAuto: (() => void) | null = null;
  private autoUsers = 0;
  /** Secrets of waiting items (see OutboxRequest.secretField), by item id: memory only. */
  private readonly secrets = new Map<string, string>();
  /** Resolves once the stored outbox has been read. */
  readonly ready: Promise<void>;

  constructor(opts: OutboxOptions = {}) {
    this.send = opts.send ?? sendRequest;
    this.persistence = opts.persistence ?? indexedDbPersistence;
    this.now = opts.now ?? (() => new Date());
    this.currentUser = opts.currentUser ?? (() => sessionStore.get()?.user ?? null);
    if (opts.onSent) this.sentListeners.add(opts.onSent);
    this.ready = this.load();
  }

  // ---- state -------------------------------------------------------------------------------------

  private async load() {
    let stored: OutboxState | undefined;
    try {
      stored = await this.persistence.load();
    } catch {
      stored = undefined; // IndexedDB unavailable (private mode): the outbox lives in memory for this tab
    }
    const legacy = readLegacyRounds();
    // Anything queued before the stored state was read goes after it.
    this.state = {
      pending: [...(stored?.pending ?? []), ...legacy.pending, ...this.state.pending],
      failed: [...(stored?.failed ?? []), ...legacy.failed, ...this.state.failed],
    };
    this.loaded = true;
    if (legacy.pending.length || legacy.failed.length || this.state.pending.length !== (stored?.pending.length ?? 0)) {
      await this.persist();
      clearLegacyRounds();
    }
    this.publish();
  }

  private persist(): Promise<void> {
    const next = this.state;
    // Writes go one after another, so the last state is the one kept.
    this.saving = this.saving
      .then(() => this.persistence.save(next))
      .catch(() => {
        /* storage full or unavailable: the outbox still lives in memory for this tab */
      });
    return this.saving;
  }

  private write(next: OutboxState): Promise<void> {
    this.state = next;
    this.publish();
    return this.loaded ? this.persist() : Promise.resolve();
  }

  private publish() {
    this.snapshot = { pending: this.state.pending, failed: this.state.failed, sending: this.flushing !== null, loaded: this.loaded };
    this.listeners.forEach((l) => l());
  }

  /** Reads the stored outbox again (another tab changed it). */
  async reload() {
    try {
      const stored = await this.persistence.load();
      this.state = { pending: stored?.pending ?? [], failed: stored?.failed ?? [] };
    } catch {
      /* keep what we have */
    }
    this.publish();
  }

  getSnapshot = (): OutboxSnapshot => this.snapshot;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  onSent(listener: (item: OutboxItem, result: unknown) => void): () => void {
    this.sentListeners.add(listener);
    return () => {
      this.sentListeners.delete(listener);
    };
  }

  pending(runId?: string): OutboxItem[] {
    return runId ? this.state.pending.filter((q) => q.runId === runId) : this.state.pending;
  }

  failed(runId?: string): RefusedItem[] {
    return runId ? this.state.failed.filter((q) => q.runId === runId) : this.state.failed;
  }

  /** Removes a refused item from view (the person has read it). */
  dismissFailed(id: string): Promise<void> {
    return this.write({ ...this.state, failed: this.state.failed.filter((f) => f.id !== id) });
  }

  // ---- sending -----------------------------------------------------------------------------------

  async enqueue(req: OutboxRequest, lastError: string | null = null, secret?: string): Promise<OutboxItem> {
    const who = this.currentUser();
    const at = this.now().toISOString();
    const { whenQueued, ...rest } = req;
    const q: OutboxItem = {
      ...rest,
      body: whenQueued ? { ...(req.body as Record<string, unknown>), ...whenQueued } : req.body,
      id: newClientId(),
      userId: who?.id ?? null,
      userName: who?.displayName ?? null,
      queuedAt: at,
      attempts: lastError ? 1 : 0,
      lastTriedAt: lastError ? at : null,
      lastError,
    };
    if (req.secretField && secret !== undefined) this.secrets.set(q.id, secret);
    await this.write({ ...this.state, pending: [...this.state.pending, q] });
    registerBackgroundSync();
    return q;
  }

  /**
   * Sends now; when the server cannot be reached the request is queued instead (and the caller told so). While older
   * items wait, a new one queues behind them, so the order holds. Any other error (refused, server error) is thrown
   * for the screen to show.
   */
  async submitRequest<T = unknown>(req: OutboxRequest, secret?: string): Promise<SubmitOutcome<T>> {
    if (this.state.pending.some((p) => this.mine(p))) {
      const queued = await this.enqueue(req, null, secret);
      void this.flush();
      return { kind: 'queued', queued };
    }
    try {
      const { whenQueued: _w, ...now } = req;
      const result = (await this.send(withSecret(now, secret))) as T;
      return { kind: 'sent', result };
    } catch (e) {
      if (e instanceof NetworkError) return { kind: 'queued', queued: await this.enqueue(req, e.message, secret) };
      throw e;
    }
  }

  /** A round of readings: sent now, or queued when the server cannot be reached. */
  submit(runId: string, round: RoundRequest): Promise<SubmitOutcome<IngestResult>> {
    return this.submitRequest<IngestResult>(roundRequest(runId, round));
  }

  private mine(item: OutboxItem): boolean {
    const who = this.currentUser();
    return !!who && (item.userId === null || item.userId === who.id);
  }

  /** Sends every waiting item of the signed-in person, oldest first. Concurrent calls share one pass. */
  flush(): Promise<void> {
    if (this.flushing) return this.flushing;
    this.flushing = this.ready
      .then(() => this.flushPass())
      .finally(() => {
        this.flushing = null;
        this.publish();
      });
    this.publish();
    return this.flushing;
  }

  private async flushPass() {
    const ids = this.state.pending.filter((q) => this.mine(q)).map((q) => q.id);
    for (const id of ids) {
      const item = this.state.pending.find((q) => q.id === id);
      if (!item) continue; // sent or dismissed meanwhile
      const tried = { ...item, attempts: item.attempts + 1, lastTriedAt: this.now().toISOString() };
      const secret = this.secrets.get(id);
      if (item.secretField && secret === undefined) {
        // The tab was reloaded: the password was never stored, so this cannot be sent. The person does it again.
        const failed: RefusedItem = {
          ...tried,
          attempts: item.attempts,
          status: 0,
          error: 'Not sent: the tablet was reloaded before the server answered, and a password is never kept on the tablet. Do it again.',
          droppedAt: this.now().toISOString(),
          result: null,
        };
        await this.write({ pending: this.state.pending.filter((q) => q.id !== id), failed: [...this.state.failed, failed] });
        continue;
      }
      try {
        const result = await this.send(withSecret(item, secret));
        this.secrets.delete(id);
        await this.write({ ...this.state, pending: this.state.pending.filter((q) => q.id !== id) });
        this.sentListeners.forEach((l) => l(item, result));
      } catch (e) {
        if (e instanceof NetworkError) {
          // Still unreachable: keep this and the rest for the next try.
          await this.replace({ ...tried, lastError: e.message });
          return;
        }
        if (e instanceof HttpError && e.status >= 400 && e.status < 500 && !TRANSIENT_4XX.has(e.status)) {
          const details = e.body?.details;
          const failed: RefusedItem = {
            ...tried,
            lastError: e.message,
            status: e.status,
            error: e.message,
            droppedAt: this.now().toISOString(),
            result: isIngestResult(details) ? details : null,
          };
          this.secrets.delete(id);
          await this.write({ pending: this.state.pending.filter((q) => q.id !== id), failed: [...this.state.failed, failed] });
          // Some readings may have been stored: the run's screens should refresh.
          this.sentListeners.forEach((l) => l(item, failed.result));
          continue;
        }
        // Server error (5xx) or a transient refusal: keep it, try the others later too.
        await this.replace({ ...tried, lastError: e instanceof Error ? e.message : 'Not sent.' });
        return;
      }
    }
  }

  private replace(item: OutboxItem) {
    return this.write({ ...this.state, pending: this.state.pending.map((q) => (q.id === item.id ? item : q)) });
  }

  /**
   * Retries when the browser says it is online again, when `socketLike` (the live socket) reconnects, when the
   * service worker passes on a Background Sync, and every `intervalMs`. Reference-counted: each caller gets a
   * function that stops its share.
   */
  startAutoRetry(
    socketLike?: { on(ev: 'connect', fn: () => void): unknown; off(ev: 'connect', fn: () => void): unknown } | null,
    intervalMs = OUTBOX_RETRY_INTERVAL_MS,
  ): () => void {
    this.autoUsers++;
    const retry = () => {
      if (this.state.pending.length > 0) void this.flush();
    };
    socketLike?.on('connect', retry);
    if (!this.stopAuto) {
      const timer = setInterval(retry, intervalMs);
      const channel = typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel('crankjournal-outbox') : null;
      const onMessage = (e: MessageEvent) => {
        if ((e.data as { type?: string } | null)?.type === 'cj-outbox-flush') retry();
      };
      if (channel) channel.onmessage = () => void this.reload();
      const sw = typeof navigator !== 'undefined' ? navigator.serviceWorker : undefined;
      if (typeof window !== 'undefined') window.addEventListener('online', retry);
      sw?.addEventListener('message', onMessage);
      this.stopAuto = () => {
        clearInterval(timer);
        channel?.close();
        if (typeof window !== 'undefined') window.removeEventListener('online', retry);
        sw?.removeEventListener('message', onMessage);
      };
      void this.ready.then(retry);
    }
    let stopped = false;
    return () => {
      if (stopped) return;
      stopped = true;
      socketLike?.off('connect', retry);
      this.autoUsers--;
      if (this.autoUsers === 0 && this.stopAuto) {
        this.stopAuto();
        this.stopAuto = null;
      }
    };
  }
}

/** The request with its secret put back into the body (see OutboxRequest.secretField). */
function withSecret<R extends OutboxRequest>(req: R, secret: string | undefined): R {
  if (!req.secretField || secret === undefined) return req;
  return { ...req, body: { ...(req.body as Record<string, unknown>), [req.secretField]: secret } };
}

/** Asks the browser for a Background Sync (where it has one); the service worker then tells an open tab to send. */
function registerBackgroundSync() {
  const sw = typeof navigator !== 'undefined' ? navigator.serviceWorker : undefined;
  if (!sw?.controller) return;
  void sw.ready
    .then((r) => (r as ServiceWorkerRegistration & { sync?: { register(tag: string): Promise<void> } }).sync?.register('cj-outbox'))
    .catch(() => undefined);
}

interface LegacyRound {
  id: string;
  runId: string;
  round: RoundRequest;
  queuedAt: string;
  attempts: number;
  lastTriedAt: string | null;
  lastError: string | null;
}

/** Rounds left in localStorage by the earlier queue, as outbox items. */
function readLegacyRounds(): OutboxState {
  try {
    const raw = typeof localStorage !== 'undefined' ? localStorage.getItem(LEGACY_STORAGE_KEY) : null;
    if (!raw) return { pending: [], failed: [] };
    const parsed = JSON.parse(raw) as { pending?: LegacyRound[] };
    const pending = (parsed.pending ?? []).map((r): OutboxItem => ({
      ...roundRequest(r.runId, r.round),
      id: r.id,
      userId: null,
      userName: null,
      queuedAt: r.queuedAt,
      attempts: r.attempts,
      lastTriedAt: r.lastTriedAt,
      lastError: r.lastError,
    }));
    return { pending, failed: [] };
  } catch {
    return { pending: [], failed: [] };
  }
}

function clearLegacyRounds() {
  try {
    localStorage.removeItem(LEGACY_STORAGE_KEY);
  } catch {
    /* nothing to clear */
  }
}

let shared: Outbox | null = null;
/** The tab's one outbox, read from IndexedDB on first use. */
export function outbox(): Outbox {
  shared ??= new Outbox();
  return shared;
}
