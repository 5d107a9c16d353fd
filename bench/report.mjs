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
const b8 = readResult('b8');
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
    `7. Visitor board, ${fmt(b7.visitors)} visitors ${b7.instances > 1 ? `over ${b7.instances} instances` : 'on 1 instance'}, ` +
      'reading to update',
    `${fmt(b7.delayMs.median / 1000, 2)} s`,
    `${fmt(b7.delayMs.p99 / 1000, 2)} s`,
    `designed delay ${b7.delaySeconds} s + figures every 2 s`,
    `CPU ${fmt(b7.cpu.msPerSecondPerVisitor, 3)} ms/s per visitor`,
    '(none)',
    '—',
  ]);
if (b8)
  rows.push([
    `8. Reading to alarm, ${fmt(b8.design.viewers)} viewers on two instances (${fmt(b8.design.rate)} readings/s)`,
    `${fmt(b8.service.latencyMs.median, 1)} ms`,
    `${fmt(b8.service.latencyMs.p99, 1)} ms`,
    `two bare socket.io servers, same adapter: ${fmt(b8.baseline.latencyMs.median, 1)} / ${fmt(b8.baseline.latencyMs.p99, 1)} ms`,
    `×${fmt(b8.ratio.median, 1)} / ×${fmt(b8.ratio.p99, 1)}`,
    '(none set)',
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
    'The bench scripts (bench/*.mjs) are separate Node processes. This page is generated (bench/report.mjs): each ' +
    "benchmark's section and summary rows are rewritten from its results when it runs; a run of some benchmarks only " +
    '(BENCH_ONLY) keeps the others as they were, and the rows measured by hand say where they came from.',
);
md.push('');
md.push('## Machine');
md.push('');
md.push(
  table(['CPU', 'cores', 'RAM', 'OS', 'Node.js', 'PostgreSQL'], [[m.cpuModel, String(m.cores), `${m.ramGb} GB`, m.os, m.node, pgVersion]]),
);
md.push('');
md.push(
  'The machine may be shared: other work (builds, test suites, other services) can run during a measurement. The load average ' +
    '(runnable processes, 1/5/15 min) is recorded with each benchmark; on 2 cores anything above 2 means every process, the ' +
    'service and PostgreSQL included, waits for a core. Benchmarks 2 and 3 therefore also record the CPU time the service ' +
    'and PostgreSQL spent, which does not depend on that waiting, and the rate those CPU costs allow on 2 otherwise idle cores.',
);
md.push('');
md.push('## Summary');
md.push('');
md.push(table(['Benchmark', 'Median', 'p99', 'Baseline (median / p99)', 'Ratio', 'Target', 'Target met'], rows));
md.push('');
for (const n of [1, 2, 3, 4, 5, 6, 7]) {
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
  const two = (b7.perInstance?.length ?? 1) > 1;
  md.push(`## 7. Visitor board, ${fmt(b7.visitors)} visitors${two ? ' over two instances' : ''}`);
  md.push('');
  md.push(`Measured ${when(b7)}${stale(b7)}.`);
  md.push('');
  md.push(
    `${fmt(b7.visitors)} socket.io clients on the public namespace /visit, all on one board of a running run, ` +
      (two
        ? `alternately on two instances of the built service on one database (A on BENCH_APP_PORT, B on BENCH_APP2_PORT, ` +
          `${b7.perInstance.map((x) => `${fmt(x.visitors)} on ${x.name}`).join(', ')}). `
        : 'on one service instance. ') +
      `The chief engineer submitted ${b7.submissions} speed readings, one every ${(b7.submitEveryMs ?? 3000) / 1000} s, ` +
      `through the rounds route${two ? ' of instance A' : ''}. Each instance sends the figures to its own visitors every 2 s, ` +
      `computed from the database${two ? " (so a reading stored through A reaches B's visitors through the database)" : ''}. ` +
      "Measured: from a reading's arrival (the round's answer) to the first `visit:figures` showing it at each visitor, " +
      `which by design includes the board's delay (VISIT_DELAY_SECONDS = ${b7.delaySeconds} s) and up to one figures ` +
      'period (2 s); all clients in one bench process (one clock). CPU per visitor: the CPU time (user + system, ' +
      `/proc/<pid>/stat) of each service process per second over ${(b7.cpuWindowMs ?? 20000) / 1000} s with its visitors ` +
      'connected and the readings coming, minus the same over a window of the same length with the same readings and no ' +
      "visitor connected, divided by that instance's visitors. CPU time is counted in 10 ms ticks, so each CPU per " +
      `visitor figure is good to about ±${fmt(b7.cpu.resolutionMsPerSecondPerVisitor ?? null, 4)} ms/s from the counting ` +
      "alone; each process's own background work (the job queue's polling, timers) falls into one window or the other, " +
      'so the per-instance figures scatter more than that between runs, and the figure over both instances is the steadier one.',
  );
  md.push('');
  const line = (label, x) => [
    label,
    fmt(x.visitors),
    `${fmt(x.updates.measured)} (${fmt(x.updates.missing)})`,
    `${fmt(x.delayMs.median)} ms`,
    `${fmt(x.delayMs.p90)} ms`,
    `${fmt(x.delayMs.p99)} ms`,
    `${fmt(x.delayMs.max)} ms`,
    `${fmt(x.cpu.idleSecondsPerSecond, 3)} / ${fmt(x.cpu.loadedSecondsPerSecond, 3)} s/s`,
    `${fmt(x.cpu.msPerSecondPerVisitor, 3)} ms/s`,
  ];
  md.push(
    table(
      ['', 'visitors', 'updates measured (missing)', 'median', 'p90', 'p99', 'max', 'CPU without / with visitors', 'CPU per visitor'],
      [
        ...(b7.perInstance ?? []).map((x) =>
          line(`instance ${x.name}${x.takesReadings ? ' (takes the readings)' : ' (visitors only)'}`, x),
        ),
        line(two ? 'all visitors, both instances' : 'all visitors', b7),
      ],
    ),
  );
  md.push('');
  md.push(
    `Beyond the designed delay: median ${fmt(b7.beyondDesignedDelayMs.median)} ms, p99 ${fmt(b7.beyondDesignedDelayMs.p99)} ms. ` +
      `${fmt(b7.visitors)} visitors connected in ${fmt(b7.connectMs)} ms (50 at a time). The CPU per visitor of all visitors ` +
      "is the two instances' extra CPU together divided by all visitors.",
  );
  md.push('');
}

if (b8) {
  md.push(`## 8. Reading to alarm, ${fmt(b8.design.viewers)} viewers over two instances`);
  md.push('');
  md.push(`Measured ${when(b8)}, by \`node bench/b8-two-instances.mjs\` on its own (not run by \`npm run bench\`).`);
  md.push('');
  md.push(
    `Two instances of the built service on one database, ${fmt(b8.design.viewers / 2)} viewers in the run's room on each, ` +
      `one client submitting on the live channel of instance A at ${fmt(b8.design.rate)} readings/s, each reading raising or ` +
      `clearing the alarm of one point, so each reading sends one \`alarm:changed\` to all ${fmt(b8.design.viewers)} viewers ` +
      "(to those on B through socket.io's PostgreSQL adapter). Measured: submission to `alarm:changed` at each viewer, " +
      `${b8.design.measureMs / 1000} s after ${b8.design.warmupMs / 1000} s of warm-up. Baseline: the same viewers and client ` +
      'against two bare socket.io servers joined by the same adapter (`bench/echo-server-pg.mjs`).',
  );
  md.push('');
  md.push(
    table(
      ['', 'events measured (missing)', 'median', 'p99', 'max', 'p99 on the submitting instance / on the other', 'load average'],
      [b8.baseline, b8.service].map((x) => [
        x.label,
        `${fmt(x.eventsMeasured)} (${fmt(x.eventsExpected - x.eventsMeasured)})`,
        `${fmt(x.latencyMs.median, 1)} ms`,
        `${fmt(x.latencyMs.p99, 1)} ms`,
        `${fmt(x.latencyMs.max, 1)} ms`,
        `${fmt(x.sameInstanceP99, 1)} / ${fmt(x.otherInstanceP99, 1)} ms`,
        x.loadAvg?.join(' / ') ?? '—',
      ]),
    ),
  );
  md.push('');
}

// ---- What this run did not measure: carried over from the page as it was ----
// A numbered section and its summary rows are rewritten only when the benchmark has a results file
// (.data/bench/results/bN.json); otherwise they are carried over from BENCHMARKS.md as they are. So are the rows and
// sections measured by hand (HAND_MEASURED) and any other section written by hand above the notes. The intro and the
// machine are rewritten only by a run of every benchmark. The notes (bench/NOTES.md) are appended afresh.
/** Rows measured by hand, not by this command, and where each came from. */
const HAND_MEASURED = {
  '6b': 'the browser test ui/e2e/indicator-cards.e2e.ts ("accepts the proposed trace") on its own clock, one run (see 6)',
  8: '`node bench/b8-two-instances.mjs` run on its own, outside this command (see 8)',
};
const results = { 1: b1, 2: b2, 3: b3, 4: b4, 5: b5, 6: b6, 7: b7, 8: b8 };
/** The benchmarks `npm run bench` runs (8 is run by hand). */
const BY_THE_COMMAND = ['1', '2', '3', '4', '5', '6', '7'];
const onlyArg = process.argv.indexOf('--only');
const only = onlyArg >= 0 ? (process.argv[onlyArg + 1] ?? '').split(/\s+/).filter(Boolean) : null;
const everyBenchmark = !only || BY_THE_COMMAND.every((n) => only.includes(n));

/** A page cut at its '## ' headings: the text before the first one, then each section (heading line included). */
function cut(text) {
  const parts = text.split(/^(?=## )/m);
  const head = parts[0].startsWith('## ') ? '' : parts.shift();
  return {
    head: head.replace(/\s+$/, ''),
    sections: parts.map((p) => ({ heading: p.split('\n', 1)[0].trim(), text: p.replace(/\s+$/, '') })),
  };
}
const numberOf = (heading) => (heading.match(/^## (\d+)\./) ?? [])[1] ?? null;
const rowKey = (line) => (line.match(/^\| (\d+[a-z]?)\. /) ?? [])[1] ?? null;
const keyOrder = (k) => Number(k.match(/^\d+/)[0]) * 100 + (/[a-z]$/.test(k) ? k.charCodeAt(k.length - 1) - 96 : 0);

const page = join(ROOT, 'BENCHMARKS.md');
const fresh = cut(md.join('\n'));
const old = existsSync(page) ? cut(readFileSync(page, 'utf8')) : { head: '', sections: [] };
const noteHeadings = new Set(
  existsSync(join(ROOT, 'bench', 'NOTES.md'))
    ? readFileSync(join(ROOT, 'bench', 'NOTES.md'), 'utf8')
        .split('\n')
        .filter((l) => l.startsWith('## '))
        .map((l) => l.trim())
    : [],
);
const firstNote = old.sections.findIndex((x) => noteHeadings.has(x.heading));
const oldSections = firstNote >= 0 ? old.sections.slice(0, firstNote) : old.sections;
const oldNamed = (h) => oldSections.find((x) => x.heading === h);
const freshNamed = (h) => fresh.sections.find((x) => x.heading === h);
const measured = (n) => !!results[n];

// The summary: this run's rows of the benchmarks it has results for, the page's other rows as they were.
const tableRows = (text) => text.split('\n').filter((l) => rowKey(l));
const freshSummary = freshNamed('## Summary').text;
const freshRows = tableRows(freshSummary);
const freshKeys = new Set(freshRows.map(rowKey));
const keptRows = tableRows(oldNamed('## Summary')?.text ?? '').filter((l) => {
  const k = rowKey(l);
  const n = k.match(/^\d+/)[0];
  return !freshKeys.has(k) && !(measured(n) && !(k in HAND_MEASURED));
});
const allRows = [...freshRows, ...keptRows].sort((x, y) => keyOrder(rowKey(x)) - keyOrder(rowKey(y)));
const summaryLines = freshSummary.split('\n');
const headerAt = summaryLines.findIndex((l) => l.startsWith('| Benchmark'));
const summaryNotes = summaryLines.slice(headerAt + 2).filter((l) => !rowKey(l) && l.trim());
const handKept = keptRows.map(rowKey).filter((k) => k in HAND_MEASURED);
const carried = keptRows.map(rowKey).filter((k) => !(k in HAND_MEASURED));
if (handKept.length)
  summaryNotes.push('Measured by hand, not by `npm run bench`: ' + handKept.map((k) => `${k} — ${HAND_MEASURED[k]}`).join('; ') + '.');
if (carried.length)
  summaryNotes.push(
    `Carried over from an earlier version of this page (this run has no results of theirs): ${carried.join(', ')}; ` +
      'each section says when it was measured.',
  );
const summary = [['## Summary', '', ...summaryLines.slice(headerAt, headerAt + 2), ...allRows].join('\n'), ...summaryNotes].join('\n\n');

// The numbered sections: this run's where it has results, else the page's, else this run's "not measured".
const numbers = [...new Set([...fresh.sections, ...oldSections].map((x) => numberOf(x.heading)).filter((n) => n !== null))].sort(
  (x, y) => Number(x) - Number(y),
);
const numbered = numbers
  .map((n) => {
    const f = fresh.sections.find((x) => numberOf(x.heading) === n);
    const o = oldSections.find((x) => numberOf(x.heading) === n);
    return (measured(n) ? f : (o ?? f))?.text;
  })
  .filter(Boolean);
const handSections = oldSections
  .filter((x) => numberOf(x.heading) === null && !['## Machine', '## Summary'].includes(x.heading))
  .map((x) => x.text);
const keepOld = !everyBenchmark && old.head;
const out = [
  keepOld ? old.head : fresh.head,
  (keepOld ? (oldNamed('## Machine') ?? freshNamed('## Machine')) : freshNamed('## Machine')).text,
  summary,
  ...numbered,
  ...handSections,
];
const notes = join(ROOT, 'bench', 'NOTES.md');
if (existsSync(notes)) out.push(readFileSync(notes, 'utf8').trim());
writeFileSync(page, out.join('\n\n') + '\n');
