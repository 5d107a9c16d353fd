import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import type { AlarmDto, EngineDetail, LiveAck, IngestResult, ReadingsEvent } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { connected, socketAs } from './utils/socket.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, reading } from './factories/engine.factory.js';

const WAIT_MS = 5_000;

describe('the run log live: readings and alarms reach everyone watching the run, and only them', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let observer: SignedIn;
  let engine: EngineDetail;
  const sockets: Socket[] = [];
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;

  const joined = async (token: string, room: string): Promise<Socket> => {
    const s = socketAs(t.url, token);
    sockets.push(s);
    await connected(s);
    const ack = await s.timeout(WAIT_MS).emitWithAck('room:join', { room });
    expect(ack).toMatchObject({ ok: true });
    return s;
  };
  const collect = <T>(s: Socket, event: string) => {
    const got: T[] = [];
    s.on(event, (x: T) => got.push(x));
    return got;
  };
  const until = async (cond: () => boolean) => {
    const end = Date.now() + WAIT_MS;
    while (!cond()) {
      if (Date.now() > end) throw new Error('timed out');
      await new Promise((r) => setTimeout(r, 25));
    }
  };

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    observer = await login(t, 'observer');
    engine = await createEngine(t, chief.accessToken);
  });
  afterAll(async () => {
    for (const s of sockets) s.disconnect();
    await t?.close();
  });

  it('two viewers in the run room get the reading and the alarm; a viewer of another run gets neither', async () => {
    const run = await createPreparingRun(t, operator.accessToken, engine.id);
    const other = await createPreparingRun(t, operator.accessToken, (await createEngine(t, chief.accessToken)).id);
    const a = await joined(observer.accessToken, `run:${run.id}`);
    const b = await joined(chief.accessToken, `run:${run.id}`);
    const c = await joined(operator.accessToken, `run:${other.id}`);
    const got = {
      a: collect<ReadingsEvent>(a, 'readings:new'),
      b: collect<ReadingsEvent>(b, 'readings:new'),
      c: collect<ReadingsEvent>(c, 'readings:new'),
    };
    const alarms = {
      a: collect<AlarmDto>(a, 'alarm:changed'),
      b: collect<AlarmDto>(b, 'alarm:changed'),
      c: collect<AlarmDto>(c, 'alarm:changed'),
    };
    const r = reading(point('THR'), 149);
    const res = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({ takenAt: r.takenAt, readings: [r] });
    expect(res.status).toBe(201);
    await until(() => got.a.length > 0 && got.b.length > 0 && alarms.a.length >= 2 && alarms.b.length >= 2);
    for (const list of [got.a, got.b]) expect(list[0].readings[0]).toMatchObject({ clientId: r.clientId, value: 149, unit: 'psig' });
    for (const list of [alarms.a, alarms.b]) expect(list.map((x) => x.kind).sort()).toEqual(['high', 'high_high']);
    await new Promise((res2) => setTimeout(res2, 300));
    expect(got.c).toHaveLength(0);
    expect(alarms.c).toHaveLength(0);
  });

  it('readings sent through the live channel take the same path: stored once, even when the REST route sends them too', async () => {
    const run = await createPreparingRun(t, operator.accessToken, (await createEngine(t, chief.accessToken)).id);
    const s = await joined(operator.accessToken, `run:${run.id}`);
    const obs = await joined(observer.accessToken, `run:${run.id}`);
    const r = { ...reading(randomUUID(), 74), pointCode: 'SPD', pointId: undefined };
    const ack = (await s.timeout(WAIT_MS).emitWithAck('readings:submit', { runId: run.id, readings: [r] })) as LiveAck<IngestResult>;
    expect(ack).toMatchObject({ ok: true, data: { stored: 1, duplicates: 0 } });
    const rest = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({ takenAt: r.takenAt, readings: [r] });
    expect(rest.body).toMatchObject({ stored: 0, duplicates: 1 });
    const denied = (await obs
      .timeout(WAIT_MS)
      .emitWithAck('readings:submit', { runId: run.id, readings: [{ ...r, clientId: randomUUID() }] })) as LiveAck<unknown>;
    expect(denied.ok).toBe(false);
    const bad = (await s.timeout(WAIT_MS).emitWithAck('readings:submit', { runId: 'nope', readings: [] })) as LiveAck<unknown>;
    expect(bad.ok).toBe(false);
    const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE run_id = $1`, [run.id]);
    expect(n).toBe(1);
  });
});
