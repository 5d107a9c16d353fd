import 'fake-indexeddb/auto';
import type { ReadingDto } from '@crankjournal/shared-types';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { Outbox, indexedDbPersistence, outbox } from '../../../api/outbox';
import { amendOrQueue } from './live-actions.api';

const reading: ReadingDto = {
  id: '41',
  clientId: '7f0c6a52-4c1e-4d7e-9a51-0d3b2a7c9e11',
  runId: 'run-1',
  pointId: 'p-spd',
  value: 47,
  originalValue: null,
  unit: 'rpm',
  takenAt: '2025-06-14T10:15:00.000Z',
  receivedAt: '2025-06-14T10:15:01.000Z',
  source: 'round',
  enteredBy: 'u1',
  enteredByName: 'Test Person',
  amendments: [],
} as ReadingDto;

const AMEND = 'POST /readings/41/amendments';
const offline = () => Promise.reject(new TypeError('Failed to fetch'));
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

beforeEach(() => {
  signIn('operator');
});
afterEach(() => {
  signOut();
  vi.restoreAllMocks();
});

describe('amending a reading offline', () => {
  it('queues the amendment with its own clientId, sends it again with the same id, and keeps a refusal with the reason', async () => {
    const net = stubFetch({ [AMEND]: offline });
    const q = outbox();
    await q.ready;

    expect(await amendOrQueue(reading, 'Speed', 74, 'Misread the counter')).toBeNull();
    const [item] = q.pending('run-1');
    expect(item).toMatchObject({ kind: 'reading-amendment', path: '/readings/41/amendments', method: 'POST', ref: { readingId: '41' } });
    const body = item.body as { value: number; reason: string; clientId: string };
    expect(body).toMatchObject({ value: 74, reason: 'Misread the counter' });
    expect(body.clientId).toMatch(UUID);

    // Kept in IndexedDB: a reload still has it.
    const reloaded = new Outbox({ persistence: indexedDbPersistence });
    await reloaded.ready;
    expect(reloaded.pending('run-1').map((p) => p.body)).toEqual([body]);

    // The server errs once (the amendment may or may not be stored), then answers: both tries carry the same id.
    let tries = 0;
    net.on(AMEND, () => (++tries === 1 ? json({ statusCode: 503, message: 'Busy' }, 503) : json({ ...reading, value: 74 }, 201)));
    await q.flush();
    expect(q.pending('run-1')).toHaveLength(1);
    await q.flush();
    expect(q.pending('run-1')).toHaveLength(0);
    const sent = net.calls.filter((c) => c.method === 'POST').slice(-2);
    expect(sent.map((c) => (c.body as { clientId: string }).clientId)).toEqual([body.clientId, body.clientId]);

    // A second amendment refused by the server (the run closed meanwhile) is kept with the server's reason.
    net.on(AMEND, offline);
    expect(await amendOrQueue(reading, 'Speed', 75, 'Second look')).toBeNull();
    net.on(AMEND, () => json({ statusCode: 409, error: 'Conflict', message: 'This run is closed and can no longer be changed.' }, 409));
    await q.flush();
    expect(q.pending('run-1')).toHaveLength(0);
    expect(q.failed('run-1').map((f) => [f.kind, f.status, f.error])).toEqual([
      ['reading-amendment', 409, 'This run is closed and can no longer be changed.'],
    ]);
  });

  it('sends straight away when the server answers, with a clientId', async () => {
    const net = stubFetch({ [AMEND]: () => json({ ...reading, value: 80 }, 201) });
    const q = outbox();
    await q.ready;
    for (const f of q.failed()) await q.dismissFailed(f.id);
    expect(await amendOrQueue(reading, 'Speed', 80, 'Read again')).toMatchObject({ value: 80 });
    expect((net.calls[0].body as { clientId: string }).clientId).toMatch(UUID);
  });
});
