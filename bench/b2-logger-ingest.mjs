// Benchmark 2: logger ingestion. A data logger's sustained batch push (POST /api/logger/readings with
// its x-logger-key, 20,000 readings per batch, two batches in flight) of one-second logging of eleven
// points (eight bearing temperatures with high, high-high, rate-of-rise and above-ambient limits, ambient,
// speed and steam pressure; one bearing swings through its high limit so alarms raise and clear). Every
// reading goes the whole way: row checks, INSERT once per client id, alarm evaluation in the same
// transaction, broadcast. Baseline: PostgreSQL COPY of the same rows (new client ids) into the same
// readings table (of a twin engine and run, so they do not mix with the service's), in COPY statements
// of the same size, one transaction each. The CPU time of the service and of PostgreSQL is recorded too:
// on a shared machine it says what the same work needs whatever else is running.
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import pg from 'pg';
import copyStreams from 'pg-copy-streams';
import { BASE, DB_URL, context, log, round, stats, writeResult, cpuMark, cpuSince } from './lib.mjs';

const BATCH = 20_000;
const BATCHES = Number(process.env.B2_BATCHES ?? 16);
const IN_FLIGHT = Number(process.env.B2_IN_FLIGHT ?? 2);
const ctx = context();
const eng = ctx.engines.ingest;
const runId = ctx.runs.ingest;
const twin = ctx.engines.copy;
const twinRun = ctx.runs.copy;
const codes = ['T1', 'T2', 'T3', 'T4', 'T5', 'T6', 'T7', 'T8', 'AMB', 'SPD', 'THR'];

/** Value of point `code` at second `s` of the recording (°F, rpm, psig). */
function valueAt(code, s) {
  const noise = Math.sin(s * 12.9898 + code.length * 78.233) * 0.2;
  if (code === 'AMB') return 70 + 5 * Math.sin((2 * Math.PI * s) / 86_400) + noise;
  if (code === 'SPD') return 74 + 0.5 * Math.sin(s / 60) + noise;
  if (code === 'THR') return 125 + 3 * Math.sin(s / 300) + noise;
  if (code === 'T8') return 130 + 35 * Math.sin((2 * Math.PI * s) / 1800) + noise; // crosses 160 every half hour
  const n = Number(code.slice(1));
  return 100 + n * 3 + 4 * Math.sin(s / 900 + n) + noise;
}

const total = BATCH * BATCHES;
const seconds = Math.ceil(total / codes.length);
const start = Date.now() - (seconds + 600) * 1000; // ends ten minutes ago
const rows = [];
for (let s = 0; rows.length < total; s++) {
  const takenAt = new Date(start + s * 1000).toISOString();
  for (const code of codes) {
    if (rows.length >= total) break;
    rows.push({ code, value: Math.round(valueAt(code, s) * 100) / 100, takenAt });
  }
}
log(`generated ${rows.length} readings: ${seconds} s of logging of ${codes.length} points`);

// ---- baseline: COPY -------------------------------------------------------------------------------
const db = new pg.Client({ connectionString: DB_URL });
await db.connect();
const copyBodies = [];
for (let b = 0; b < BATCHES; b++) {
  const slice = rows.slice(b * BATCH, (b + 1) * BATCH);
  copyBodies.push(
    slice
      .map(
        (r) =>
          `${randomUUID()}\t${twinRun}\t${twin.id}\t${twin.points[r.code].id}\t${r.value}\t` +
          `${twin.points[r.code].unit}\t${r.takenAt}\tlogger\t${ctx.loggerId}\n`,
      )
      .join(''),
  );
}
const copyBatchMs = [];
const copyCpu0 = cpuMark();
const tCopy0 = performance.now();
for (let b = 0; b < BATCHES; b++) {
  const t = performance.now();
  await db.query('BEGIN');
  await pipeline(
    Readable.from([copyBodies[b]]),
    db.query(
      copyStreams.from('COPY readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source, logger_id) FROM STDIN'),
    ),
  );
  await db.query('COMMIT');
  copyBatchMs.push(performance.now() - t);
}
const copySeconds = (performance.now() - tCopy0) / 1000;
const copyCpu = cpuSince(copyCpu0);
const copyRate = total / copySeconds;
log(`baseline COPY: ${Math.round(copyRate)} rows/s (${BATCHES} × ${BATCH} rows in ${copySeconds.toFixed(1)} s)`);

// ---- the service: logger batch push ----------------------------------------------------------------
const bodies = [];
for (let b = 0; b < BATCHES; b++) {
  const readings = rows
    .slice(b * BATCH, (b + 1) * BATCH)
    .map((r) => ({ clientId: randomUUID(), pointCode: r.code, value: r.value, takenAt: r.takenAt }));
  bodies.push(JSON.stringify({ runId, readings }));
}
log(`request body: ${(bodies[0].length / 1e6).toFixed(1)} MB per batch of ${BATCH}`);
const [{ n: alarms0 }] = (
  await db.query(`SELECT count(*)::int AS n FROM alarm_events e JOIN alarms a ON a.id = e.alarm_id WHERE a.engine_id = $1`, [eng.id])
).rows;

const pushMs = [];
let stored = 0;
let raised = 0;
let next = 0;
const cpu0 = cpuMark();
const t0 = performance.now();
async function pusher() {
  while (next < BATCHES) {
    const body = bodies[next++];
    const t = performance.now();
    const res = await fetch(`${BASE}/api/logger/readings`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-logger-key': ctx.loggerKey },
      body,
    });
    const out = await res.json();
    if (!res.ok) throw new Error(`push refused: ${res.status} ${JSON.stringify(out).slice(0, 400)}`);
    pushMs.push(performance.now() - t);
    stored += out.stored;
    raised += out.alarmsRaised;
  }
}
await Promise.all(Array.from({ length: IN_FLIGHT }, pusher));
const pushSeconds = (performance.now() - t0) / 1000;
const cpu = cpuSince(cpu0);
const rate = stored / pushSeconds;
const [{ n: alarms1 }] = (
  await db.query(`SELECT count(*)::int AS n FROM alarm_events e JOIN alarms a ON a.id = e.alarm_id WHERE a.engine_id = $1`, [eng.id])
).rows;
await db.end();
log(
  `service: ${Math.round(rate)} readings/s (${stored} stored in ${pushSeconds.toFixed(1)} s, ${raised} alarms raised, ` +
    `${alarms1 - alarms0} alarm events)`,
);
if (stored !== total) throw new Error(`stored ${stored} of ${total}`);

const pushStats = stats(pushMs);
const copyStats = stats(copyBatchMs);
writeResult('b2', {
  title: 'Logger ingestion',
  design: { batch: BATCH, batches: BATCHES, inFlight: IN_FLIGHT, points: codes.length, readings: total },
  service: {
    readingsPerSecond: Math.round(rate),
    seconds: round(pushSeconds, 2),
    stored,
    alarmsRaised: raised,
    alarmEvents: alarms1 - alarms0,
    batchMs: { n: pushStats.n, median: round(pushStats.median, 0), p99: round(pushStats.p99, 0) },
    perBatchRate: { median: Math.round(BATCH / (pushStats.median / 1000)), p99: Math.round(BATCH / (pushStats.p99 / 1000)) },
    cpu,
    cpuMsPer1000: { service: round((cpu.serviceCpuSeconds / stored) * 1e6, 0), postgres: round((cpu.pgCpuSeconds / stored) * 1e6, 0) },
    cpuBoundRateOn2Cores: Math.round((2 * stored) / (cpu.serviceCpuSeconds + cpu.pgCpuSeconds)),
  },
  baseline: {
    rowsPerSecond: Math.round(copyRate),
    seconds: round(copySeconds, 2),
    batchMs: { n: copyStats.n, median: round(copyStats.median, 0), p99: round(copyStats.p99, 0) },
    perBatchRate: { median: Math.round(BATCH / (copyStats.median / 1000)), p99: Math.round(BATCH / (copyStats.p99 / 1000)) },
    cpu: copyCpu,
    cpuMsPer1000: { postgres: round((copyCpu.pgCpuSeconds / total) * 1e6, 0) },
    cpuBoundRateOn2Cores: Math.round((2 * total) / copyCpu.pgCpuSeconds),
  },
  ratio: round(rate / copyRate, 2),
  target: { readingsPerSecond: 20_000, ratio: 0.3 },
  met: rate >= 20_000 && rate / copyRate >= 0.3,
});
process.exit(0);
