import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { api, HttpError, NetworkError } from '../../../api/http';

/**
 * Rounds of readings that could not reach the server wait here, in localStorage, so a tablet that
 * loses the network (or is reloaded) keeps them. Every reading carries the clientId it was given when
 * the round was entered, so sending the same round twice stores each reading once on the server.
 */

export const OFFLINE_QUEUE_STORAGE_KEY = 'crankjournal.offline-rounds';
export const OFFLINE_RETRY_INTERVAL_MS = 10_000;

export interface QueuedRound {
  /** Local id of the queued round (not sent). */
  id: string;
  runId: string;
  round: RoundRequest;
  queuedAt: string;
  attempts: number;
  lastTriedAt: string | null;
  /** Why the last attempt did not go through (network, server error). */
  lastError: string | null;
}

/** A round the server refused (4xx): it will not be sent again; the error stays visible until dismissed. */
export interface FailedRound extends QueuedRound {
  status: number;
  error: string;
  droppedAt: string;
  /** The server's IngestResult when some rows were refused (the good rows were stored). */
  result: IngestResult | null;
}

interface Stored {
  pending: QueuedRound[];
  failed: FailedRound[];
}

export interface QueueSnapshot {
  pending: QueuedRound[];
  failed: FailedRound[];
  sending: boolean;
}

export type SendRound = (runId: string, round: RoundRequest) => Promise<IngestResult>;

export const postRound: SendRound = (runId, round) => api<IngestResult>(`/runs/${runId}/rounds`, { body: round });

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

export type SubmitOutcome = { kind: 'sent'; result: IngestResult } | { kind: 'queued'; queued: QueuedRound };

export interface OfflineQueueOptions {
  send?: SendRound;
  storage?: Storage;
  key?: string;
  now?: () => Date;
  /** Called after a queued round reached the server (e.g. to refresh the run's queries). */
  onSent?: (runId: string, result: IngestResult) => void;
}

export class OfflineRoundQueue {
  private readonly send: SendRound;
  private readonly storage: Storage | null;
  private readonly key: string;
  private readonly now: () => Date;
  private state: Stored;
  private snapshot: QueueSnapshot;
  private flushing: Promise<void> | null = null;
  private readonly listeners = new Set<() => void>();
  private readonly sentListeners = new Set<(runId: string, result: IngestResult) => void>();
  private stopAuto: (() => void) | null = null;
  private autoUsers = 0;

  constructor(opts: OfflineQueueOptions = {}) {
    this.send = opts.send ?? postRound;
    this.storage = opts.storage ?? (typeof localStorage !== 'undefined' ? localStorage : null);
    this.key = opts.key ?? OFFLINE_QUEUE_STORAGE_KEY;
    this.now = opts.now ?? (() => new Date());
    if (opts.onSent) this.sentListeners.add(opts.onSent);
    this.state = this.read();
    this.snapshot = { ...this.state, sending: false };
  }

  // ---- state -------------------------------------------------------------------------------------

  private read(): Stored {
    try {
      const raw = this.storage?.getItem(this.key);
      if (!raw) return { pending: [], failed: [] };
      const parsed = JSON.parse(raw) as Partial<Stored>;
      return { pending: Array.isArray(parsed.pending) ? parsed.pending : [], failed: Array.isArray(parsed.failed) ? parsed.failed : [] };
    } catch {
      return { pending: [], failed: [] };
    }
  }

  private write(next: Stored) {
    this.state = next;
    try {
      if (next.pending.length === 0 && next.failed.length === 0) this.storage?.removeItem(this.key);
      else this.storage?.setItem(this.key, JSON.stringify(next));
    } catch {
      /* storage full or unavailable: the queue still lives in memory for this tab */
    }
    this.publish();
  }

  private publish() {
    this.snapshot = { pending: this.state.pending, failed: this.state.failed, sending: this.flushing !== null };
    this.listeners.forEach((l) => l());
  }

  /** Re-reads storage (another tab changed it). */
  reload() {
    this.state = this.read();
    this.publish();
  }

  getSnapshot = (): QueueSnapshot => this.snapshot;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  onSent(listener: (runId: string, result: IngestResult) => void): () => void {
    this.sentListeners.add(listener);
    return () => {
      this.sentListeners.delete(listener);
    };
  }

  pending(runId?: string): QueuedRound[] {
    return runId ? this.state.pending.filter((q) => q.runId === runId) : this.state.pending;
  }

  failed(runId?: string): FailedRound[] {
    return runId ? this.state.failed.filter((q) => q.runId === runId) : this.state.failed;
  }

  /** Removes a refused round's error from view (the person has read it). */
  dismissFailed(id: string) {
    this.write({ ...this.state, failed: this.state.failed.filter((f) => f.id !== id) });
  }

  // ---- sending -----------------------------------------------------------------------------------

  enqueue(runId: string, round: RoundRequest, lastError: string | null = null): QueuedRound {
    const q: QueuedRound = {
      id: newClientId(),
      runId,
      round,
      queuedAt: this.now().toISOString(),
      attempts: lastError ? 1 : 0,
      lastTriedAt: lastError ? this.now().toISOString() : null,
      lastError,
    };
    this.write({ ...this.state, pending: [...this.state.pending, q] });
    return q;
  }

  /**
   * Sends a round now; when the server cannot be reached it is queued instead (and the caller told so).
   * Any other error (refused, server error) is thrown for the screen to show.
   */
  async submit(runId: string, round: RoundRequest): Promise<SubmitOutcome> {
    try {
      const result = await this.send(runId, round);
      return { kind: 'sent', result };
    } catch (e) {
      if (e instanceof NetworkError) return { kind: 'queued', queued: this.enqueue(runId, round, e.message) };
      throw e;
    }
  }

  /** Sends every waiting round, oldest first. Concurrent calls share one pass. */
  flush(): Promise<void> {
    if (this.flushing) return this.flushing;
    if (this.state.pending.length === 0) return Promise.resolve();
    this.flushing = this.flushPass().finally(() => {
      this.flushing = null;
      this.publish();
    });
    this.publish();
    return this.flushing;
  }

  private async flushPass() {
    const ids = this.state.pending.map((q) => q.id);
    for (const id of ids) {
      const item = this.state.pending.find((q) => q.id === id);
      if (!item) continue; // sent or dismissed meanwhile
      const tried = { ...item, attempts: item.attempts + 1, lastTriedAt: this.now().toISOString() };
      try {
        const result = await this.send(item.runId, item.round);
        this.write({ ...this.state, pending: this.state.pending.filter((q) => q.id !== id) });
        this.sentListeners.forEach((l) => l(item.runId, result));
      } catch (e) {
        if (e instanceof NetworkError) {
          // Still unreachable: keep this and the rest for the next try.
          this.replace({ ...tried, lastError: e.message });
          return;
        }
        if (e instanceof HttpError && e.status >= 400 && e.status < 500 && !TRANSIENT_4XX.has(e.status)) {
          const details = e.body?.details;
          const failed: FailedRound = {
            ...tried,
            lastError: e.message,
            status: e.status,
            error: e.message,
            droppedAt: this.now().toISOString(),
            result: isIngestResult(details) ? details : null,
          };
          this.write({ pending: this.state.pending.filter((q) => q.id !== id), failed: [...this.state.failed, failed] });
          // Some rows may have been stored: the run's screens should refresh.
          if (failed.result && failed.result.stored > 0) this.sentListeners.forEach((l) => l(item.runId, failed.result!));
          continue;
        }
        // Server error (5xx) or a transient refusal: keep it, try the others later too.
        this.replace({ ...tried, lastError: e instanceof Error ? e.message : 'Not sent.' });
        return;
      }
    }
  }

  private replace(item: QueuedRound) {
    this.write({ ...this.state, pending: this.state.pending.map((q) => (q.id === item.id ? item : q)) });
  }

  /**
   * Retries when the browser says it is online again, when `socketLike` (the live socket) reconnects,
   * and every `intervalMs`. Reference-counted: each caller gets a function that stops its share.
   */
  startAutoRetry(
    socketLike?: { on(ev: 'connect', fn: () => void): unknown; off(ev: 'connect', fn: () => void): unknown } | null,
    intervalMs = OFFLINE_RETRY_INTERVAL_MS,
  ): () => void {
    this.autoUsers++;
    const retry = () => void this.flush();
    socketLike?.on('connect', retry);
    if (!this.stopAuto) {
      const onStorage = (e: StorageEvent) => e.key === this.key && this.reload();
      const timer = setInterval(retry, intervalMs);
      if (typeof window !== 'undefined') {
        window.addEventListener('online', retry);
        window.addEventListener('storage', onStorage);
      }
      this.stopAuto = () => {
        clearInterval(timer);
        if (typeof window !== 'undefined') {
          window.removeEventListener('online', retry);
          window.removeEventListener('storage', onStorage);
        }
      };
      retry();
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

let shared: OfflineRoundQueue | null = null;
/** The tab's one queue, read from localStorage on first use. */
export function offlineQueue(): OfflineRoundQueue {
  shared ??= new OfflineRoundQueue();
  return shared;
}
