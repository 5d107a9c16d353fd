/**
 * No loss, no doubles: five clients send 10,000 readings, each with its own client id, through the live
 * channel (readings:submit), the logger route and the round route, retrying whatever was not acknowledged,
 * while the service process (node dist/main.js, against a database of its own) is killed with SIGKILL and
 * started again, twice. Afterwards every reading is stored exactly once and every crossing of the high
 * limit raised exactly one alarm event (a raise, or a reactivation of the alarm nobody acknowledged).
 *
 * Each client has an engine of its own with one point whose value moves between clearly normal, the band
 * inside the deadband, exactly at the limit and clearly above it, in a known order; so the crossings are
 * known before the run, from the threshold rule as the product states it (alarm-rules.ts: raise strictly
 * above the limit, clear strictly below limit − deadband, otherwise hold).
 */
import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { io, type Socket } from 'socket.io-client';
import { engineBody } from '../factories/engine.factory.js';
import { authHeader, fetchJson } from '../utils/signed-in.js';
import { dropDatabase, freshDatabase, serviceDir, siblingDatabaseUrl, withClient } from './support/env.js';
import { freePort, ServiceProcess } from './support/service-process.js';
import { accessToken } from './support/sessions.js';

const CLIENTS = 5;
const READINGS_PER_CLIENT = 2000;
const BATCH = 20;
const HIGH_LIMIT = 50;
const DEADBAND = 2;
/**
 * Values in the point's unit (psig): normal, just under the clear point, at the clear point, in the band, at the limit,
 * just above, clearly above.
 */
const LEVELS = [40, 47.9, 48, 49, 50, 50.1, 55];
/** Kill the service when this share of all readings has been acknowledged. */
const KILL_AT = [0.3, 0.65];
const ACK_TIMEOUT_MS = 10_000;

type Channel = 'live' | 'logger' | 'round';
const CHANNELS: Channel[] = ['live', 'logger', 'round'];

interface Reading {
  clientId: string;
  pointCode: string;
  value: number;
  takenAt: string;
}

/** A small deterministic generator (mulberry32), so each client's series is the same every run. */
function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/** The crossings a series makes, by the rule stated in the product (alarm-rules.ts header). */
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
  return { raises, clears, activeAtEnd: active };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const runFile = promisify(execFile);

describe('no loss, no doubles: 10,000 readings from five clients while the service is killed twice', () => {
  const dbUrl = siblingDatabaseUrl('kill');
  let svc: ServiceProcess;

  beforeAll(async () => {
    await freshDatabase(dbUrl);
    await runFile(process.execPath, [join(serviceDir(), 'dist', 'database', 'migrate.js')], {
      cwd: serviceDir(),
      env: { ...process.env, NODE_OPTIONS: '', DATABASE_URL: dbUrl },
    });
    svc = new ServiceProcess({ databaseUrl: dbUrl, port: await freePort() });
    await svc.start();
  }, 180_000);

  afterAll(async () => {
    await svc?.stop();
    await dropDatabase(dbUrl);
  }, 60_000);

  it('stores every reading exactly once and raises exactly one alarm event per crossing', async () => {
    // People (straight into the database; tokens signed like the service signs them).
    const people = await withClient(dbUrl, async (c) => {
      const add = async (role: string) =>
        (
          await c.query(`INSERT INTO users (email, display_name, role, active) VALUES ($1, $2, $3, true) RETURNING id`, [
            `${role}-${randomUUID()}@e2e.crankjournal.test`,
            `Reliability ${role}`,
            role,
          ])
        ).rows[0].id as string;
      return { chief: await add('chief_engineer'), operator: await add('operator'), admin: await add('administrator') };
    });
    const chief = await accessToken(people.chief, 'chief_engineer', 7200);
    const operator = await accessToken(people.operator, 'operator', 7200);
    const admin = await accessToken(people.admin, 'administrator', 7200);
    const api = <T = unknown>(method: string, path: string, token: string, body?: unknown) =>
      fetchJson<T>(svc.url, method, path, token, body);

    // One engine, run and logger key per client.
    let clientsDone = false;
    const clients: {
      engineId: string;
      runId: string;
      loggerKey: string;
      series: Reading[];
      expected: ReturnType<typeof expectedEvents>;
    }[] = [];
    const start = Date.now() - 3 * 3600_000;
    for (let c = 0; c < CLIENTS; c++) {
      const body = engineBody(`Reliability engine ${c + 1} ${randomUUID().slice(0, 6)}`);
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
      const engine = await api<{ id: string }>('POST', '/api/engines', chief, body);
      const run = await api<{ id: string }>('POST', '/api/runs', operator, {
        engineId: engine.id,
        purpose: 'test',
        title: `Crash test ${c + 1}`,
      });
      await api('POST', `/api/runs/${run.id}/transitions`, operator, { to: 'preparing' });
      const logger = await api<{ id: string; key: string }>('POST', '/api/loggers', admin, {
        engineId: engine.id,
        name: `Crash test logger ${c + 1}`,
      });
      // The operator answers alarms on this engine (the qualifications module asks for the start-and-run duty).
      const today = new Date().toISOString().slice(0, 10);
      await api('POST', '/api/qualifications', chief, {
        userId: people.operator,
        engineId: engine.id,
        duty: 'start_and_run',
        grantedOn: today,
        expiresOn: new Date(Date.now() + 300 * 86_400_000).toISOString().slice(0, 10),
      });
      const random = prng(1000 + c);
      const series: Reading[] = Array.from({ length: READINGS_PER_CLIENT }, (_x, i) => ({
        clientId: randomUUID(),
        pointCode: 'OILP',
        value: LEVELS[Math.floor(random() * LEVELS.length)],
        takenAt: new Date(start + c * 7 + i * 1000).toISOString(),
      }));
      clients.push({
        engineId: engine.id,
        runId: run.id,
        loggerKey: logger.key,
        series,
        expected: expectedEvents(series),
      });
    }
    const total = CLIENTS * READINGS_PER_CLIENT;
    const expectedRaises = clients.reduce((n, c) => n + c.expected.raises.length, 0);
    expect(expectedRaises).toBeGreaterThan(100); // the series really cross the limit, many times

    // The clients: each sends its batches in order, and a batch again until it is acknowledged.
    let acked = 0;
    const stats = {
      requests: 0,
      retries: 0,
      duplicatesReported: 0,
      byChannel: { live: 0, logger: 0, round: 0 } as Record<Channel, number>,
    };
    const sockets: Socket[] = [];

    async function send(
      c: (typeof clients)[number],
      socket: Socket,
      channel: Channel,
      batch: Reading[],
    ): Promise<{ stored: number; duplicates: number } | null> {
      stats.requests++;
      try {
        if (channel === 'live') {
          if (!socket.connected) return null;
          const ack = await socket.timeout(ACK_TIMEOUT_MS).emitWithAck('readings:submit', { runId: c.runId, readings: batch });
          if (ack?.ok) return ack.data as { stored: number; duplicates: number };
          if (ack?.status && ack.status < 500) throw new Error(`live batch refused: ${JSON.stringify(ack)}`);
          return null;
        }
        const [path, headers, body] =
          channel === 'logger'
            ? ['/api/logger/readings', { 'x-logger-key': c.loggerKey }, { runId: c.runId, readings: batch }]
            : [`/api/runs/${c.runId}/rounds`, authHeader(operator), { takenAt: batch[0].takenAt, readings: batch }];
        const res = await fetch(`${svc.url}${path}`, {
          method: 'POST',
          headers: { ...headers, 'content-type': 'application/json' },
          body: JSON.stringify(body),
          signal: AbortSignal.timeout(ACK_TIMEOUT_MS),
        });
        const json = await res.json().catch(() => null);
        if (res.status === 201) return json as { stored: number; duplicates: number };
        if (res.status < 500) throw new Error(`${channel} batch refused: ${res.status} ${JSON.stringify(json)}`);
        return null;
      } catch (e) {
        if ((e as Error).message.includes('refused:')) throw e;
        return null; // no answer: the service is down or was killed mid-request
      }
    }

    async function client(index: number) {
      const c = clients[index];
      const socket = io(svc.url, {
        transports: ['websocket'],
        auth: { token: operator },
        reconnectionDelay: 100,
        reconnectionDelayMax: 500,
        forceNew: true,
      });
      sockets.push(socket);
      for (let b = 0; b * BATCH < c.series.length; b++) {
        const batch = c.series.slice(b * BATCH, (b + 1) * BATCH);
        const channel = CHANNELS[(b + index) % CHANNELS.length];
        for (let attempt = 0; ; attempt++) {
          if (clientsDone) throw new Error(`client ${index + 1} stopped: another client failed`);
          if (attempt > 0) {
            stats.retries++;
            await sleep(50 + Math.random() * 100);
          }
          const r = await send(c, socket, channel, batch);
          if (r) {
            expect(r.stored + r.duplicates).toBe(batch.length);
            stats.duplicatesReported += r.duplicates;
            stats.byChannel[channel] += batch.length;
            acked += batch.length;
            break;
          }
          if (attempt > 2000) throw new Error(`client ${index + 1} gave up on batch ${b}`);
        }
        // Every seventh batch is sent again by another route, as a client does when an answer was lost.
        if (b % 7 === 3) {
          const again = CHANNELS[(b + index + 1) % CHANNELS.length];
          for (let attempt = 0; attempt < 200 && !clientsDone; attempt++) {
            const r = await send(c, socket, again, batch);
            if (r) {
              expect(r).toMatchObject({ stored: 0, duplicates: batch.length });
              stats.duplicatesReported += r.duplicates;
              break;
            }
            await sleep(50 + Math.random() * 100);
          }
        }
      }
    }

    // The crew acknowledges alarms as they come, while readings arrive (and while the service restarts).
    let acknowledgements = 0;
    const acknowledger = async () => {
      while (!clientsDone) {
        for (const c of clients) {
          try {
            const res = await fetch(`${svc.url}/api/alarms?engineId=${c.engineId}&open=true`, {
              headers: authHeader(operator),
              signal: AbortSignal.timeout(ACK_TIMEOUT_MS),
            });
            if (res.status !== 200) continue;
            for (const a of (await res.json()) as { id: string; state: string }[]) {
              if (a.state !== 'active_unacknowledged' && a.state !== 'returned_unacknowledged') continue;
              const r = await fetch(`${svc.url}/api/alarms/${a.id}/acknowledge`, {
                method: 'POST',
                headers: authHeader(operator),
                signal: AbortSignal.timeout(ACK_TIMEOUT_MS),
              });
              if (r.status === 200) acknowledgements++;
            }
          } catch {
            /* the service is down; try again */
          }
        }
        await sleep(20);
      }
    };

    const kills: { at: number; ackedBefore: number; restartMs: number }[] = [];
    const killer = (async () => {
      for (const share of KILL_AT) {
        while (acked < share * total && !clientsDone) await sleep(5);
        if (clientsDone) break;
        const ackedBefore = acked;
        await svc.kill();
        const t0 = Date.now();
        await svc.start();
        kills.push({ at: share, ackedBefore, restartMs: Date.now() - t0 });
      }
    })();
    const started = Date.now();
    const crew = acknowledger();
    try {
      // allSettled, then the first failure: every client has stopped before the checks or the clean-up.
      const outcomes = await Promise.allSettled(clients.map((_c, i) => client(i).catch((e) => ((clientsDone = true), Promise.reject(e)))));
      const failed = outcomes.find(
        (o): o is PromiseRejectedResult => o.status === 'rejected' && !String(o.reason?.message).includes('another client failed'),
      );
      if (failed) throw failed.reason;
    } finally {
      clientsDone = true;
      await killer;
      await crew;
      for (const s of sockets) s.disconnect();
    }
    const seconds = (Date.now() - started) / 1000;

    // The service really died and came back twice while the readings were arriving.
    expect(kills).toHaveLength(2);
    expect(new Set(svc.pids).size).toBe(3);
    expect(stats.retries).toBeGreaterThan(0);
    expect(stats.duplicatesReported).toBeGreaterThan(0);
    expect(acknowledgements).toBeGreaterThan(0);

    // Every reading stored exactly once.
    await withClient(dbUrl, async (db) => {
      const [{ n, distinct }] = (await db.query(`SELECT count(*)::int AS n, count(DISTINCT client_id)::int AS distinct FROM readings`))
        .rows;
      expect({ n, distinct }).toEqual({ n: total, distinct: total });
      for (const c of clients) {
        const rows = (await db.query(`SELECT client_id, value, taken_at FROM readings WHERE run_id = $1 ORDER BY taken_at`, [c.runId]))
          .rows as { client_id: string; value: number; taken_at: Date }[];
        expect(rows.map((r) => r.client_id)).toEqual(c.series.map((r) => r.clientId));
        expect(rows.map((r) => Number(r.value))).toEqual(c.series.map((r) => r.value));
      }

      // Every crossing raised exactly one alarm event (a raise, or a reactivation of an alarm not yet
      // acknowledged), at the reading that crossed; every return to normal likewise.
      for (const c of clients) {
        const events = (
          await db.query(
            `SELECT e.alarm_id, e.event, e.from_state, e.to_state, e.at FROM alarm_events e JOIN alarms a ON a.id = e.alarm_id
            WHERE a.engine_id = $1 AND e.event IN ('raise', 'reactivate', 'return_to_normal') ORDER BY e.at, e.event`,
            [c.engineId],
          )
        ).rows as { alarm_id: string; event: string; at: Date }[];
        const times = (kinds: string[]) => events.filter((e) => kinds.includes(e.event)).map((e) => new Date(e.at).toISOString());
        expect(times(['raise', 'reactivate'])).toEqual(c.expected.raises);
        expect(times(['return_to_normal'])).toEqual(c.expected.clears);

        // Each alarm's history is one unbroken chain from "raised" to the state it has now: every event starts
        // from the state an earlier one left (no change lost, none applied to a stale copy). Acknowledgements
        // and readings are written by different transactions, so the chain is checked as a balance of states
        // (each state entered as often as it is left, but the start and the end), which any valid order meets
        // and a lost update breaks.
        const alarms = (await db.query(`SELECT id, kind, state, condition_active FROM alarms WHERE engine_id = $1`, [c.engineId])).rows as {
          id: string;
          kind: string;
          state: string;
          condition_active: boolean;
        }[];
        for (const a of alarms) {
          const chain = (await db.query(`SELECT event, from_state, to_state FROM alarm_events WHERE alarm_id = $1`, [a.id])).rows as {
            event: string;
            from_state: string | null;
            to_state: string;
          }[];
          const balance = new Map<string, number>();
          const move = (state: string, by: number) => balance.set(state, (balance.get(state) ?? 0) + by);
          for (const e of chain) {
            move(e.from_state ?? 'raised', -1);
            move(e.to_state, +1);
          }
          move('raised', +1);
          move(a.state, -1);
          const unbalanced = [...balance.entries()]
            .filter(([, n]) => n !== 0)
            .map(([state, n]) => `${state} ${n > 0 ? 'entered' : 'left'} ${Math.abs(n)} more time(s) than ${n > 0 ? 'left' : 'entered'}`);
          expect({ alarm: a.id, unbalanced }).toEqual({ alarm: a.id, unbalanced: [] });
        }
        expect(alarms.every((a) => a.kind === 'high')).toBe(true);
        // At most one alarm of the condition is still open, and it says what the last reading said.
        const open = alarms.filter((a) => a.state !== 'normal');
        expect(open.length).toBeLessThanOrEqual(1);
        if (c.expected.activeAtEnd) expect(open.map((a) => a.condition_active)).toEqual([true]);
        else expect(open.every((a) => !a.condition_active)).toBe(true);
      }
    });

    console.log(
      `no-loss: ${total} readings in ${seconds.toFixed(1)} s; ${stats.requests} requests, ${stats.retries} retries, ` +
        `${stats.duplicatesReported} readings answered as duplicates; ` +
        `by channel ${JSON.stringify(stats.byChannel)}; kills at ` +
        `${kills.map((k) => `${k.ackedBefore} acknowledged (restart ${k.restartMs} ms)`).join(', ')}; ` +
        `${expectedRaises} crossings expected and found; ${acknowledgements} acknowledgements by the crew meanwhile`,
    );
  }, 290_000);
});
