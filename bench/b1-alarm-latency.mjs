// Benchmark 1: reading to alarm. 50 viewers in a run's room; 5 clients submit readings on the live
// channel ('readings:submit' with acknowledgement) at 200 per second in all. Each client owns one
// measurement point (high limit 130 °F, deadband 2 °F) and alternates a value above the limit (raises or
// re-activates the alarm) with one below limit − deadband (returns it to normal), so every reading changes
// an alarm and every viewer gets one 'alarm:changed' per reading. Measured: the time from a reading's
// submission to its 'alarm:changed' at each viewer. A client sends its next reading at its scheduled time,
// or when the previous one is acknowledged if that is later (per-point order stays as sent).
// Baseline: the same viewers and clients against a bare socket.io server in another process
// (bench/echo-server.mjs) that sends the same two events per reading without any work.
import { fork } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import os from 'node:os';
import { io } from 'socket.io-client';
import { BASE, context, login, log, round, sleep, stats, writeResult, cpuSecondsOf, pgCpuSeconds, SERVER_PID } from './lib.mjs';

const VIEWERS = Number(process.env.B1_VIEWERS ?? 50);
const CLIENTS = 5;
const RATE = Number(process.env.B1_RATE ?? 200); // readings per second, all clients together
const WARMUP_MS = 2_000;
const MEASURE_MS = Number(process.env.B1_SECONDS ?? 15) * 1000;
const HIGH = 130;

const ctx = context();
const runId = ctx.runs.latency;
const pointIds = [1, 2, 3, 4, 5].map((i) => ctx.engines.latency.points[`L${i}`].id);

function connect(url, token) {
  return new Promise((resolve, reject) => {
    const s = io(url, { auth: { token }, transports: ['websocket'], forceNew: true, reconnection: false });
    s.once('connect', () => resolve(s));
    s.once('connect_error', (e) => reject(new Error(`${url}: ${e.message}`)));
  });
}
const emitAck = (s, ev, body) => new Promise((resolve) => s.emit(ev, body, resolve));

/** Value of reading k of a client: even k above the limit (unique, so the raise can be recognised), odd k below. */
const valueOf = (k) => (k % 2 === 0 ? HIGH + 1 + ((k / 2) % 400) * 0.01 : HIGH - 10);
const reading = (pointId, value) => ({
  clientId: randomUUID(),
  pointId,
  value: Math.round(value * 100) / 100,
  takenAt: new Date().toISOString(),
});

async function measure(url, label, viewerToken, submitToken, serverPid) {
  const viewers = [];
  for (let v = 0; v < VIEWERS; v++) viewers.push(await connect(url, viewerToken));
  for (const s of viewers) {
    const ack = await emitAck(s, 'room:join', { room: `run:${runId}` });
    if (!ack?.ok) throw new Error(`room:join refused: ${JSON.stringify(ack)}`);
  }
  const clients = [];
  for (let c = 0; c < CLIENTS; c++) clients.push(await connect(url, submitToken));

  // Leave every point below its limit first, so the first measured reading raises.
  await Promise.all(clients.map((s, c) => emitAck(s, 'readings:submit', { runId, readings: [reading(pointIds[c], HIGH - 10)] })));
  await sleep(500);

  const sent = pointIds.map(() => []); // per client: [{ t, value, counted }]
  const latencies = [];
  const ackLatencies = [];
  let mismatched = 0;
  let otherPoint = 0;
  let readingsNew = 0;
  const counters = viewers.map(() => pointIds.map(() => 0));
  viewers.forEach((s, v) => {
    s.on('readings:new', () => readingsNew++);
    s.on('alarm:changed', (a) => {
      const now = performance.now();
      const c = pointIds.indexOf(a.pointId);
      if (c < 0) return void otherPoint++;
      const k = counters[v][c]++;
      const r = sent[c][k];
      if (!r) return void mismatched++;
      const expectRaise = k % 2 === 0;
      if (a.conditionActive !== expectRaise || (expectRaise && Math.abs(a.value - r.value) > 1e-9)) mismatched++;
      if (r.counted) latencies.push(now - r.t);
    });
  });

  const cpu0 = serverPid ? cpuSecondsOf(serverPid) : null;
  const pg0 = pgCpuSeconds();
  const perClientMs = (1000 * CLIENTS) / RATE;
  const t0 = performance.now() + 50;
  const end = t0 + WARMUP_MS + MEASURE_MS;
  let late = 0;
  let measuredSent = 0;
  const loops = clients.map(async (s, c) => {
    let prev = Promise.resolve();
    for (let k = 0; ; k++) {
      const due = t0 + (c * perClientMs) / CLIENTS + k * perClientMs;
      if (due >= end) break;
      const wait = due - performance.now();
      if (wait > 0) await sleep(wait);
      await prev;
      if (performance.now() >= end) break; // behind schedule: the achieved rate says so
      if (performance.now() - due > 5) late++;
      const value = valueOf(k);
      const t = performance.now();
      const counted = due >= t0 + WARMUP_MS;
      if (counted) measuredSent++;
      sent[c].push({ t, value: Math.round(value * 100) / 100, counted });
      prev = emitAck(s, 'readings:submit', { runId, readings: [reading(pointIds[c], value)] }).then((ack) => {
        if (!ack?.ok) throw new Error(`readings:submit refused: ${JSON.stringify(ack).slice(0, 300)}`);
        if (counted) ackLatencies.push(performance.now() - t);
      });
    }
    await prev;
  });
  await Promise.all(loops);
  const elapsedS = (performance.now() - t0) / 1000;
  await sleep(1000);
  const cpu1 = cpu0 !== null ? cpuSecondsOf(serverPid) : null;
  const pg1 = pgCpuSeconds();

  const expected = measuredSent * VIEWERS;
  for (const s of [...viewers, ...clients]) s.close();
  const lat = stats(latencies);
  const out = {
    label,
    viewers: VIEWERS,
    clients: CLIENTS,
    targetRate: RATE,
    achievedRate: round(sent.reduce((n, l) => n + l.length, 0) / elapsedS, 1),
    readingsMeasured: measuredSent,
    eventsExpected: expected,
    eventsMeasured: lat.n,
    eventsMissing: expected - lat.n,
    mismatched,
    otherPoint,
    readingsNewEvents: readingsNew,
    lateSends: late,
    serverCpuPercent: cpu0 !== null ? round(((cpu1 - cpu0) / (elapsedS + 1)) * 100, 0) : null,
    serverCpuMsPerReading: cpu0 !== null ? round(((cpu1 - cpu0) * 1000) / sent.reduce((n, l) => n + l.length, 0), 2) : null,
    postgresCpuPercent: pg0 !== null && url === BASE ? round(((pg1 - pg0) / (elapsedS + 1)) * 100, 0) : null,
    loadAvg: os.loadavg().map((x) => round(x, 1)),
    latencyMs: roundStats(lat),
    ackMs: roundStats(stats(ackLatencies)),
  };
  log(
    `${label}: alarm event at viewer median ${out.latencyMs.median} ms, p99 ${out.latencyMs.p99} ms ` +
      `(${lat.n}/${expected} events, ${mismatched} out of order, rate ${out.achievedRate}/s, ${late} late sends)`,
  );
  return out;
}

function roundStats(s) {
  return Object.fromEntries(Object.entries(s).map(([k, v]) => [k, k === 'n' ? v : round(v, 2)]));
}

// Baseline first (the service is idle meanwhile), then the service.
const echo = fork(new URL('./echo-server.mjs', import.meta.url).pathname, [String(process.env.BENCH_ECHO_PORT ?? 3291)], {
  stdio: 'inherit',
});
await new Promise((resolve, reject) => {
  echo.once('message', resolve);
  echo.once('exit', (c) => reject(new Error(`echo server ended (${c})`)));
});
let baseline;
try {
  baseline = await measure(`http://127.0.0.1:${process.env.BENCH_ECHO_PORT ?? 3291}`, 'baseline: bare socket.io echo', 'x', 'x', echo.pid);
} finally {
  echo.kill('SIGTERM');
}
const observer = await login(ctx.people.observer);
const operator = await login(ctx.people.operator);
const service = await measure(BASE, 'service: readings:submit → alarm:changed', observer, operator, SERVER_PID);

writeResult('b1', {
  title: 'Reading to alarm',
  design: { viewers: VIEWERS, clients: CLIENTS, rate: RATE, warmupMs: WARMUP_MS, measureMs: MEASURE_MS },
  service,
  baseline,
  ratio: {
    median: round(service.latencyMs.median / baseline.latencyMs.median, 2),
    p99: round(service.latencyMs.p99 / baseline.latencyMs.p99, 2),
  },
  target: { p99Ms: 25 },
  met: service.latencyMs.p99 <= 25 && service.eventsMissing === 0,
});
process.exit(0);
