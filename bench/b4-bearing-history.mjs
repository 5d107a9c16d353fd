// Benchmark 4, part 2: the bearing history over the ten million readings of bench engine D (loaded by
// b4-history-data.mjs; the service was restarted after the load, so its background pass has kept the
// per-run figures of the closed runs, as it does in service). Measured, as the time of each request on
// loopback (a fresh request each time, no HTTP cache):
//   GET /api/maintenance/bearings/:id/history — one bearing's runs, temperatures at load and drift band
//   (the data of the drift chart); GET /api/maintenance/bearings — every bearing with its drift verdict.
// Baseline: GET /api/engines/:id, a plain read through the same guards. Also: EXPLAIN (ANALYZE, BUFFERS)
// of the query each view runs, and of the per-run aggregate it avoids (what a view costs without the kept figures).
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { DB_URL, context, login, log, round, sleep, stats, writeResult, BASE } from './lib.mjs';

const N = Number(process.env.B4_REPEAT ?? 30);
const ctx = context();
const eng = ctx.engines.history;
const bearingId = eng.bearings['Bearing 3'];
const token = await login(ctx.people.observer);
const db = new pg.Client({ connectionString: DB_URL });
await db.connect();

// Wait for the service's background pass to keep the figures of the closed runs (as it would in service).
const expectRows = async () =>
  Number((await db.query(`SELECT count(*)::int AS n FROM runs WHERE engine_id = $1 AND state = 'closed'`, [eng.id])).rows[0].n) * 10;
const keptRows = async () =>
  Number(
    (await db.query(`SELECT count(*)::int AS n FROM run_point_stats s JOIN runs r ON r.id = s.run_id WHERE r.engine_id = $1`, [eng.id]))
      .rows[0].n,
  );
const want = await expectRows();
const tw = performance.now();
let kept = await keptRows();
while (kept < want && performance.now() - tw < 240_000) {
  await sleep(1000);
  kept = await keptRows();
}
const warmSeconds = (performance.now() - tw) / 1000;
log(`kept per-run figures: ${kept} of ${want} (waited ${warmSeconds.toFixed(0)} s for the service's background pass)`);

async function time(path) {
  const t = performance.now();
  const res = await fetch(BASE + path, { headers: { authorization: `Bearer ${token}` } });
  const body = await res.text();
  const ms = performance.now() - t;
  if (!res.ok) throw new Error(`GET ${path}: ${res.status} ${body.slice(0, 300)}`);
  return { ms, bytes: body.length, body };
}
async function series(path, n) {
  const first = await time(path);
  const ms = [];
  for (let i = 0; i < n; i++) ms.push((await time(path)).ms);
  const s = stats(ms);
  return {
    first: round(first.ms, 1),
    bytes: first.bytes,
    n: s.n,
    median: round(s.median, 1),
    p99: round(s.p99, 1),
    max: round(s.max, 1),
    body: first.body,
  };
}

const history = await series(`/api/maintenance/bearings/${bearingId}/history`, N);
const parsed = JSON.parse(history.body);
log(
  `history of bearing 3: ${parsed.runs.length} runs, ${parsed.runs.filter((r) => r.drift?.flagged).length} flagged; ` +
    `median ${history.median} ms, p99 ${history.p99} ms (first ${history.first} ms)`,
);
const list = await series(`/api/maintenance/bearings`, Math.max(10, Math.round(N / 2)));
log(`bearings list: ${JSON.parse(list.body).length} bearings; median ${list.median} ms, p99 ${list.p99} ms (first ${list.first} ms)`);
const baseline = await series(`/api/engines/${eng.id}`, N);
log(`baseline GET /api/engines/:id: median ${baseline.median} ms, p99 ${baseline.p99} ms`);

// The queries behind the view, explained on the same data.
const points = (await db.query(`SELECT id, code, kind FROM measurement_points WHERE engine_id = $1`, [eng.id])).rows;
const own = points.filter((p) => p.code === 'T3' || p.kind === 'ambient_temperature' || p.kind === 'speed').map((p) => p.id);
const closed = (await db.query(`SELECT id FROM runs WHERE engine_id = $1 AND state = 'closed'`, [eng.id])).rows.map((r) => r.id);
const open = (
  await db.query(`SELECT id FROM runs WHERE engine_id = $1 AND state <> 'closed' AND started_at IS NOT NULL`, [eng.id])
).rows.map((r) => r.id);
const explain = async (sql, params) =>
  (await db.query(`EXPLAIN (ANALYZE, BUFFERS) ${sql}`, params)).rows.map((r) => r['QUERY PLAN']).join('\n');
const keptSql =
  `SELECT run_id, point_id, peak, mean, least, count, first_at, last_at FROM run_point_stats WHERE ` +
  `point_id = ANY($1::uuid[]) AND run_id = ANY($2::uuid[])`;
const aggSql = `SELECT run_id, point_id, max(v) AS peak, avg(v) AS mean, min(v) AS least, count(*)::int AS n,
       min(taken_at) AS first_at, max(taken_at) AS last_at
  FROM (SELECT run_id, point_id, COALESCE(amended_value, value) AS v, taken_at FROM readings
         WHERE point_id = ANY($1::uuid[]) AND run_id = ANY($2::uuid[])) r
 GROUP BY run_id, point_id`;
const openSql =
  `SELECT run_id, point_id, count, total, peak, least, first_at, last_at FROM run_point_figures ` +
  `WHERE run_id = ANY($1::uuid[]) AND point_id = ANY($2::uuid[]) AND count > 0`;
const plans = {
  kept: await explain(keptSql, [own, closed]),
  openRun: await explain(openSql, [open, own]),
  withoutKeptFigures: await explain(aggSql, [own, closed]),
};
const execMs = (plan) => Number((plan.match(/Execution Time: ([\d.]+) ms/) ?? [])[1]);
log(
  `query times: kept figures ${execMs(plans.kept)} ms, open run ${execMs(plans.openRun)} ms, all runs without kept ` +
    `figures ${execMs(plans.withoutKeptFigures)} ms`,
);
await db.end();

delete history.body;
delete list.body;
delete baseline.body;
writeResult('b4', {
  title: 'Bearing history over ten million readings',
  design: {
    repeat: N,
    bearing: 'Bearing 3',
    runs: parsed.runs.length,
    keptRows: kept,
    waitedForBackgroundPassSeconds: round(warmSeconds, 0),
  },
  history,
  list,
  baseline,
  ratio: { history: round(history.median / baseline.median, 1), list: round(list.median / baseline.median, 1) },
  queries: {
    kept: { sql: keptSql, ms: execMs(plans.kept) },
    openRun: { sql: openSql, ms: execMs(plans.openRun) },
    withoutKeptFigures: { sql: aggSql, ms: execMs(plans.withoutKeptFigures) },
  },
  plans,
  target: { ms: 100 },
  met: { history: history.p99 <= 100, list: list.p99 <= 100 },
});
process.exit(0);
