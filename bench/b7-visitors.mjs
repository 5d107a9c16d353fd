// Benchmark 7: a visitor board with 500 visitors. An engine and a running run of the bench's own, a visitor board
// switched on for it, and VISITORS socket.io clients on the public /visit namespace (one board). The chief engineer
// submits one speed reading every SUBMIT_EVERY_MS through the REST rounds route. Measured: the time from a reading's
// arrival (the round's answer) to the first `visit:figures` showing it at each visitor: the board's designed delay
// (VISIT_DELAY_SECONDS) plus up to one figures period (2 s) plus the work and the fan-out. Each reading is stamped
// 20 s after the previous one, so the smoothing window (15 s) holds that reading alone and its value shows as sent.
// Also measured: the service's CPU time per second with the visitors connected and the readings coming, against
// the same window with no visitor connected; the difference per visitor is the cost of one visitor.
// One service instance: running several instances is not part of this build.
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { io } from 'socket.io-client';
import { BASE, api, context, cpuSecondsOf, log, round, sleep, stats, writeResult, SERVER_PID } from './lib.mjs';

const VISITORS = Number(process.env.B7_VISITORS ?? 500);
const SUBMISSIONS = Number(process.env.B7_SUBMISSIONS ?? 12);
const SUBMIT_EVERY_MS = 3_000;
const CPU_WINDOW_MS = 20_000;
const DELAY_SECONDS = Number(process.env.VISIT_DELAY_SECONDS ?? 5);

const ctx = context();
const chief = ctx.tokens.chief;
const day = (d) => d.toISOString().slice(0, 10);

// An engine, a qualification to start it, a run taken to running by the normal transitions, and its board.
const tag = Date.now().toString(36);
const engine = await api('/api/engines', {
  method: 'POST',
  token: chief,
  body: {
    name: `Visitor bench engine ${tag}`,
    builder: 'bench',
    yearBuilt: '1905',
    type: 'simple',
    ratedSpeedRpm: 75,
    overspeedRpm: 82,
    mawpPsig: 150,
    preLubeFreshnessMinutes: 30,
    cylinders: [{ label: 'C1', role: 'single', boreIn: 24, strokeIn: 48, pistonRodIn: 5, tailRodIn: 0, clearancePercent: 6 }],
    lubricationPoints: [],
    bearings: [],
    measurementPoints: [{ code: 'SPD', label: 'Speed', kind: 'speed', unit: 'rpm', sequence: 1 }],
  },
});
const me = await api('/api/auth/me', { token: chief });
await api('/api/qualifications', {
  method: 'POST',
  token: chief,
  body: {
    userId: me.id,
    engineId: engine.id,
    duty: 'start_and_run',
    grantedOn: day(new Date(Date.now() - 86_400_000)),
    expiresOn: day(new Date(Date.now() + 300 * 86_400_000)),
  },
});
const run = await api('/api/runs', {
  method: 'POST',
  token: chief,
  body: { engineId: engine.id, purpose: 'demonstration', title: `Bench ${tag}` },
});
for (const to of ['preparing', 'cleared', 'running'])
  await api(`/api/runs/${run.id}/transitions`, { method: 'POST', token: chief, body: { to } });
const board = await api('/api/visitor-boards', { method: 'POST', token: chief, body: { runId: run.id } });
const speedPoint = engine.measurementPoints.find((p) => p.code === 'SPD').id;

function connect() {
  return new Promise((resolve, reject) => {
    const s = io(`${BASE}/visit`, { auth: { slug: board.slug }, transports: ['websocket'], forceNew: true, reconnection: false });
    s.once('connect', () => resolve(s));
    s.once('connect_error', (e) => reject(new Error(`visitor: ${e.message}`)));
  });
}

async function cpuPerSecond(ms) {
  const a = cpuSecondsOf(SERVER_PID);
  await sleep(ms);
  return (cpuSecondsOf(SERVER_PID) - a) / (ms / 1000);
}

let takenAtMs = Date.now();
let k = 0;
/** One reading through the rounds route; resolves with its arrival time (the answer) and its value. */
async function submit() {
  k++;
  takenAtMs += 20_000;
  const value = 60 + k * 0.5;
  const takenAt = new Date(takenAtMs).toISOString();
  await api(`/api/runs/${run.id}/rounds`, {
    method: 'POST',
    token: chief,
    body: { takenAt, readings: [{ clientId: randomUUID(), pointId: speedPoint, value, takenAt }] },
  });
  return { value, arrived: performance.now() };
}

// The idle cost first: the same readings, no visitor.
const idleCpu = SERVER_PID
  ? await (async () => {
      const timer = setInterval(() => void submit(), SUBMIT_EVERY_MS);
      const c = await cpuPerSecond(CPU_WINDOW_MS);
      clearInterval(timer);
      return c;
    })()
  : null;

const visitors = [];
const connectStart = performance.now();
for (let i = 0; i < VISITORS; i += 50) visitors.push(...(await Promise.all(Array.from({ length: Math.min(50, VISITORS - i) }, connect))));
const connectMs = performance.now() - connectStart;
log(`b7: ${visitors.length} visitors connected in ${round(connectMs, 0)} ms`);

const pending = new Map(); // value → arrival time
const seen = visitors.map(() => new Set());
const delays = [];
visitors.forEach((s, i) =>
  s.on('visit:figures', (f) => {
    const at = pending.get(f.speedRpm);
    if (at === undefined || seen[i].has(f.speedRpm)) return;
    seen[i].add(f.speedRpm);
    delays.push(performance.now() - at);
  }),
);
await sleep(3_000);

const loadedCpuPromise = SERVER_PID ? cpuPerSecond(Math.min(CPU_WINDOW_MS, SUBMISSIONS * SUBMIT_EVERY_MS)) : Promise.resolve(null);
for (let n = 0; n < SUBMISSIONS; n++) {
  const { value, arrived } = await submit();
  pending.set(value, arrived);
  await sleep(SUBMIT_EVERY_MS);
}
const loadedCpu = await loadedCpuPromise;
await sleep((DELAY_SECONDS + 4) * 1000);
for (const s of visitors) s.disconnect();

const expected = VISITORS * SUBMISSIONS;
const s = stats(delays);
const result = {
  visitors: VISITORS,
  submissions: SUBMISSIONS,
  delaySeconds: DELAY_SECONDS,
  instances: 1,
  connectMs: round(connectMs, 0),
  updates: { measured: delays.length, missing: expected - delays.length },
  delayMs: { median: round(s.median, 0), p90: round(s.p90, 0), p99: round(s.p99, 0), max: round(s.max, 0) },
  beyondDesignedDelayMs: { median: round(s.median - DELAY_SECONDS * 1000, 0), p99: round(s.p99 - DELAY_SECONDS * 1000, 0) },
  cpu: {
    idleSecondsPerSecond: round(idleCpu, 3),
    loadedSecondsPerSecond: round(loadedCpu, 3),
    msPerSecondPerVisitor: idleCpu === null || loadedCpu === null ? null : round(((loadedCpu - idleCpu) * 1000) / VISITORS, 3),
  },
};
log(
  `b7: ${result.updates.measured} updates (${result.updates.missing} missing): median ${result.delayMs.median} ms, ` +
    `p99 ${result.delayMs.p99} ms; CPU ${result.cpu.msPerSecondPerVisitor} ms/s per visitor`,
);
writeResult('b7', result);
process.exit(0);
