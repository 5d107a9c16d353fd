// Benchmark 7: a visitor board with 500 visitors over two service instances. An engine and a running run of the
// bench's own, a visitor board switched on for it, and VISITORS socket.io clients on the public /visit namespace (one
// board), alternately on instance A (BENCH_BASE_URL) and instance B (BENCH_BASE2_URL, a second process of the built
// service on the same database, started by bench/run.sh). The chief engineer submits one speed reading every
// SUBMIT_EVERY_MS through the REST rounds route of instance A. Every instance sends the figures to its own visitors
// (the visit module's timer, every 2 s, from the database), so a reading stored through A reaches B's visitors
// through the database, with no message between the instances. Measured: the time from a reading's arrival (the
// round's answer) to the first `visit:figures` showing it at each visitor, for all and per instance: the board's
// designed delay (VISIT_DELAY_SECONDS) plus up to one figures period (2 s) plus the work and the fan-out. Each
// measured reading is stamped STEP_MS after the previous one (see submit).
// Also measured: each instance's CPU time per second with its visitors connected and the readings coming, against a
// window of the same length with the same readings and no visitor connected; the difference per visitor of that
// instance is the cost of one visitor. Without BENCH_BASE2_URL all visitors go to the one instance.
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { io } from 'socket.io-client';
import { BASE, api, context, cpuSecondsOf, log, round, sleep, stats, writeResult, SERVER_PID } from './lib.mjs';

/** The instances: A takes the readings; B (when given) only serves visitors. */
const INSTANCES = [{ name: 'A', base: BASE, pid: SERVER_PID }];
if (process.env.BENCH_BASE2_URL)
  INSTANCES.push({ name: 'B', base: process.env.BENCH_BASE2_URL, pid: Number(process.env.BENCH_SERVER2_PID ?? 0) || null });
const HAVE_PIDS = INSTANCES.every((x) => x.pid);

const VISITORS = Number(process.env.B7_VISITORS ?? 500);
const SUBMISSIONS = Number(process.env.B7_SUBMISSIONS ?? 12);
const SUBMIT_EVERY_MS = 5_000;
/** Between the stamps of two measured readings: more than the smoothing window (15 s). */
const STEP_MS = 16_000;
/**
 * The CPU windows, with and without visitors: the same length, the same readings. CPU time is counted in 10 ms ticks,
 * so a long window keeps the per-visitor figure from being a handful of ticks.
 */
const CPU_WINDOW_MS = Math.min(60_000, SUBMISSIONS * SUBMIT_EVERY_MS);
/** CPU per visitor is good to about this (ms/s): one tick either way in each of the two windows, over `visitors`. */
const tickResolution = (visitors) => round((2 * 10) / (CPU_WINDOW_MS / 1000) / visitors, 4);
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

function connect(base) {
  return new Promise((resolve, reject) => {
    const s = io(`${base}/visit`, { auth: { slug: board.slug }, transports: ['websocket'], forceNew: true, reconnection: false });
    s.once('connect', () => resolve(s));
    s.once('connect_error', (e) => reject(new Error(`visitor: ${e.message}`)));
  });
}

/** Each instance's CPU seconds per second of wall time over `ms`. */
async function cpuPerSecond(ms) {
  const a = INSTANCES.map((x) => cpuSecondsOf(x.pid));
  const t0 = performance.now();
  await sleep(ms);
  const seconds = (performance.now() - t0) / 1000;
  return INSTANCES.map((x, i) => (cpuSecondsOf(x.pid) - a[i]) / seconds);
}

let takenAtMs = Date.now();
let k = 0;
/**
 * One reading through the rounds route; resolves with its arrival time (the answer) and its value. A measured
 * reading is stamped STEP_MS after the one before, so the smoothing window (15 s) holds it alone and the visitors see
 * its value as sent; the readings of the window without visitors are stamped as they are sent (the service takes
 * readings up to 5 minutes ahead of its clock, which the measured ones, gaining STEP_MS − SUBMIT_EVERY_MS each,
 * stay within).
 */
async function submit({ measured }) {
  k++;
  takenAtMs = measured ? takenAtMs + STEP_MS : Math.max(takenAtMs + 1, Date.now());
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
const idleCpu = HAVE_PIDS
  ? await (async () => {
      const timer = setInterval(() => void submit({ measured: false }), SUBMIT_EVERY_MS);
      const c = await cpuPerSecond(CPU_WINDOW_MS);
      clearInterval(timer);
      return c;
    })()
  : null;

// Visitor v is on instance v % INSTANCES.length: half on each.
const instanceOf = (v) => v % INSTANCES.length;
const visitors = [];
const connectStart = performance.now();
for (let i = 0; i < VISITORS; i += 50)
  visitors.push(
    ...(await Promise.all(Array.from({ length: Math.min(50, VISITORS - i) }, (_x, j) => connect(INSTANCES[instanceOf(i + j)].base)))),
  );
const connectMs = performance.now() - connectStart;
const onInstance = INSTANCES.map((_x, i) => visitors.filter((_s, v) => instanceOf(v) === i).length);
log(`b7: ${visitors.length} visitors (${onInstance.join(' + ')}) connected in ${round(connectMs, 0)} ms`);

const pending = new Map(); // value → arrival time
const seen = visitors.map(() => new Set());
const delays = INSTANCES.map(() => []); // per instance
visitors.forEach((s, v) =>
  s.on('visit:figures', (f) => {
    const at = pending.get(f.speedRpm);
    if (at === undefined || seen[v].has(f.speedRpm)) return;
    seen[v].add(f.speedRpm);
    delays[instanceOf(v)].push(performance.now() - at);
  }),
);
await sleep(3_000);

const loadedCpuPromise = HAVE_PIDS ? cpuPerSecond(CPU_WINDOW_MS) : Promise.resolve(null);
for (let n = 0; n < SUBMISSIONS; n++) {
  const { value, arrived } = await submit({ measured: true });
  pending.set(value, arrived);
  await sleep(SUBMIT_EVERY_MS);
}
const loadedCpu = await loadedCpuPromise;
await sleep((DELAY_SECONDS + 4) * 1000);
for (const s of visitors) s.disconnect();

const ms = (x) => round(x, 0);
const delayFigures = (list) => {
  const st = stats(list);
  return { median: ms(st.median), p90: ms(st.p90), p99: ms(st.p99), max: ms(st.max) };
};
const all = [].concat(...delays);
const s = stats(all);
const cpuOf = (i) => {
  const idle = idleCpu?.[i] ?? null;
  const loaded = loadedCpu?.[i] ?? null;
  return {
    idleSecondsPerSecond: round(idle, 3),
    loadedSecondsPerSecond: round(loaded, 3),
    msPerSecondPerVisitor: idle === null || loaded === null ? null : round(((loaded - idle) * 1000) / onInstance[i], 3),
    resolutionMsPerSecondPerVisitor: tickResolution(onInstance[i]),
  };
};
const perInstance = INSTANCES.map((x, i) => ({
  name: x.name,
  takesReadings: i === 0,
  visitors: onInstance[i],
  updates: { measured: delays[i].length, missing: onInstance[i] * SUBMISSIONS - delays[i].length },
  delayMs: delayFigures(delays[i]),
  cpu: cpuOf(i),
}));
const sum = (xs) => (xs.some((x) => x === null) ? null : xs.reduce((a, b) => a + b, 0));
const idleAll = idleCpu ? sum(idleCpu) : null;
const loadedAll = loadedCpu ? sum(loadedCpu) : null;
const result = {
  visitors: VISITORS,
  submissions: SUBMISSIONS,
  submitEveryMs: SUBMIT_EVERY_MS,
  cpuWindowMs: CPU_WINDOW_MS,
  delaySeconds: DELAY_SECONDS,
  instances: INSTANCES.length,
  connectMs: ms(connectMs),
  updates: { measured: all.length, missing: VISITORS * SUBMISSIONS - all.length },
  delayMs: delayFigures(all),
  beyondDesignedDelayMs: { median: ms(s.median - DELAY_SECONDS * 1000), p99: ms(s.p99 - DELAY_SECONDS * 1000) },
  perInstance,
  cpu: {
    idleSecondsPerSecond: round(idleAll, 3),
    loadedSecondsPerSecond: round(loadedAll, 3),
    msPerSecondPerVisitor: idleAll === null || loadedAll === null ? null : round(((loadedAll - idleAll) * 1000) / VISITORS, 3),
    // Two processes: up to a tick either way on each, in each window.
    resolutionMsPerSecondPerVisitor: tickResolution(VISITORS / INSTANCES.length),
  },
};
log(
  `b7: ${result.updates.measured} updates (${result.updates.missing} missing): median ${result.delayMs.median} ms, ` +
    `p99 ${result.delayMs.p99} ms; CPU ${result.cpu.msPerSecondPerVisitor} ms/s per visitor`,
);
for (const x of perInstance)
  log(
    `b7: instance ${x.name}: ${x.visitors} visitors, ${x.updates.measured} updates (${x.updates.missing} missing), ` +
      `median ${x.delayMs.median} ms, p99 ${x.delayMs.p99} ms; CPU ${x.cpu.idleSecondsPerSecond} → ` +
      `${x.cpu.loadedSecondsPerSecond} s/s, ${x.cpu.msPerSecondPerVisitor} ms/s per visitor`,
  );
writeResult('b7', result);
process.exit(0);
