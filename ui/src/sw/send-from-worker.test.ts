import 'fake-indexeddb/auto';
import type { SessionUser, TokenPair } from '@crankjournal/shared-types';
import { json, signIn, signOut, stubFetch, type StubRequest } from '../test-utils/http';
import { indexedDbPersistence, newClientId, Outbox, type OutboxRequest, type OutboxState } from '../api/outbox';
import { sendFromWorker } from './send-from-worker';

const RUN = 'run-1';
const offline = () => Promise.reject(new TypeError('Failed to fetch'));
const worker = (changed = vi.fn()) => sendFromWorker({ fetch: (i, init) => fetch(i, init), persistence: indexedDbPersistence, changed });

const person = (id: string): SessionUser => ({
  id,
  email: `${id}@alderforge.example`,
  displayName: `Person ${id}`,
  role: 'operator',
  unitSystem: 'imperial',
});
const pair = (id: string, accessToken: string): TokenPair => ({ accessToken, accessExpiresInSeconds: 900, user: person(id) });

const entry = (itemKey: string): OutboxRequest => ({
  kind: 'checklist-entry',
  label: `Checklist item ${itemKey}`,
  runId: RUN,
  path: `/checklists/c1/items/${itemKey}`,
  method: 'PUT',
  body: { value: true },
  ref: { checklistId: 'c1', itemKey },
});
const sign: OutboxRequest = {
  kind: 'checklist-sign',
  label: 'Signature on “Pre-lube”',
  runId: RUN,
  path: '/checklists/c1/sign',
  method: 'POST',
  body: {},
  secretField: 'signature',
};

/** What the page left in IndexedDB when its tab was closed: made offline by u1, then one item of u2. */
async function leftByThePage(): Promise<{ amendmentId: string }> {
  stubFetch({ '*': offline });
  signIn('operator', { id: 'u1' });
  const q = new Outbox({ persistence: indexedDbPersistence });
  await q.ready;
  const amendmentId = newClientId();
  await q.submitRequest({
    kind: 'round',
    label: 'Round',
    runId: RUN,
    path: `/runs/${RUN}/rounds`,
    method: 'POST',
    body: { takenAt: '2025-06-14T10:15:00.000Z', readings: [] },
  });
  await q.submitRequest(entry('refused'));
  await q.submitRequest(sign, 'pin-4711');
  await q.submitRequest({
    kind: 'reading-amendment',
    label: 'Amendment',
    runId: RUN,
    path: '/readings/41/amendments',
    method: 'POST',
    body: { value: 74, reason: 'Misread', clientId: amendmentId },
  });
  signIn('operator', { id: 'u2' });
  await q.submitRequest(entry('theirs'));
  await q.flush(); // the page's own tries while offline have ended
  signOut();
  vi.restoreAllMocks();
  return { amendmentId };
}

const stored = async (): Promise<OutboxState> => (await indexedDbPersistence.load()) ?? { pending: [], failed: [] };

afterEach(async () => {
  await indexedDbPersistence.save({ pending: [], failed: [] });
  signOut();
  vi.restoreAllMocks();
});

describe('the service worker sends the outbox with no tab open', () => {
  it('refreshes through the cookie, sends that person’s items in order and keeps refusals with the reason, as the page does', async () => {
    const { amendmentId } = await leftByThePage();
    let refreshes = 0;
    const net = stubFetch({
      '*': () => json({}, 200),
      'POST /auth/refresh': () => json(pair('u1', `token-${++refreshes}`)),
      'PUT /checklists/c1/items/refused': () => json({ statusCode: 409, error: 'Conflict', message: 'This run was abandoned.' }, 409),
      // The first token has expired by the time the amendment goes: refreshed once, then sent.
      'POST /readings/41/amendments': (r: StubRequest) =>
        (r.init?.headers as Record<string, string>).authorization === 'Bearer token-1'
          ? json({ statusCode: 401, message: 'Expired' }, 401)
          : json({}, 201),
    });
    const changed = vi.fn();
    expect(await worker(changed)).toBe(true);

    const calls = net.calls.map((c) => `${c.method} ${c.path}`);
    expect(calls).toEqual([
      'POST /auth/refresh',
      `POST /runs/${RUN}/rounds`,
      'PUT /checklists/c1/items/refused',
      'POST /readings/41/amendments',
      'POST /auth/refresh',
      'POST /readings/41/amendments',
    ]);
    expect(net.calls[0].init?.credentials).toBe('same-origin');
    expect((net.calls[1].init?.headers as Record<string, string>).authorization).toBe('Bearer token-1');
    expect((net.calls[5].body as { clientId: string }).clientId).toBe(amendmentId);

    const after = await stored();
    // Another person's item waits for their own sign-in.
    expect(after.pending.map((p) => p.path)).toEqual(['/checklists/c1/items/theirs']);
    expect(after.failed.map((f) => [f.path, f.status, f.error])).toEqual([
      ['/checklists/c1/items/refused', 409, 'This run was abandoned.'],
      ['/checklists/c1/sign', 0, expect.stringMatching(/password is never kept on the tablet/)],
    ]);
    expect(JSON.stringify(after)).not.toContain('pin-4711');
    expect(changed).toHaveBeenCalled();
  });

  it('keeps everything when the server cannot be reached (the browser retries), and when no sign-in can be refreshed', async () => {
    await leftByThePage();
    stubFetch({ '*': offline });
    expect(await worker()).toBe(false);
    expect((await stored()).pending).toHaveLength(5);

    const net = stubFetch({
      '*': () => json({}, 200),
      'POST /auth/refresh': () => json({ statusCode: 401, message: 'Sign in again' }, 401),
    });
    expect(await worker()).toBe(true);
    expect(net.calls.map((c) => c.path)).toEqual(['/auth/refresh']);
    expect((await stored()).pending).toHaveLength(5);
  });

  it('stops at a server error and keeps that item and the rest, in order', async () => {
    await leftByThePage();
    const triedBefore = (await stored()).pending[0].attempts;
    stubFetch({
      '*': () => json({}, 200),
      'POST /auth/refresh': () => json(pair('u1', 't')),
      [`POST /runs/${RUN}/rounds`]: () => json({ statusCode: 503, message: 'Busy' }, 503),
    });
    expect(await worker()).toBe(false);
    const after = await stored();
    expect(after.pending.map((p) => p.kind)).toEqual([
      'round',
      'checklist-entry',
      'checklist-sign',
      'reading-amendment',
      'checklist-entry',
    ]);
    expect(after.pending[0]).toMatchObject({ attempts: triedBefore + 1, lastError: 'Busy' });
  });
});
