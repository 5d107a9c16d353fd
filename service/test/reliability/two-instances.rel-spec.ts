/**
 * Two service instances (node dist/main.js twice) on one database. Viewers connected to instance B see the readings
 * and alarms submitted through instance A (socket.io's PostgreSQL adapter). Readings of one engine sent to both
 * instances at the same moment are stored once each, and every crossing of the high limit raises exactly one alarm
 * event, in order (a per-engine advisory lock orders the two instances' transactions); killing instance A half-way
 * loses nothing either instance acknowledged. The cap on visitors per board counts the visitors of both instances.
 */
import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { io, type Socket } from 'socket.io-client';
import type { AlarmDto, ReadingDto } from '@crankjournal/shared-types';
import { engineBody } from '../factories/engine.factory.js';
import { authHeader, fetchJson } from '../utils/signed-in.js';
import { dropDatabase, freshDatabase, serviceDir, siblingDatabaseUrl, withClient } from './support/env.js';
import { freePort, ServiceProcess } from './support/service-process.js';
import { accessToken } from './support/sessions.js';

const HIGH_LIMIT = 50;
const DEADBAND = 2;
/** psig: normal, just under the clear point, at it, in the band, at the limit, just above, clearly above. */
const LEVELS = [40, 47.9, 48, 49, 50, 50.1, 55];
const READINGS = 600;
/** Visitors one board takes, across both instances. */
const VISITOR_CAP = 3;
const BATCH = 10;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const runFile = promisify(execFile);

interface Reading {
  clientId: string;
  pointCode: string;
  value: number;
  takenAt: string;
}

/** The crossings of a series by the rule the product states (alarm-rules.ts: raise above the limit, clear below limit − deadband). */
function expectedEvents(series: Reading[]) {
  let active = false;
  const raises: string[] = [];
  const clears: string[] = [];
  for (const r of series) {
    if (!active && r.value > HIGH_LIMIT) {
      active = true;
      raises.push(r.takenAt);
    } else if (active && r.value < HIGH_LIMIT - DEADBAND) {
      active = false;
      clears.push(r.takenAt);
    }
  }
  return { raises, clears };
}

describe('two service instances on one database', () => {
  const dbUrl = siblingDatabaseUrl('two');
  let a: ServiceProcess;
  let b: ServiceProcess;
  let chief: string;
  let operator: string;
  const sockets: Socket[] = [];

  beforeAll(async () => {
    await freshDatabase(dbUrl);
    await runFile(process.execPath, [join(serviceDir(), 'dist', 'database', 'migrate.js')], {
      cwd: serviceDir(),
      env: { ...process.env, NODE_OPTIONS: '', DATABASE_URL: dbUrl },
    });
    const env = { VISIT_VIEWERS_PER_BOARD: String(VISITOR_CAP) };
    a = new ServiceProcess({ databaseUrl: dbUrl, port: await freePort(), env });
    b = new ServiceProcess({ databaseUrl: dbUrl, port: await freePort(), env });
    await Promise.all([a.start(), b.start()]);
    const people = await withClient(dbUrl, async (c) => {
      const add = async (role: string) =>
        (
          await c.query(`INSERT INTO users (email, display_name, role, active) VALUES ($1, $2, $3, true) RETURNING id`, [
            `${role}-${randomUUID()}@e2e.crankjournal.test`,
            `Two instances ${role}`,
            role,
          ])
        ).rows[0].id as string;
      return { chief: await add('chief_engineer'), operator: await add('operator') };
    });
    chief = await accessToken(people.chief, 'chief_engineer', 7200);
    operator = await accessToken(people.operator, 'operator', 7200);
  }, 180_000);

  afterAll(async () => {
    for (const s of sockets) s.disconnect();
    await Promise.all([a?.stop(), b?.stop()]);
    await dropDatabase(dbUrl);
  }, 60_000);

  /** An engine with one oil-pressure point (high limit 50 psig, deadband 2) and a run taking readings, made through `svc`. */
  async function engineAndRun(svc: ServiceProcess) {
    const body = engineBody(`Two instances ${randomUUID().slice(0, 6)}`);
    body.measurementPoints = [
      {
        code: 'OILP',
        label: 'Main oil pressure',
        kind: 'oil_pressure',
        unit: 'psig',
        sequence: 1,
        highLimit: HIGH_LIMIT,
        deadband: DEADBAND,
      },
    ];
    const engine = await fetchJson<{ id: string }>(svc.url, 'POST', '/api/engines', chief, body);
    const run = await fetchJson<{ id: string }>(svc.url, 'POST', '/api/runs', operator, {
      engineId: engine.id,
      purpose: 'test',
      title: 'Two',
    });
    await fetchJson(svc.url, 'POST', `/api/runs/${run.id}/transitions`, operator, { to: 'preparing' });
    return { engineId: engine.id, runId: run.id };
  }

  /** One round through `svc`: the answer, or null when the instance did not answer. */
  async function round(svc: ServiceProcess, runId: string, batch: Reading[]): Promise<{ stored: number; duplicates: number } | null> {
    try {
      const res = await fetch(`${svc.url}/api/runs/${runId}/rounds`, {
        method: 'POST',
        headers: { ...authHeader(operator), 'content-type': 'application/json' },
        body: JSON.stringify({ takenAt: batch[0].takenAt, readings: batch }),
        signal: AbortSignal.timeout(10_000),
      });
      const json = await res.json().catch(() => null);
      if (res.status === 201) return json as { stored: number; duplicates: number };
      if (res.status < 500) throw new Error(`round refused: ${res.status} ${JSON.stringify(json)}`);
      return null;
    } catch (e) {
      if ((e as Error).message.includes('refused:')) throw e;
      return null;
    }
  }

  it('a viewer on instance B sees the readings and the alarm submitted through instance A', async () => {
    const { runId } = await engineAndRun(a);
    const viewer = io(b.url, { transports: ['websocket'], auth: { token: operator }, forceNew: true, reconnection: false });
    sockets.push(viewer);
    const seen = new Set<string>();
    const alarms: AlarmDto[] = [];
    viewer.on('readings:new', (p: { readings: ReadingDto[] }) => p.readings.forEach((r) => seen.add(r.clientId)));
    viewer.on('alarm:changed', (al: AlarmDto) => alarms.push(al));
    await new Promise<void>((res, rej) => {
      viewer.once('connect', () => res());
      viewer.once('connect_error', rej);
    });
    const joined = (await viewer.timeout(5_000).emitWithAck('room:join', { room: `run:${runId}` })) as { ok: boolean };
    expect(joined.ok).toBe(true);

    const t0 = Date.now() - 60_000;
    const series: Reading[] = [40, 45, 49, 55, 56, 44].map((value, i) => ({
      clientId: randomUUID(),
      pointCode: 'OILP',
      value,
      takenAt: new Date(t0 + i * 1000).toISOString(),
    }));
    expect(await round(a, runId, series.slice(0, 4))).toMatchObject({ stored: 4 });
    for (let i = 0; i < 100 && !alarms.length; i++) await sleep(50);
    expect(await round(a, runId, series.slice(4))).toMatchObject({ stored: 2 });
    for (let i = 0; i < 100 && (seen.size < series.length || !alarms.some((x) => x.state === 'returned_unacknowledged')); i++)
      await sleep(50);
    expect([...seen].sort()).toEqual(series.map((r) => r.clientId).sort());
    expect(alarms.map((x) => x.state)).toEqual(['active_unacknowledged', 'returned_unacknowledged']);
    expect(alarms.every((x) => x.kind === 'high' && x.runId === runId)).toBe(true);
  });

  it('the cap on visitors per board holds across both instances', async () => {
    const { runId } = await engineAndRun(a);
    const board = await fetchJson<{ slug: string }>(a.url, 'POST', '/api/visitor-boards', chief, { runId });
    /** A visitor on `svc`: null when connected, else the refusal's message. */
    const visit = (svc: ServiceProcess) =>
      new Promise<{ socket: Socket; refused: string | null }>((res) => {
        const socket = io(`${svc.url}/visit`, {
          transports: ['websocket'],
          reconnection: false,
          forceNew: true,
          auth: { slug: board.slug },
        });
        sockets.push(socket);
        socket.once('connect', () => res({ socket, refused: null }));
        socket.once('connect_error', (e) => res({ socket, refused: e.message }));
      });
    // Each instance tells the others its visitors with every round of figures (every 2 s).
    const round = () => sleep(4_500);
    const onA = [await visit(a), await visit(a)];
    expect(onA.map((v) => v.refused)).toEqual([null, null]);
    await round();
    expect((await visit(b)).refused).toBeNull();
    // Two on A and one on B: the board is full on either instance.
    expect((await visit(b)).refused).toMatch(/as many visitors as it can take/);
    await round();
    expect((await visit(a)).refused).toMatch(/as many visitors as it can take/);
    // One leaves A: B takes a visitor again once A has said so.
    onA[0].socket.disconnect();
    await round();
    expect((await visit(b)).refused).toBeNull();
  }, 60_000);

  it('readings sent to both at once are stored once each, one alarm event per crossing, in order; killing A loses nothing', async () => {
    const { engineId, runId } = await engineAndRun(b);
    let seed = 7;
    const random = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const start = Date.now() - 3 * 3600_000;
    const series: Reading[] = Array.from({ length: READINGS }, (_x, i) => ({
      clientId: randomUUID(),
      pointCode: 'OILP',
      value: LEVELS[Math.floor(random() * LEVELS.length)],
      takenAt: new Date(start + i * 1000).toISOString(),
    }));
    const expected = expectedEvents(series);
    expect(expected.raises.length).toBeGreaterThan(20);

    let bothAnswered = 0;
    let killedAt = -1;
    for (let i = 0; i * BATCH < series.length; i++) {
      const batch = series.slice(i * BATCH, (i + 1) * BATCH);
      // Half-way, instance A is killed (no shutdown); the readings keep coming to both addresses.
      if (i === Math.floor(series.length / BATCH / 2)) {
        await a.kill();
        killedAt = i;
      }
      // Every third batch goes to one instance only, alternately, so each instance's cached readings fall behind the other's.
      const targets = i % 3 === 2 ? [i % 2 ? a : b] : [a, b];
      let answers: ({ stored: number; duplicates: number } | null)[] = [];
      for (let attempt = 0; attempt < 50; attempt++) {
        answers = await Promise.all(targets.map((svc) => round(svc, runId, batch)));
        if (answers.some((x) => x)) break;
        // Only A was asked and A is dead: ask B.
        if (!a.running) targets.splice(0, targets.length, b);
        await sleep(100);
      }
      const ok = answers.filter((x): x is { stored: number; duplicates: number } => !!x);
      expect(ok.length).toBeGreaterThan(0);
      if (ok.length === 2) {
        bothAnswered++;
        // Each reading stored by exactly one of the two; the other reports it as a duplicate.
        expect(ok[0].stored + ok[1].stored).toBe(batch.length);
        expect(ok[0].duplicates + ok[1].duplicates).toBe(batch.length);
      }
    }
    expect(killedAt).toBeGreaterThan(0);
    expect(bothAnswered).toBeGreaterThan(10);

    await withClient(dbUrl, async (db) => {
      const rows = (await db.query(`SELECT client_id, value FROM readings WHERE run_id = $1 ORDER BY taken_at`, [runId])).rows as {
        client_id: string;
        value: number;
      }[];
      expect(rows.map((r) => r.client_id)).toEqual(series.map((r) => r.clientId));
      expect(rows.map((r) => Number(r.value))).toEqual(series.map((r) => r.value));
      const events = (
        await db.query(
          `SELECT e.event, e.at FROM alarm_events e JOIN alarms al ON al.id = e.alarm_id
            WHERE al.engine_id = $1 AND e.event IN ('raise', 'reactivate', 'return_to_normal') ORDER BY e.at, e.event`,
          [engineId],
        )
      ).rows as { event: string; at: Date }[];
      const times = (kinds: string[]) => events.filter((e) => kinds.includes(e.event)).map((e) => new Date(e.at).toISOString());
      expect(times(['raise', 'reactivate'])).toEqual(expected.raises);
      expect(times(['return_to_normal'])).toEqual(expected.clears);
      const open = (await db.query(`SELECT 1 FROM alarms WHERE engine_id = $1 AND state <> 'normal'`, [engineId])).rowCount;
      expect(open).toBeLessThanOrEqual(1);
    });
  }, 240_000);
});
