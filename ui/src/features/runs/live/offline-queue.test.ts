import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { json, stubFetch } from '../../../test-utils/http';
import { OFFLINE_QUEUE_STORAGE_KEY, OfflineRoundQueue, newClientId } from './offline-queue';

const RUN = 'run-1';

function round(values: number[] = [120, 74.5]): RoundRequest {
  const takenAt = '2025-06-14T10:15:00.000Z';
  return {
    takenAt,
    readings: values.map((value, i) => ({ clientId: newClientId(), pointId: `p${i}`, value, takenAt })),
  };
}

const ok = (stored: number): IngestResult => ({ stored, duplicates: 0, rejected: [], rejectedCount: 0, alarmsRaised: 0 });

/** fetch that fails the way a browser does when the server is unreachable. */
const offline = () => Promise.reject(new TypeError('Failed to fetch'));

const ROUNDS = `POST /runs/${RUN}/rounds`;
let net: ReturnType<typeof stubFetch>;

beforeEach(() => {
  localStorage.clear();
  net = stubFetch();
});
afterEach(() => {
  vi.restoreAllMocks();
  vi.useRealTimers();
});

function roundPosts() {
  return net.calls.filter((c) => c.url.endsWith(`/api/runs/${RUN}/rounds`));
}

describe('offline round queue', () => {
  it('queues a round when the server cannot be reached, and stores it in localStorage', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    const r = round();
    const outcome = await q.submit(RUN, r);
    expect(outcome.kind).toBe('queued');
    expect(q.pending(RUN)).toHaveLength(1);
    const stored = JSON.parse(localStorage.getItem(OFFLINE_QUEUE_STORAGE_KEY)!);
    expect(stored.pending[0].round).toEqual(r);
    expect(stored.pending[0].runId).toBe(RUN);
  });

  it('sends straight away when the server answers, queueing nothing', async () => {
    net.on(ROUNDS, () => json(ok(2), 201));
    const q = new OfflineRoundQueue();
    const outcome = await q.submit(RUN, round());
    expect(outcome).toEqual({ kind: 'sent', result: ok(2) });
    expect(q.pending()).toHaveLength(0);
    expect(localStorage.getItem(OFFLINE_QUEUE_STORAGE_KEY)).toBeNull();
  });

  it('survives a reload: a fresh module instance reads the waiting round back', async () => {
    net.on(ROUNDS, offline);
    const first = new OfflineRoundQueue();
    const r = round([131]);
    await first.submit(RUN, r);

    vi.resetModules();
    const reloaded = await import('./offline-queue');
    const q = reloaded.offlineQueue();
    expect(q).not.toBe(first);
    expect(q.pending(RUN).map((p) => p.round)).toEqual([r]);
  });

  it('sends a waiting round once when the server is back, with the same clientIds, then removes it', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    const r = round([120, 74.5, 96]);
    await q.submit(RUN, r);

    net.clearCalls();
    net.on(ROUNDS, () => json(ok(3), 201));
    const sent = vi.fn();
    q.onSent(sent);
    // Two triggers at once (socket reconnect and `online`) share one pass.
    await Promise.all([q.flush(), q.flush()]);
    await q.flush(); // nothing left: no further request

    const posts = roundPosts();
    expect(posts).toHaveLength(1);
    const body = posts[0].body as RoundRequest;
    expect(body.readings.map((x) => x.clientId)).toEqual(r.readings.map((x) => x.clientId));
    expect(q.pending()).toHaveLength(0);
    expect(localStorage.getItem(OFFLINE_QUEUE_STORAGE_KEY)).toBeNull();
    expect(sent).toHaveBeenCalledWith(RUN, ok(3));
  });

  it('keeps the round when the server answers with a 5xx', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    await q.submit(RUN, round());

    net.clearCalls();
    net.on(ROUNDS, () => json({ statusCode: 503, error: 'Service Unavailable', message: 'Database is down.' }, 503));
    await q.flush();
    expect(roundPosts()).toHaveLength(1);
    expect(q.pending(RUN)).toHaveLength(1);
    expect(q.pending(RUN)[0].attempts).toBe(2);
    expect(q.pending(RUN)[0].lastError).toBe('Database is down.');
    expect(q.failed()).toHaveLength(0);
    expect(JSON.parse(localStorage.getItem(OFFLINE_QUEUE_STORAGE_KEY)!).pending).toHaveLength(1);
  });

  it('drops the round on a 4xx and keeps the error visible until dismissed', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    await q.submit(RUN, round());

    net.clearCalls();
    net.on(ROUNDS, () => json({ statusCode: 409, error: 'Conflict', message: 'This run is closed and takes no more readings.' }, 409));
    await q.flush();
    expect(q.pending()).toHaveLength(0);
    expect(q.failed(RUN)).toHaveLength(1);
    expect(q.failed(RUN)[0].status).toBe(409);
    expect(q.failed(RUN)[0].error).toBe('This run is closed and takes no more readings.');

    // Not sent again.
    await q.flush();
    expect(roundPosts()).toHaveLength(1);

    // The error survives a reload too, until the person dismisses it.
    expect(new OfflineRoundQueue().failed(RUN)).toHaveLength(1);
    q.dismissFailed(q.failed(RUN)[0].id);
    expect(q.failed()).toHaveLength(0);
    expect(localStorage.getItem(OFFLINE_QUEUE_STORAGE_KEY)).toBeNull();
  });

  it('keeps the rejected rows when a 400 says some rows were refused', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    await q.submit(RUN, round([120, -5]));
    const partial: IngestResult = {
      stored: 1,
      duplicates: 0,
      rejected: [{ index: 1, field: 'value', reason: 'Below the gauge’s range.' }],
      rejectedCount: 1,
      alarmsRaised: 0,
    };
    net.clearCalls();
    net.on(ROUNDS, () => json({ statusCode: 400, error: 'Bad Request', message: 'Some readings were refused.', details: partial }, 400));
    await q.flush();
    expect(q.failed(RUN)[0].result).toEqual(partial);
  });

  it('retries on its own every 10 s and when `online` fires', async () => {
    vi.useFakeTimers();
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    await q.submit(RUN, round());
    const stop = q.startAutoRetry(null);
    await vi.advanceTimersByTimeAsync(0);
    const afterStart = net.calls.length;
    await vi.advanceTimersByTimeAsync(10_000);
    expect(net.calls.length).toBe(afterStart + 1);

    net.clearCalls();
    net.on(ROUNDS, () => json(ok(2), 201));
    window.dispatchEvent(new Event('online'));
    await vi.advanceTimersByTimeAsync(0);
    expect(roundPosts()).toHaveLength(1);
    expect(q.pending()).toHaveLength(0);
    stop();
    await vi.advanceTimersByTimeAsync(30_000);
    expect(roundPosts()).toHaveLength(1);
  });

  it('retries when the live socket reconnects', async () => {
    net.on(ROUNDS, offline);
    const q = new OfflineRoundQueue();
    await q.submit(RUN, round());
    const handlers: Array<() => void> = [];
    const socket = { on: (_: 'connect', fn: () => void) => handlers.push(fn), off: vi.fn() };
    const stop = q.startAutoRetry(socket, 60_000);
    await q.flush();
    net.clearCalls();
    net.on(ROUNDS, () => json(ok(2), 201));
    handlers.forEach((h) => h());
    await q.flush();
    expect(roundPosts()).toHaveLength(1);
    expect(q.pending()).toHaveLength(0);
    stop();
    expect(socket.off).toHaveBeenCalled();
  });
});

describe('newClientId', () => {
  it('makes RFC 4122 version-4 ids, different each time', () => {
    const a = newClientId();
    const b = newClientId();
    // RFC 4122 section 4.4: version nibble 4, variant bits 10xx.
    expect(a).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(a).not.toBe(b);
  });
});
