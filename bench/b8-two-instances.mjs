// Benchmark 8: reading to alarm with 500 viewers spread over two service instances (the open-day case). Two
// instances of the built service on one database; half the viewers in the run's room on each. One client
// submits readings on the live channel of instance A at B7_RATE per second, alternating a value above the point's
// high limit (raises or re-activates the alarm) with one below limit − deadband (returns it to normal), so every
// reading sends one 'alarm:changed' to every viewer, those on B through socket.io's PostgreSQL adapter.
// Measured: submission to 'alarm:changed' at each viewer. Baseline: the same viewers and client against two bare
// socket.io servers joined by the same adapter (bench/echo-server-pg.mjs).
//
// Standalone (not part of bench/run.sh): DATABASE_URL of a migrated database, JWT_SECRET, and free ports:
//   DATABASE_URL=… JWT_SECRET=… SMTP_PORT=… S3_ENDPOINT=… node bench/b8-two-instances.mjs
// Writes .data/bench/results/b8.json (BENCH_WORK to change the folder); bench/report.mjs then rewrites section 8.
import { fork, spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import jwt from 'jsonwebtoken';
import pg from 'pg';
import { io } from 'socket.io-client';
import { ROOT, round, sleep, stats, writeResult } from './lib.mjs';

const VIEWERS = Number(process.env.B7_VIEWERS ?? 500);
const RATE = Number(process.env.B7_RATE ?? 20);
const WARMUP_MS = 2_000;
const MEASURE_MS = Number(process.env.B7_SECONDS ?? 15) * 1000;
const DB = process.env.DATABASE_URL;
const SECRET = process.env.JWT_SECRET;
if (!DB || !SECRET) throw new Error('set DATABASE_URL (a migrated database) and JWT_SECRET');

const freePort = () =>
  new Promise((res, rej) => {
    const s = createServer();
    s.on('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const p = s.address().port;
      s.close(() => res(p));
    });
  });

async function waitHealthy(url) {
  for (let i = 0; i < 600; i++) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      /* not yet */
    }
    await sleep(100);
  }
  throw new Error(`${url} did not start`);
}

function startInstance(port) {
  const child = spawn(process.execPath, ['dist/main.js'], {
    cwd: `${ROOT}/service`,
    env: { ...process.env, NODE_OPTIONS: '', PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'silent', UI_DIST: '/nonexistent' },
    stdio: 'ignore',
  });
  return child;
}

function startEcho(port) {
  const child = fork(new URL('./echo-server-pg.mjs', import.meta.url).pathname, [String(port), DB], { stdio: 'inherit' });
  return new Promise((res, rej) => {
    child.once('message', () => res(child));
    child.once('exit', (c) => rej(new Error(`echo server ended (${c})`)));
  });
}

function connect(url, token) {
  return new Promise((resolve, reject) => {
    const s = io(url, { auth: { token }, transports: ['websocket'], forceNew: true, reconnection: false });
    s.once('connect', () => resolve(s));
    s.once('connect_error', (e) => reject(new Error(`${url}: ${e.message}`)));
  });
}
const emitAck = (s, ev, body) => new Promise((resolve) => s.emit(ev, body, resolve));
const valueOf = (k) => (k % 2 === 0 ? 51 + (k % 400) * 0.01 : 40);

async function measure(label, urls, token, runId, pointId) {
  const viewers = [];
  for (let v = 0; v < VIEWERS; v++) {
    const s = await connect(urls[v % urls.length], token);
    const ack = await emitAck(s, 'room:join', { room: `run:${runId}` });
    if (!ack?.ok) throw new Error(`room:join refused: ${JSON.stringify(ack)}`);
    viewers.push(s);
  }
  const client = await connect(urls[0], token);
  await emitAck(client, 'readings:submit', {
    runId,
    readings: [{ clientId: randomUUID(), pointId, value: 40, takenAt: new Date().toISOString() }],
  });
  await sleep(1000);
  const sent = [];
  const latencies = [[], []];
  const counters = viewers.map(() => 0);
  viewers.forEach((s, v) => {
    s.on('alarm:changed', (a) => {
      if (a.pointId !== pointId) return;
      const now = performance.now();
      const r = sent[counters[v]++];
      if (r?.counted) latencies[v % urls.length].push(now - r.t);
    });
  });
  const t0 = performance.now() + 50;
  const end = t0 + WARMUP_MS + MEASURE_MS;
  let measured = 0;
  for (let k = 0; ; k++) {
    const due = t0 + (k * 1000) / RATE;
    if (due >= end) break;
    const wait = due - performance.now();
    if (wait > 0) await sleep(wait);
    const counted = due >= t0 + WARMUP_MS;
    if (counted) measured++;
    const value = Math.round(valueOf(k) * 100) / 100;
    sent.push({ t: performance.now(), counted });
    const ack = await emitAck(client, 'readings:submit', {
      runId,
      readings: [{ clientId: randomUUID(), pointId, value, takenAt: new Date().toISOString() }],
    });
    if (!ack?.ok) throw new Error(`readings:submit refused: ${JSON.stringify(ack).slice(0, 300)}`);
  }
  await sleep(2000);
  for (const s of [...viewers, client]) s.close();
  const all = stats([...latencies[0], ...latencies[1]]);
  const out = {
    label,
    viewers: VIEWERS,
    rate: RATE,
    eventsExpected: measured * VIEWERS,
    eventsMeasured: all.n,
    latencyMs: { median: round(all.median, 1), p99: round(all.p99, 1), max: round(all.max, 1) },
    sameInstanceP99: round(stats(latencies[0]).p99, 1),
    otherInstanceP99: round(stats(latencies[1]).p99, 1),
    loadAvg: os.loadavg().map((x) => round(x, 1)),
  };
  console.log(JSON.stringify(out));
  return out;
}

// People, an engine and a run, straight into the database; tokens signed like the service signs them.
const db = new pg.Client({ connectionString: DB });
await db.connect();
const add = async (role) =>
  (
    await db.query(`INSERT INTO users (email, display_name, role, active) VALUES ($1, $2, $3, true) RETURNING id`, [
      `${role}-${randomUUID()}@bench.crankjournal.test`,
      `Bench ${role}`,
      role,
    ])
  ).rows[0].id;
const operator = jwt.sign({ sub: await add('operator'), role: 'operator' }, SECRET, { expiresIn: 3600 });
const chief = jwt.sign({ sub: await add('chief_engineer'), role: 'chief_engineer' }, SECRET, { expiresIn: 3600 });
await db.end();

const [pa, pb, ea, eb] = [await freePort(), await freePort(), await freePort(), await freePort()];
const echoes = [await startEcho(ea), await startEcho(eb)];
let baseline;
try {
  baseline = await measure(
    'baseline: two bare socket.io servers, same adapter',
    [`http://127.0.0.1:${ea}`, `http://127.0.0.1:${eb}`],
    'x',
    'r1',
    'p1',
  );
} finally {
  for (const e of echoes) e.kill('SIGTERM');
}
const instances = [startInstance(pa), startInstance(pb)];
try {
  const [a, b] = [`http://127.0.0.1:${pa}`, `http://127.0.0.1:${pb}`];
  await Promise.all([waitHealthy(a), waitHealthy(b)]);
  const call = async (path, token, body) => {
    const res = await fetch(a + path, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`);
    return res.json();
  };
  const engine = await call('/api/engines', chief, {
    name: `Bench open day ${randomUUID().slice(0, 6)}`,
    builder: '',
    yearBuilt: '',
    type: 'simple',
    ratedSpeedRpm: 60,
    overspeedRpm: 70,
    mawpPsig: 120,
    preLubeFreshnessMinutes: 30,
    cylinders: [],
    lubricationPoints: [],
    bearings: [],
    measurementPoints: [
      { code: 'OILP', label: 'Main oil pressure', kind: 'oil_pressure', unit: 'psig', sequence: 1, highLimit: 50, deadband: 2 },
    ],
  });
  const run = await call('/api/runs', operator, { engineId: engine.id, purpose: 'test', title: 'Open day' });
  await call(`/api/runs/${run.id}/transitions`, operator, { to: 'preparing' });
  const service = await measure('service: two instances', [a, b], operator, run.id, engine.measurementPoints[0].id);
  const ratio = {
    median: round(service.latencyMs.median / baseline.latencyMs.median, 1),
    p99: round(service.latencyMs.p99 / baseline.latencyMs.p99, 1),
  };
  console.log(JSON.stringify({ ratio }));
  writeResult('b8', { design: { viewers: VIEWERS, rate: RATE, warmupMs: WARMUP_MS, measureMs: MEASURE_MS }, baseline, service, ratio });
} finally {
  for (const i of instances) i.kill('SIGTERM');
}
process.exit(0);
