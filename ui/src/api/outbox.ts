import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { api, NetworkError } from './http';
import { sessionStore } from './session';
import {
  indexedDbPersistence,
  newClientId,
  OUTBOX_CHANNEL,
  sendInOrder,
  withSecret,
  type OutboxItem,
  type OutboxPersistence,
  type OutboxRequest,
  type OutboxSnapshot,
  type OutboxState,
  type RefusedItem,
  type SendRequest,
} from './outbox-core';

export * from './outbox-core';

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

export const sendRequest: SendRequest = (req) =>
  api<unknown>(
    req.path,
    req.blob
      ? { method: req.method, raw: req.blob, headers: { 'content-type': req.contentType || req.blob.type || 'application/octet-stream' } }
      : { method: req.method, body: req.body },
  );

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
    await sendInOrder({
      state: () => this.state,
      write: (next) => this.write(next),
      send: this.send,
      now: this.now,
      mine: (q) => this.mine(q),
      secretOf: (id) => this.secrets.get(id),
      forgetSecret: (id) => this.secrets.delete(id),
      onSent: (item, result) => this.sentListeners.forEach((l) => l(item, result)),
    });
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
      const channel = typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel(OUTBOX_CHANNEL) : null;
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

/**
 * Asks the browser for a Background Sync (where it has one); the service worker then tells an open tab to send, or
 * sends itself when no tab is open (sw/outbox-sync.ts).
 */
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
