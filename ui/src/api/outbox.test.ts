import 'fake-indexeddb/auto';
import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { json, signIn, signOut, stubFetch } from '../test-utils/http';
import {
  indexedDbPersistence,
  LEGACY_STORAGE_KEY,
  newClientId,
  Outbox,
  type OutboxPersistence,
  type OutboxRequest,
  type OutboxState,
} from './outbox';

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

/** Keeps the outbox in memory, counting writes, as a stand-in for IndexedDB where the test is not about it. */
function memory(initial?: OutboxState): OutboxPersistence & { saved: OutboxState | undefined } {
  const p = {
    saved: initial,
    load: () => Promise.resolve(p.saved),
    save: (s: OutboxState) => {
      p.saved = structuredClone(s);
      return Promise.resolve();
    },
  };
  return p;
}

const entry = (itemKey: string, value: unknown): OutboxRequest => ({
  kind: 'checklist-entry',
  label: `Checklist item ${itemKey}`,
  runId: RUN,
  path: `/checklists/c1/items/${itemKey}`,
  method: 'PUT',
  body: { value },
  ref: { checklistId: 'c1', itemKey },
});

const ROUNDS = `POST /runs/${RUN}/rounds`;
let net: ReturnType<typeof stubFetch>;

beforeEach(() => {
  localStorage.clear();
  signIn('operator');
  net = stubFetch();
});
afterEach(() => {
  signOut();
  vi.restoreAllMocks();
  vi.useRealTimers();
});

const writes = () => net.calls.filter((c) => c.method !== 'GET');

describe('outbox', () => {
  it('queues a round when the server cannot be reached, and keeps it in IndexedDB across a reload', async () => {
    net.on(ROUNDS, offline);
    const q = new Outbox({ persistence: indexedDbPersistence });
    await q.ready;
    const r = round();
    const outcome = await q.submit(RUN, r);
    expect(outcome.kind).toBe('queued');
    expect(q.pending(RUN)).toHaveLength(1);

    const reloaded = new Outbox({ persistence: indexedDbPersistence });
    await reloaded.ready;
    expect(reloaded.pending(RUN).map((p) => p.body)).toEqual([r]);
    expect(reloaded.pending(RUN)[0]).toMatchObject({ kind: 'round', userId: 'u1', userName: 'Test Person', path: `/runs/${RUN}/rounds` });
    expect(localStorage.getItem(LEGACY_STORAGE_KEY)).toBeNull();
  });

  it('sends straight away when the server answers, queueing nothing', async () => {
    net.on(ROUNDS, () => json(ok(2), 201));
    const store = memory();
    const q = new Outbox({ persistence: store });
    await q.ready;
    const outcome = await q.submit(RUN, round());
    expect(outcome).toEqual({ kind: 'sent', result: ok(2) });
    expect(q.pending()).toHaveLength(0);
    expect(store.saved).toBeUndefined();
  });

  it('sends a round, a checklist entry and its photo in the order they were made, each once, with the same clientIds', async () => {
    net.on('*', offline);
    const store = memory();
    const q = new Outbox({ persistence: store });
    await q.ready;
    const r = round([120, 74.5, 96]);
    await q.submit(RUN, r);
    await q.submitRequest(entry('oil', true));
    const photo = new Blob(['jpeg bytes'], { type: 'image/jpeg' });
    await q.submitRequest({
      ...entry('oil', null),
      kind: 'checklist-photo',
      path: '/checklists/c1/items/oil/photo',
      body: undefined,
      blob: photo,
    });
    expect(store.saved?.pending.map((p) => p.kind)).toEqual(['round', 'checklist-entry', 'checklist-photo']);

    net.clearCalls();
    net.on('*', () => json({}, 200));
    net.on(ROUNDS, () => json(ok(3), 201));
    const sent = vi.fn();
    q.onSent(sent);
    // Two triggers at once (socket reconnect and `online`) share one pass.
    await Promise.all([q.flush(), q.flush()]);
    await q.flush(); // nothing left: no further request

    expect(writes().map((c) => `${c.method} ${c.path}`)).toEqual([
      `POST /runs/${RUN}/rounds`,
      'PUT /checklists/c1/items/oil',
      'PUT /checklists/c1/items/oil/photo',
    ]);
    expect((writes()[0].body as RoundRequest).readings.map((x) => x.clientId)).toEqual(r.readings.map((x) => x.clientId));
    expect(writes()[2].init?.headers).toMatchObject({ 'content-type': 'image/jpeg' });
    expect(q.pending()).toHaveLength(0);
    expect(store.saved).toEqual({ pending: [], failed: [] });
    expect(sent).toHaveBeenCalledTimes(3);
  });

  it('queues a new action behind older waiting ones even when the server is back, so the order holds', async () => {
    net.on('*', offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
    await q.submitRequest(entry('a', 1));
    net.clearCalls();
    net.on('*', () => json({}, 200));
    const outcome = await q.submitRequest(entry('b', 2));
    expect(outcome.kind).toBe('queued');
    await q.flush();
    expect(writes().map((c) => c.path)).toEqual(['/checklists/c1/items/a', '/checklists/c1/items/b']);
  });

  it('keeps an item when the server answers with a 5xx', async () => {
    net.on(ROUNDS, offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
    await q.submit(RUN, round());

    net.clearCalls();
    net.on(ROUNDS, () => json({ statusCode: 503, error: 'Service Unavailable', message: 'Database is down.' }, 503));
    await q.flush();
    expect(writes()).toHaveLength(1);
    expect(q.pending(RUN)).toHaveLength(1);
    expect(q.pending(RUN)[0].attempts).toBe(2);
    expect(q.pending(RUN)[0].lastError).toBe('Database is down.');
    expect(q.failed()).toHaveLength(0);
  });

  it('moves a refused item (4xx) aside with the server’s reason, sends the rest, and keeps it until dismissed', async () => {
    net.on('*', offline);
    const store = memory();
    const q = new Outbox({ persistence: store });
    await q.ready;
    await q.submitRequest(entry('a', 1));
    await q.submitRequest(entry('b', 2));
    await q.flush(); // the pass started behind the second one, still offline

    net.clearCalls();
    net.on('*', () => json({}, 200));
    net.on('PUT /checklists/c1/items/a', () => json({ statusCode: 409, error: 'Conflict', message: 'This run was abandoned.' }, 409));
    await q.flush();
    expect(writes().map((c) => c.path)).toEqual(['/checklists/c1/items/a', '/checklists/c1/items/b']);
    expect(q.pending()).toHaveLength(0);
    expect(q.failed(RUN)).toHaveLength(1);
    expect(q.failed(RUN)[0]).toMatchObject({ status: 409, error: 'This run was abandoned.', label: 'Checklist item a' });

    // Not sent again; still there after a reload, until the person dismisses it.
    await q.flush();
    expect(writes()).toHaveLength(2);
    const reloaded = new Outbox({ persistence: store });
    await reloaded.ready;
    expect(reloaded.failed(RUN)).toHaveLength(1);
    await q.dismissFailed(q.failed(RUN)[0].id);
    expect(q.failed()).toHaveLength(0);
    expect(store.saved).toEqual({ pending: [], failed: [] });
  });

  it('keeps the rejected rows when a 400 says some readings were refused', async () => {
    net.on(ROUNDS, offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
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

  it('sends an item only under the sign-in of the person who made it', async () => {
    net.on('*', offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
    await q.submitRequest(entry('a', 1));
    signIn('operator', { id: 'u2', displayName: 'Someone Else' });
    net.clearCalls();
    net.on('*', () => json({}, 200));
    await q.flush();
    expect(writes()).toHaveLength(0);
    expect(q.pending()).toHaveLength(1);
    signIn('operator');
    await q.flush();
    expect(writes()).toHaveLength(1);
  });

  it('keeps a signing password in memory only: sent with the signature, never stored; after a reload it asks to sign again', async () => {
    net.on('*', offline);
    const store = memory();
    const q = new Outbox({ persistence: store });
    await q.ready;
    const sign: OutboxRequest = {
      kind: 'checklist-sign',
      label: 'Signature on “Pre-lube”',
      runId: RUN,
      path: '/checklists/c1/sign',
      method: 'POST',
      body: {},
      whenQueued: { signedOnDeviceAt: '2025-06-14T10:20:00.000Z' },
      secretField: 'signature',
      ref: { checklistId: 'c1' },
    };
    await q.submitRequest(sign, 'pin-4711');
    expect(JSON.stringify(store.saved)).not.toContain('pin-4711');
    expect(store.saved?.pending[0].body).toEqual({ signedOnDeviceAt: '2025-06-14T10:20:00.000Z' });

    // A reload before the server answers: the password is gone, so the signature is shown as not sent.
    const reloaded = new Outbox({ persistence: store });
    await reloaded.ready;
    net.clearCalls();
    net.on('*', () => json({}, 200));
    await reloaded.flush();
    expect(writes()).toHaveLength(0);
    expect(reloaded.failed(RUN)[0].error).toMatch(/password is never kept on the tablet/);

    // The same tab: sent with the password and the tablet's time.
    await q.flush();
    expect(writes()).toHaveLength(1);
    expect(writes()[0].body).toEqual({ signedOnDeviceAt: '2025-06-14T10:20:00.000Z', signature: 'pin-4711' });
  });

  it('sends a signature made online without a tablet time', async () => {
    net.on('*', () => json({}, 200));
    const q = new Outbox({ persistence: memory() });
    await q.ready;
    const outcome = await q.submitRequest(
      {
        kind: 'checklist-sign',
        label: 'x',
        runId: RUN,
        path: '/checklists/c1/sign',
        method: 'POST',
        body: {},
        whenQueued: { signedOnDeviceAt: 'x' },
        secretField: 'signature',
      },
      'pin',
    );
    expect(outcome.kind).toBe('sent');
    expect(writes()[0].body).toEqual({ signature: 'pin' });
  });

  it('takes over rounds left in localStorage by the earlier queue', async () => {
    const r = round([131]);
    localStorage.setItem(
      LEGACY_STORAGE_KEY,
      JSON.stringify({
        pending: [{ id: 'old', runId: RUN, round: r, queuedAt: r.takenAt, attempts: 1, lastTriedAt: null, lastError: null }],
        failed: [],
      }),
    );
    const store = memory();
    const q = new Outbox({ persistence: store });
    await q.ready;
    expect(q.pending(RUN).map((p) => p.body)).toEqual([r]);
    expect(store.saved?.pending).toHaveLength(1);
    expect(localStorage.getItem(LEGACY_STORAGE_KEY)).toBeNull();
  });

  it('retries on its own every 10 s and when `online` fires', async () => {
    vi.useFakeTimers();
    net.on(ROUNDS, offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
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
    expect(writes()).toHaveLength(1);
    expect(q.pending()).toHaveLength(0);
    stop();
    await vi.advanceTimersByTimeAsync(30_000);
    expect(writes()).toHaveLength(1);
  });

  it('retries when the live socket reconnects', async () => {
    net.on(ROUNDS, offline);
    const q = new Outbox({ persistence: memory() });
    await q.ready;
    await q.submit(RUN, round());
    const handlers: Array<() => void> = [];
    const socket = { on: (_: 'connect', fn: () => void) => handlers.push(fn), off: vi.fn() };
    const stop = q.startAutoRetry(socket, 60_000);
    await q.flush();
    net.clearCalls();
    net.on(ROUNDS, () => json(ok(2), 201));
    handlers.forEach((h) => h());
    await q.flush();
    expect(writes()).toHaveLength(1);
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
