// Benchmark 3: CSV import of a one-million-row logger file (taken_at, point, value: one-second logging
// of eleven points, about 25 hours), sent as the raw body of POST /api/runs/:id/imports the way the UI
// sends it. Measured: rows per second from the first byte sent to the answer, and the service's memory
// (the peak resident set of its process, read from /proc: VmHWM after resetting it, and VmRSS polled
// every 20 ms). Baseline: PostgreSQL COPY of the same file's rows into the same readings table.
import { createReadStream, createWriteStream, statSync, unlinkSync } from 'node:fs';
import { once } from 'node:events';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { pipeline } from 'node:stream/promises';
import { Transform } from 'node:stream';
import pg from 'pg';
import copyStreams from 'pg-copy-streams';
import { Agent, request } from 'undici';
import {
  BASE,
  DB_URL,
  WORK,
  SERVER_PID,
  context,
  login,
  log,
  round,
  writeResult,
  memoryOf,
  resetPeakRss,
  stats,
  rssSampler,
  cpuMark,
  cpuSince,
} from './lib.mjs';

const ROWS = Number(process.env.B3_ROWS ?? 1_000_000);
const ctx = context();
const runId = ctx.runs.csv;
const codes = ['T1', 'T2', 'T3', 'T4', 'T5', 'T6', 'T7', 'T8', 'AMB', 'SPD', 'THR'];

function valueAt(code, s) {
  const noise = Math.sin(s * 12.9898 + code.length * 78.233) * 0.2;
  if (code === 'AMB') return 70 + 5 * Math.sin((2 * Math.PI * s) / 86_400) + noise;
  if (code === 'SPD') return 74 + 0.5 * Math.sin(s / 60) + noise;
  if (code === 'THR') return 125 + 3 * Math.sin(s / 300) + noise;
  if (code === 'T8') return 130 + 35 * Math.sin((2 * Math.PI * s) / 1800) + noise;
  const n = Number(code.slice(1));
  return 100 + n * 3 + 4 * Math.sin(s / 900 + n) + noise;
}

// ---- the file ----------------------------------------------------------------------------------------
const file = join(WORK, 'tmp', 'logger-1m.csv');
const seconds = Math.ceil(ROWS / codes.length);
const start = Date.now() - (seconds + 600) * 1000;
{
  const out = createWriteStream(file);
  out.write('taken_at,point,value\n');
  let n = 0;
  let buf = '';
  for (let s = 0; n < ROWS; s++) {
    const t = new Date(start + s * 1000).toISOString();
    for (const code of codes) {
      if (n++ >= ROWS) break;
      buf += `${t},${code},${(Math.round(valueAt(code, s) * 100) / 100).toFixed(2)}\n`;
    }
    if (buf.length > 1 << 20) {
      if (!out.write(buf)) await once(out, 'drain');
      buf = '';
    }
  }
  out.end(buf);
  await once(out, 'finish');
}
const bytes = statSync(file).size;
log(`generated ${ROWS} rows (${(bytes / 1e6).toFixed(1)} MB): ${seconds} s of logging of ${codes.length} points`);

// ---- the service ---------------------------------------------------------------------------------------
const token = await login(ctx.people.operator);
const before = SERVER_PID ? memoryOf(SERVER_PID) : null;
const hwmReset = SERVER_PID ? resetPeakRss(SERVER_PID) : false;
const sampler = SERVER_PID ? rssSampler(SERVER_PID, 20) : null;
// The health route is asked every 100 ms during the import (its own connection): an import must never
// starve the live channel, so its answers have to stay quick (target p99 < 50 ms).
const healthAgent = new Agent({ connections: 1 });
const healthTimes = [];
let importing = true;
const healthPoller = (async () => {
  while (importing) {
    const h0 = performance.now();
    const h = await request(`${BASE}/api/health`, { dispatcher: healthAgent });
    await h.body.text();
    healthTimes.push(performance.now() - h0);
    await new Promise((r) => setTimeout(r, 100));
  }
})();
const cpu0 = cpuMark();
const t0 = performance.now();
const res = await request(`${BASE}/api/runs/${runId}/imports`, {
  method: 'POST',
  headers: { authorization: `Bearer ${token}`, 'content-type': 'text/csv', 'content-length': String(bytes) },
  body: createReadStream(file, { highWaterMark: 256 * 1024 }),
  dispatcher: new Agent({ headersTimeout: 0, bodyTimeout: 0 }),
});
const answer = await res.body.json();
const importSeconds = (performance.now() - t0) / 1000;
importing = false;
await healthPoller;
const health = stats(healthTimes);
const cpu = cpuSince(cpu0);
const sampled = sampler?.stop();
const after = SERVER_PID ? memoryOf(SERVER_PID) : null;
if (res.statusCode !== 201 && res.statusCode !== 200)
  throw new Error(`import refused: ${res.statusCode} ${JSON.stringify(answer).slice(0, 500)}`);
const rate = answer.stored / importSeconds;
const peakMb = Math.max(sampled?.maxMb ?? 0, hwmReset ? after.hwmMb : 0);
log(
  `service: ${Math.round(rate)} rows/s (${answer.stored} stored, ${answer.rejectedCount} refused, ` +
    `${answer.alarmsRaised} alarms in ${importSeconds.toFixed(1)} s); memory ${Math.round(before?.rssMb)} MB before, ` +
    `peak ${Math.round(peakMb)} MB; health route during it: median ${health.median?.toFixed(1)} ms, ` +
    `p99 ${health.p99?.toFixed(1)} ms (${health.n} requests)`,
);
if (answer.stored !== ROWS) throw new Error(`stored ${answer.stored} of ${ROWS}`);

// ---- baseline: COPY of the same rows into the same table (the twin engine of benchmark 2) ----------------
const twin = ctx.engines.copy;
const db = new pg.Client({ connectionString: DB_URL });
await db.connect();
const copyCpu0 = cpuMark();
const tc = performance.now();
let header = true;
let rest = '';
const toCopy = new Transform({
  transform(chunk, _enc, cb) {
    const lines = (rest + chunk.toString('utf8')).split('\n');
    rest = lines.pop();
    let out = '';
    for (const line of lines) {
      if (header) {
        header = false;
        continue;
      }
      const [t, code, v] = line.split(',');
      const p = twin.points[code];
      out += `${randomUUID()}\t${ctx.runs.copy}\t${twin.id}\t${p.id}\t${v}\t${p.unit}\t${t}\timport\n`;
    }
    cb(null, out);
  },
});
await db.query('BEGIN');
await pipeline(
  createReadStream(file),
  toCopy,
  db.query(copyStreams.from('COPY readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source) FROM STDIN')),
);
await db.query('COMMIT');
const copySeconds = (performance.now() - tc) / 1000;
const copyCpu = cpuSince(copyCpu0);
await db.end();
const copyRate = ROWS / copySeconds;
log(`baseline COPY of the same file: ${Math.round(copyRate)} rows/s (${copySeconds.toFixed(1)} s)`);
unlinkSync(file);

writeResult('b3', {
  title: 'CSV import',
  design: { rows: ROWS, bytes, points: codes.length },
  service: {
    rowsPerSecond: Math.round(rate),
    seconds: round(importSeconds, 1),
    stored: answer.stored,
    alarmsRaised: answer.alarmsRaised,
    memoryMb: {
      before: round(before?.rssMb, 0),
      peak: round(peakMb, 0),
      polledMax: round(sampled?.maxMb, 0),
      vmHwm: hwmReset ? round(after.hwmMb, 0) : null,
      after: round(after?.rssMb, 0),
      samples: sampled?.samples ?? 0,
      hwmReset,
    },
    cpu,
    cpuMsPer1000: { service: round((cpu.serviceCpuSeconds / ROWS) * 1e6, 0), postgres: round((cpu.pgCpuSeconds / ROWS) * 1e6, 0) },
    cpuBoundRateOn2Cores: Math.round((2 * ROWS) / (cpu.serviceCpuSeconds + cpu.pgCpuSeconds)),
    health: { n: health.n, medianMs: round(health.median, 1), p99Ms: round(health.p99, 1), maxMs: round(health.max, 1) },
  },
  baseline: { rowsPerSecond: Math.round(copyRate), seconds: round(copySeconds, 1), cpu: copyCpu },
  ratio: round(rate / copyRate, 2),
  target: { ratio: 0.6, rowsPerSecond: 50_000, peakMemoryMb: 300, healthP99Ms: 50 },
  met: { ratio: rate / copyRate >= 0.6, throughput: rate >= 50_000, memory: peakMb <= 300, health: (health.p99 ?? Infinity) < 50 },
});
process.exit(0);
