// Writes BENCHMARKS.md from the results of the benchmarks (.data/bench/results/*.json).
import { writeFileSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, WORK, machine, readResult } from './lib.mjs';

const seconds = Number(process.argv[process.argv.indexOf('--seconds') + 1]) || null;
const m = machine();
const pgVersion = process.env.BENCH_PG_VERSION ?? 'unknown';
const b1 = readResult('b1');
const b2 = readResult('b2');
const b3 = readResult('b3');
const b4 = readResult('b4');
const b4d = readResult('b4-data');
const b5 = readResult('b5');
const b6 = readResult('b6');
const b7 = readResult('b7');
const failed = (n) =>
  existsSync(join(WORK, 'results', `b${n}.failed.json`))
    ? JSON.parse(readFileSync(join(WORK, 'results', `b${n}.failed.json`), 'utf8'))
    : null;

const fmt = (x, d = 0) =>
  x === null || x === undefined || Number.isNaN(x)
    ? '—'
    : Number(x).toLocaleString('en-GB', { minimumFractionDigits: d, maximumFractionDigits: d });
const kb = (b) => fmt(b / 1024, 1);
const yes = (ok) => (ok ? '**met**' : '**missed**');
const when = (r) => (r ? `${r.measuredAt.replace('T', ' ').slice(0, 16)} UTC, load average ${r.loadAvg?.join(' / ') ?? '—'}` : 'not run');
const newest = Math.max(...[b1, b2, b3, b4, b5, b6, b7].filter(Boolean).map((r) => Date.parse(r.measuredAt)));
const stale = (r) =>
  r && seconds && newest - Date.parse(r.measuredAt) > (seconds + 120) * 1000 ? ' (from an earlier run of the command)' : '';

const rows = [];
if (b1)
  rows.push([
    '1. Reading to alarm (50 viewers, 200 readings/s)',
    `${fmt(b1.service.latencyMs.median, 1)} ms`,
    `${fmt(b1.service.latencyMs.p99, 1)} ms`,
    `socket.io echo: ${fmt(b1.baseline.latencyMs.median, 1)} / ${fmt(b1.baseline.latencyMs.p99, 1)} ms`,
    `×${fmt(b1.ratio.median, 1)} / ×${fmt(b1.ratio.p99, 1)}`,
    'p99 ≤ 3 × echo p99',
    b1.service.latencyMs.p99 ? yes(b1.ratio.p99 <= 3) : '**missed** (nothing measured: see 1)',
  ]);
if (b2)
  rows.push([
    '2. Logger ingestion (20,000-row batches, alarms evaluated)',
    `${fmt(b2.service.readingsPerSecond)} readings/s (batch: ${fmt(b2.service.perBatchRate.median)})`,
    `slowest batch: ${fmt(b2.service.perBatchRate.p99)}/s`,
    `COPY: ${fmt(b2.baseline.rowsPerSecond)} rows/s`,
    `${fmt(b2.ratio, 2)}`,
    'ratio ≥ 0.7',
    yes(b2.ratio >= 0.7),
  ]);
if (b3)
  rows.push([
    '3. CSV import, 1,000,000 rows',
    `${fmt(b3.service.rowsPerSecond)} rows/s; peak ${fmt(b3.service.memoryMb.peak)} MB`,
    b3.service.health ? `health route during it: ${fmt(b3.service.health.p99Ms, 1)} ms` : '(one import)',
    `COPY: ${fmt(b3.baseline.rowsPerSecond)} rows/s`,
    `${fmt(b3.ratio, 2)}`,
    'ratio ≥ 0.6; ≤ 300 MB; health p99 < 50 ms',
    `${yes(b3.ratio >= 0.6)}; ${yes(b3.met.memory)}; ${b3.service.health ? yes(b3.service.health.p99Ms < 50) : '—'}`,
  ]);
if (b4) {
  rows.push([
    '4a. Bearing history (10 M readings)',
    `${fmt(b4.history.median, 1)} ms`,
    `${fmt(b4.history.p99, 1)} ms`,
    `GET engine: ${fmt(b4.baseline.median, 1)} / ${fmt(b4.baseline.p99, 1)} ms`,
    `×${fmt(b4.ratio.history, 1)}`,
    '≤ 100 ms',
    yes(b4.met.history),
  ]);
  rows.push([
    '4b. Bearings with drift verdicts (all engines)',
    `${fmt(b4.list.median, 1)} ms`,
    `${fmt(b4.list.p99, 1)} ms`,
    'as above',
    `×${fmt(b4.ratio.list, 1)}`,
    '≤ 100 ms',
    yes(b4.met.list),
  ]);
}
if (b5) {
  rows.push([
    '5a. JavaScript of the sign-in page',
    `${kb(b5.signIn.gzipBytes)} kB gzip`,
    `(${kb(b5.signIn.bytes)} kB as sent)`,
    '—',
    '—',
    '≤ 250 kB gzip',
    yes(b5.met.signIn),
  ]);
  rows.push([
    '5b. JavaScript of the live run page',
    `${kb(b5.liveRun.gzipBytes)} kB gzip`,
    `(${kb(b5.liveRun.bytes)} kB as sent)`,
    '—',
    '—',
    '(none)',
    '—',
  ]);
  rows.push([
    '5c. Live run page usable (cold cache)',
    `${fmt(b5.liveRun.usableMsCold.median)} ms`,
    `${fmt(b5.liveRun.usableMsCold.p99)} ms`,
    `bare HTML page: ${fmt(b5.baseline.bareDocumentMs.median)} / ${fmt(b5.baseline.bareDocumentMs.p99)} ms`,
    `×${fmt(b5.ratio.coldToBare, 1)}`,
    '≤ 1 s',
    yes(b5.met.usable),
  ]);
  if (b5.liveRun.tablet)
    rows.push([
      '5d. Live run page usable as a tablet on poor Wi-Fi (CPU ÷4, slow network; cold)',
      `${fmt(b5.liveRun.tablet.usableMsCold.median)} ms`,
      `${fmt(b5.liveRun.tablet.usableMsCold.p99)} ms`,
      '—',
      '—',
      '≤ 3 s',
      yes(b5.met.tablet),
    ]);
}
if (b6)
  rows.push([
    `6. Card photo to proposed trace (${b6.cards} cards × ${b6.repeat})`,
    `${fmt(b6.msPerCard.median)} ms`,
    `${fmt(b6.msPerCard.p99)} ms`,
    '—',
    '—',
    'p99 < 1 s',
    yes(b6.met.underOneSecond),
  ]);
if (b7)
  rows.push([
    `7. Visitor board, ${fmt(b7.visitors)} visitors (${b7.instances} instance), reading to update`,
    `${fmt(b7.delayMs.median / 1000, 2)} s`,
    `${fmt(b7.delayMs.p99 / 1000, 2)} s`,
    `designed delay ${b7.delaySeconds} s + figures every 2 s`,
    `CPU ${fmt(b7.cpu.msPerSecondPerVisitor, 3)} ms/s per visitor`,
    '(none)',
    '—',
  ]);
/** Long lists of ids in a plan, shortened: '{a,b,…}' → '{… 124 ids …}'. */
const shortPlan = (plan) =>
  plan.replace(/'\{((?:[0-9a-f-]{36},)+[0-9a-f-]{36})\}'/g, (_m, ids) =>
    ids.length > 200 ? `'{… ${ids.split(',').length} ids …}'` : `'{${ids}}'`,
  );
const table = (head, body) =>
  [`| ${head.join(' | ')} |`, `| ${head.map(() => '---').join(' | ')} |`, ...body.map((r) => `| ${r.join(' | ')} |`)].join('\n');

const md = [];
md.push('# Benchmarks');
md.push('');
md.push(
  `Measured by \`npm run bench\` (bench/run.sh) on ` +
    `${new Date().toISOString().slice(0, 10)}${seconds ? `, in ${Math.round(seconds / 60)} minutes` : ''}. ` +
    'Each benchmark runs against the built service (`node --max-old-space-size=224 service/dist/main.js`, as in ' +
    'production; NODE_ENV=production, LOG_LEVEL=warn) ' +
    'as its own process, ' +
    'a private PostgreSQL cluster with durable commits (fsync on, as in service) and a fresh database, all on 127.0.0.1. ' +
    'The bench scripts (bench/*.mjs) are separate Node processes. The figures below are rewritten by every run; this ' +
    'page is generated (bench/report.mjs).',
);
md.push('');
md.push('## Machine');
md.push('');
md.push(
  table(['CPU', 'cores', 'RAM', 'OS', 'Node.js', 'PostgreSQL'], [[m.cpuModel, String(m.cores), `${m.ramGb} GB`, m.os, m.node, pgVersion]]),
);
md.push('');
md.push(
  'The machine is shared: other work (builds, test suites, other services) ran during the measurement. The load average ' +
    '(runnable processes, 1/5/15 min) is recorded with each benchmark; on 2 cores anything above 2 means every process, the ' +
    'service and PostgreSQL included, waits for a core. Benchmarks 2 and 3 therefore also record the CPU time the service ' +
    'and PostgreSQL spent, which does not depend on that waiting, and the rate those CPU costs allow on 2 otherwise idle cores.',
);
md.push('');
md.push('## Summary');
md.push('');
md.push(table(['Benchmark', 'Median', 'p99', 'Baseline (median / p99)', 'Ratio', 'Target', 'Target met'], rows));
md.push('');
for (const n of [1, 2, 3, 4, 5]) {
  const f = failed(n);
  if (f)
    md.push(
      `> Benchmark ${n} (${f.script}) failed in the run of ${f.at.slice(0, 16)}; its figures above are from an ` +
        `earlier run or missing. See the command's output.`,
    );
}
md.push('');

// ---- 1 ----
md.push('## 1. Reading to alarm');
md.push('');
if (b1) {
  const s = b1.service;
  md.push(`Measured ${when(b1)}${stale(b1)}.`);
  md.push('');
  md.push(
    `${s.viewers} viewers joined the room of a run; ${s.clients} clients submitted readings on the live channel (\`readings:submit\`, ` +
      `one reading each, with acknowledgement) at ${s.targetRate} readings/s together, each on its own measurement ` +
      `point (high limit 130 °F, ` +
      'deadband 2 °F), alternating a value above the limit (raises or re-activates the alarm) and one below limit − deadband ' +
      '(returns it to normal). So every reading changes an alarm and every viewer gets one `alarm:changed` per reading. ' +
      'Measured: time from the submission to the `alarm:changed` at each viewer, all viewers and clients in one bench process ' +
      `(one clock). ${b1.design.warmupMs / 1000} s warm-up, then ${b1.design.measureMs / 1000} s measured. A client sends its next ` +
      'reading at its scheduled time, or when the previous one is acknowledged if that is later.',
  );
  md.push('');
  md.push(
    table(
      ['', 'readings/s achieved', 'events measured (missing)', 'median', 'p90', 'p99', 'max', 'acknowledgement median / p99'],
      [b1.baseline, s].map((x) => [
        x.label,
        fmt(x.achievedRate, 1),
        `${fmt(x.eventsMeasured)} (${fmt(x.eventsMissing)})`,
        `${fmt(x.latencyMs.median, 1)} ms`,
        `${fmt(x.latencyMs.p90, 1)} ms`,
        `${fmt(x.latencyMs.p99, 1)} ms`,
        `${fmt(x.latencyMs.max, 1)} ms`,
        `${fmt(x.ackMs.median, 1)} / ${fmt(x.ackMs.p99, 1)} ms`,
      ]),
    ),
  );
  md.push('');
  md.push(
    'Baseline: the same viewers and clients against a bare socket.io server in a separate process (bench/echo-server.mjs) that ' +
      'answers each reading with the same two events (`readings:new`, `alarm:changed`, same shapes and sizes) and no other work: ' +
      'what the transport and the fan-out to 50 sockets cost on this machine, client side included.',
  );
  md.push('');
  md.push(
    `Out-of-order or mismatched events: ${s.mismatched}. CPU per reading: service ${fmt(s.serverCpuMsPerReading, 2)} ms ` +
      `(${fmt(s.serverCpuPercent)} % of one core), echo server ${fmt(b1.baseline.serverCpuMsPerReading, 2)} ms; ` +
      `PostgreSQL ${fmt(s.postgresCpuPercent)} % of one core. ` +
      `Load average at the end: service part ${s.loadAvg?.join(' / ') ?? '—'}, baseline part ${b1.baseline.loadAvg?.join(' / ') ?? '—'}.`,
  );
} else md.push('Not measured.');
md.push('');

// ---- 2 ----
md.push('## 2. Logger ingestion');
md.push('');
if (b2) {
  const s = b2.service;
  md.push(`Measured ${when(b2)}${stale(b2)}.`);
  md.push('');
  md.push(
    `A data logger pushed ${fmt(b2.design.readings)} readings (one-second logging of ${b2.design.points} points: ` +
      `eight bearing temperatures ` +
      'with high, high-high, rate-of-rise and above-ambient limits, ambient, speed and steam pressure; one bearing swings through its ' +
      `high limit every half hour) as ${b2.design.batches} batches of ${fmt(b2.design.batch)} to \`POST /api/logger/readings\` with its ` +
      `x-logger-key, ${b2.design.inFlight} batches in flight. Every reading takes the whole path: row checks, INSERT once per client id, ` +
      'alarm evaluation in the same transaction, commit, broadcast. Baseline: `COPY` of the same rows (new client ids, a twin engine ' +
      'and run) into the same readings table, in COPY statements of the same size, one transaction each.',
  );
  md.push('');
  md.push(
    table(
      ['', 'rate', 'batch time median / p99', 'CPU: service', 'CPU: PostgreSQL', 'rate the CPU cost allows on 2 idle cores'],
      [
        [
          'service',
          `${fmt(s.readingsPerSecond)} readings/s`,
          `${fmt(s.batchMs.median)} / ${fmt(s.batchMs.p99)} ms`,
          `${fmt(s.cpuMsPer1000.service)} ms per 1,000`,
          `${fmt(s.cpuMsPer1000.postgres)} ms per 1,000`,
          `${fmt(s.cpuBoundRateOn2Cores)}/s`,
        ],
        [
          'COPY',
          `${fmt(b2.baseline.rowsPerSecond)} rows/s`,
          `${fmt(b2.baseline.batchMs.median)} / ${fmt(b2.baseline.batchMs.p99)} ms`,
          '—',
          `${fmt(b2.baseline.cpuMsPer1000.postgres)} ms per 1,000`,
          `${fmt(b2.baseline.cpuBoundRateOn2Cores)}/s`,
        ],
      ],
    ),
  );
  md.push('');
  md.push(
    `Ratio service / COPY: ${fmt(b2.ratio, 2)} as measured; ` +
      `${fmt(s.cpuBoundRateOn2Cores / b2.baseline.cpuBoundRateOn2Cores, 2)} by CPU cost. Alarms raised: ` +
      `${s.alarmsRaised}; alarm events recorded: ${s.alarmEvents}.`,
  );
} else md.push('Not measured.');
md.push('');

// ---- 3 ----
md.push('## 3. CSV import of a one-million-row logger file');
md.push('');
if (b3) {
  const s = b3.service;
  md.push(`Measured ${when(b3)}${stale(b3)}.`);
  md.push('');
  md.push(
    `A generated logger file of ${fmt(b3.design.rows)} rows (${fmt(b3.design.bytes / 1e6, 1)} MB; columns taken_at, point, value; ` +
      `one-second logging of ${b3.design.points} points, about ${fmt(b3.design.rows / b3.design.points / 3600, 1)} ` +
      `hours) sent as the raw body of ` +
      '`POST /api/runs/:id/imports` (text/csv), as the UI sends it, to a service process started just before (benchmark 2 runs first ' +
      'and would otherwise have grown its heap). Rate: rows stored per second from the first byte sent to the answer. Memory: the ' +
      'peak resident set of the service process, VmHWM of /proc/<pid>/status after resetting it, and VmRSS polled every 20 ms.',
  );
  md.push('');
  md.push(
    table(
      ['', 'rate', 'time', 'memory before / peak / after', 'CPU: service', 'CPU: PostgreSQL', 'rate the CPU cost allows on 2 idle cores'],
      [
        [
          'service',
          `${fmt(s.rowsPerSecond)} rows/s`,
          `${fmt(s.seconds, 1)} s`,
          `${fmt(s.memoryMb.before)} / ${fmt(s.memoryMb.peak)} / ${fmt(s.memoryMb.after)} MB`,
          `${fmt(s.cpuMsPer1000.service)} ms per 1,000`,
          `${fmt(s.cpuMsPer1000.postgres)} ms per 1,000`,
          `${fmt(s.cpuBoundRateOn2Cores)}/s`,
        ],
        ['COPY of the same rows', `${fmt(b3.baseline.rowsPerSecond)} rows/s`, `${fmt(b3.baseline.seconds, 1)} s`, '—', '—', '—', '—'],
      ],
    ),
  );
  md.push('');
  md.push(`Ratio service / COPY: ${fmt(b3.ratio, 2)}. Alarms raised by the file: ${s.alarmsRaised}.`);
  if (s.health) {
    md.push('');
    md.push(
      `The health route (GET /api/health, one query) asked every 100 ms during the import on a connection of its own: ` +
        `${fmt(s.health.n)} answers, median ${fmt(s.health.medianMs, 1)} ms, p99 ${fmt(s.health.p99Ms, 1)} ms, ` +
        `slowest ${fmt(s.health.maxMs, 1)} ms (target: p99 under 50 ms; an import must not starve the live channel).`,
    );
  }
} else md.push('Not measured.');
md.push('');

// ---- 4 ----
md.push('## 4. Bearing history over ten million readings');
md.push('');
if (b4) {
  md.push(`Measured ${when(b4)}${stale(b4)}.`);
  md.push('');
  if (b4d)
    md.push(
      `Data: ${fmt(b4d.readings)} readings of one engine, ${b4d.seasons} seasons of ${b4d.runs / b4d.seasons} runs of ` +
        `${fmt(b4d.runSeconds / 3600, 1)} h, ` +
        `one-second logging of 11 points (readings table with its indexes: ${b4d.tableSize}), generated with ` +
        `generate_series straight into the ` +
        `readings table (the secondary indexes and foreign-key checks set aside during the load and rebuilt, then ` +
        `VACUUM ANALYZE; ${fmt(b4d.loadSeconds)} s). ` +
        'The last run is stopped, not closed: its figures are computed afresh on every view. The service was restarted after the load; ' +
        `its start-up pass kept the per-run figures of the closed runs (waited ${b4.design.waitedForBackgroundPassSeconds} s for it).`,
    );
  md.push('');
  md.push(
    table(
      ['request', 'first', 'median', 'p99', 'max', 'answer'],
      [
        [
          `GET /api/maintenance/bearings/:id/history (one bearing, ${b4.design.runs} runs, with the drift band)`,
          `${fmt(b4.history.first, 1)} ms`,
          `${fmt(b4.history.median, 1)} ms`,
          `${fmt(b4.history.p99, 1)} ms`,
          `${fmt(b4.history.max, 1)} ms`,
          `${kb(b4.history.bytes)} kB`,
        ],
        [
          'GET /api/maintenance/bearings (every bearing with its drift verdict)',
          `${fmt(b4.list.first, 1)} ms`,
          `${fmt(b4.list.median, 1)} ms`,
          `${fmt(b4.list.p99, 1)} ms`,
          `${fmt(b4.list.max, 1)} ms`,
          `${kb(b4.list.bytes)} kB`,
        ],
        [
          'baseline: GET /api/engines/:id',
          `${fmt(b4.baseline.first, 1)} ms`,
          `${fmt(b4.baseline.median, 1)} ms`,
          `${fmt(b4.baseline.p99, 1)} ms`,
          `${fmt(b4.baseline.max, 1)} ms`,
          `${kb(b4.baseline.bytes)} kB`,
        ],
      ],
    ),
  );
  md.push('');
  md.push(
    `Times are whole requests measured by the client on loopback, ${b4.design.repeat} in a row after a first one, so ` +
      `they include the transfer; the server time is at most this.`,
  );
  md.push('');
  md.push('### Query plans (EXPLAIN (ANALYZE, BUFFERS), on the same data)');
  md.push('');
  md.push(`The view reads the kept figures of the closed runs (${fmt(b4.queries.kept.ms, 2)} ms):`);
  md.push('');
  md.push('```sql\n' + b4.queries.kept.sql + '\n```\n\n```\n' + shortPlan(b4.plans.kept) + '\n```');
  md.push('');
  md.push(
    `and reads those of the open run from the figures the storing statement keeps as its readings arrive ` +
      `(run_point_figures; ${fmt(b4.queries.openRun.ms, 2)} ms):`,
  );
  md.push('');
  md.push('```sql\n' + b4.queries.openRun.sql + '\n```\n\n```\n' + shortPlan(b4.plans.openRun) + '\n```');
  md.push('');
  md.push(
    `Without the kept figures the same aggregate over every run of the bearing would take ` +
      `${fmt(b4.queries.withoutKeptFigures.ms, 0)} ms (what the start-up and ten-minute background pass spends once per closed run):`,
  );
  md.push('');
  md.push('```\n' + shortPlan(b4.plans.withoutKeptFigures) + '\n```');
} else md.push('Not measured.');
md.push('');

// ---- 5 ----
md.push('## 5. The UI');
md.push('');
if (b5) {
  md.push(`Measured ${when(b5)}${stale(b5)}.`);
  md.push('');
  md.push(
    'Headless Chromium (playwright-core, /usr/bin/chromium) against the built UI served by the service on loopback. JavaScript: every ' +
      'script file the page loaded, as sent (the service does not compress) and gzipped (zlib level 6, as a ' +
      'compressing proxy would send it). ' +
      `Time to a usable live run page: from navigation start until the first tile of the run's board is visible, ` +
      `${b5.design.runs} loads in a ` +
      `fresh browser context each (cold cache) and as many with the cache warm, of a run kept by hand ` +
      `(${b5.liveRun.readings ?? '—'} readings: eight rounds of eleven points); ` +
      'then a few cold loads of the run of benchmark 1, which holds the thousands of readings and alarm changes that benchmark sent. ' +
      "Baseline: the sign-in route's HTML document with its scripts blocked.",
  );
  md.push('');
  md.push(
    table(
      ['page', 'scripts', 'as sent', 'gzip', 'usable: median / p99 (max)'],
      [
        [
          'sign-in',
          String(b5.signIn.files.length),
          `${kb(b5.signIn.bytes)} kB`,
          `${kb(b5.signIn.gzipBytes)} kB`,
          `${fmt(b5.signIn.usableMs)} ms (one load)`,
        ],
        [
          'live run, cold cache',
          String(b5.liveRun.files.length),
          `${kb(b5.liveRun.bytes)} kB`,
          `${kb(b5.liveRun.gzipBytes)} kB`,
          `${fmt(b5.liveRun.usableMsCold.median)} / ${fmt(b5.liveRun.usableMsCold.p99)} ms`,
        ],
        ['live run, warm cache', '', '', '', `${fmt(b5.liveRun.usableMsWarm.median)} / ${fmt(b5.liveRun.usableMsWarm.p99)} ms`],
        ...(b5.liveRun.busy
          ? [
              [
                `busy live run (${fmt(b5.liveRun.busy.readings)} readings), cold cache`,
                '',
                '',
                '',
                `${fmt(b5.liveRun.busy.usableMsCold.median)} / ${fmt(b5.liveRun.busy.usableMsCold.p99)} ms`,
              ],
            ]
          : []),
        ...(b5.liveRun.tablet
          ? [
              [
                'live run as a tablet on poor Wi-Fi (CPU ÷4, 150 ms, 1.6 Mbit/s), cold cache',
                '',
                '',
                '',
                `${fmt(b5.liveRun.tablet.usableMsCold.median)} / ${fmt(b5.liveRun.tablet.usableMsCold.p99)} ms`,
              ],
            ]
          : []),
        [
          'baseline: bare HTML document',
          '0',
          '',
          '',
          `${fmt(b5.baseline.bareDocumentMs.median)} / ${fmt(b5.baseline.bareDocumentMs.p99)} ms`,
        ],
      ],
    ),
  );
  md.push('');
  md.push(
    'Scripts of the sign-in page (gzip): ' +
      b5.signIn.files.map((f) => `${f.url.replace(/^\/assets\//, '')} ${kb(f.gzipBytes)} kB`).join(', ') +
      '.',
  );
  md.push('');
  md.push(
    'Scripts of the live run page (gzip): ' +
      b5.liveRun.files.map((f) => `${f.url.replace(/^\/assets\//, '')} ${kb(f.gzipBytes)} kB`).join(', ') +
      '.',
  );
  if (b5.liveRun.errors?.length) md.push(`\nPage errors seen: ${b5.liveRun.errors.join('; ')}`);
} else md.push('Not measured.');
md.push('');

if (b6) {
  md.push('## 6. Card photo to proposed trace');
  md.push('');
  md.push(`Measured ${when(b6)}${stale(b6)}.`);
  md.push('');
  md.push(
    `The automatic tracer (shared-types proposeCardTrace) on ${b6.cards} card photos: the generated test set of ` +
      'service/src/database/seeds/autotrace-cards.ts (ideal cards with and without clearance, wire-drawn admission, a compound ' +
      'LP card with a loop, a negative loop at the toe; each turned up to ±8°, under uneven light, a shadow, noise, blur and ' +
      `JPEG) and the demo's images in samples/cards, each traced ${b6.repeat} times in one process. Per card: median ` +
      `${fmt(b6.msPerCard.median)} ms, p99 ${fmt(b6.msPerCard.p99)} ms, slowest ${fmt(b6.msPerCard.max)} ms. MEP against the ` +
      `drawn outline (generated set): mean error ${fmt(b6.mepErrorPercent.mean, 2)} %, largest ${fmt(b6.mepErrorPercent.max, 2)} %, ` +
      `${b6.mepErrorPercent.refused} refused.`,
  );
  md.push('');
}

if (b7) {
  md.push('## 7. Visitor board, 500 visitors');
  md.push('');
  md.push(`Measured ${when(b7)}${stale(b7)}.`);
  md.push('');
  md.push(
    `${fmt(b7.visitors)} socket.io clients on the public namespace /visit, all on one board of a running run, on ` +
      `${b7.instances} service instance (several instances are not part of this build). The chief engineer submitted ` +
      `${b7.submissions} speed readings, one every 3 s, through the rounds route. Measured: from a reading's arrival (the ` +
      "round's answer) to the first `visit:figures` showing it at each visitor, which by design includes the board's delay " +
      `(VISIT_DELAY_SECONDS = ${b7.delaySeconds} s) and up to one figures period (2 s). ${fmt(b7.updates.measured)} updates ` +
      `measured (${fmt(b7.updates.missing)} missing): median ${fmt(b7.delayMs.median)} ms, p90 ${fmt(b7.delayMs.p90)} ms, ` +
      `p99 ${fmt(b7.delayMs.p99)} ms, slowest ${fmt(b7.delayMs.max)} ms; beyond the designed delay: median ` +
      `${fmt(b7.beyondDesignedDelayMs.median)} ms, p99 ${fmt(b7.beyondDesignedDelayMs.p99)} ms. ${fmt(b7.visitors)} visitors ` +
      `connected in ${fmt(b7.connectMs)} ms. Service CPU: ${fmt(b7.cpu.idleSecondsPerSecond, 3)} s/s with the same readings ` +
      `and no visitor, ${fmt(b7.cpu.loadedSecondsPerSecond, 3)} s/s with the visitors: ` +
      `${fmt(b7.cpu.msPerSecondPerVisitor, 3)} ms of CPU per second per visitor.`,
  );
  md.push('');
}

const notes = join(ROOT, 'bench', 'NOTES.md');
if (existsSync(notes)) {
  md.push(readFileSync(notes, 'utf8').trim());
  md.push('');
}
writeFileSync(join(ROOT, 'BENCHMARKS.md'), md.join('\n'));
