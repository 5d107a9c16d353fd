// Benchmark 4, part 1: ten million readings of one engine (bench engine D), straight into the readings
// table: five seasons of 25 runs of two hours each, one-second logging of its eleven points (eight bearing
// temperatures, ambient, speed, steam pressure). The last run of the last season is stopped but not closed
// (its figures are computed afresh on every view). Loaded the way a restore would be: the secondary
// indexes and the foreign-key checks are set aside during the load and rebuilt after it, then VACUUM ANALYZE.
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { DB_URL, context, log, round, writeResult } from './lib.mjs';

const SEASONS = 5;
const RUNS_PER_SEASON = 25;
const RUN_SECONDS = Number(process.env.B4_RUN_SECONDS ?? 7272); // 125 runs × 7272 s × 11 points ≈ 10.0 million
const ctx = context();
const eng = ctx.engines.history;
const superUrl = process.env.BENCH_PG_SUPER_URL ?? DB_URL.replace(/\/\/[^@]+@/, '//postgres@');
const db = new pg.Client({ connectionString: superUrl });
await db.connect();
const q = (sql, params) => db.query(sql, params);
const t0 = performance.now();

const [{ id: chiefId }] = (await q(`SELECT id FROM users WHERE email = $1`, [ctx.people.chief])).rows;
const year = new Date().getUTCFullYear();
// Runs: seasons from May to September, a run every six days at 10:00; stopped during the load, closed after it.
await q(`DELETE FROM run_point_stats WHERE run_id IN (SELECT id FROM runs WHERE engine_id = $1 AND title LIKE 'Season %')`, [eng.id]).catch(
  () => undefined,
);
const runs = [];
for (let s = 0; s < SEASONS; s++) {
  const y = year - SEASONS + s;
  for (let k = 0; k < RUNS_PER_SEASON; k++) {
    const start = new Date(Date.UTC(y, 4, 1 + k * 6, 10, 0, 0));
    const last = s === SEASONS - 1 && k === RUNS_PER_SEASON - 1;
    runs.push({
      title: `Season ${y} run ${k + 1}`,
      start,
      stop: new Date(start.getTime() + RUN_SECONDS * 1000),
      state: last ? 'stopped' : 'closed',
    });
  }
}
await q(
  `INSERT INTO runs (engine_id, title, purpose, state, started_at, stopped_at, closed_at, revolutions, created_by, created_at,
                     updated_at, version)
   SELECT $1, t, 'demonstration', 'stopped', a, b, NULL, 75 * extract(epoch FROM b - a) / 60, $2, a - interval '1 day', b, 1
     FROM unnest($3::text[], $4::text[], $5::timestamptz[], $6::timestamptz[]) AS x(t, st, a, b)`,
  [
    eng.id,
    chiefId,
    runs.map((r) => r.title),
    runs.map((r) => r.state),
    runs.map((r) => r.start.toISOString()),
    runs.map((r) => r.stop.toISOString()),
  ],
);

// Set the secondary indexes and the foreign-key triggers aside for the load.
const indexes = (
  await q(
    `SELECT indexname, indexdef FROM pg_indexes WHERE tablename = 'readings' AND indexname NOT IN (SELECT conname ` +
      `FROM pg_constraint WHERE conrelid = 'readings'::regclass)`,
  )
).rows;
for (const i of indexes) await q(`DROP INDEX "${i.indexname}"`);
await q(`ALTER TABLE readings DISABLE TRIGGER ALL`);
await q(`SET work_mem = '256MB'`);
try {
  for (let s = 0; s < SEASONS; s++) {
    const y = year - SEASONS + s;
    const ts = performance.now();
    // Time-ordered like a logger's rows: each second, every point. Bearing temperatures rise over the first
    // half hour of a run to their running level above ambient; bearing 3 runs 8 °F warmer in the last season.
    const r = await q(
      `INSERT INTO readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source)
       SELECT gen_random_uuid(), r.id, r.engine_id, p.id,
              CASE p.kind
                WHEN 'ambient_temperature' THEN 62 + 12 * sin(extract(doy FROM r.started_at) / 365.0 * 2 * pi() - 1.4)
                                                + 4 * s.s / $3::float + (random() - 0.5)
                WHEN 'speed' THEN 74 + 0.6 * sin(s.s / 97.0) + (random() - 0.5) * 0.4
                WHEN 'throttle_pressure' THEN 125 + 4 * sin(s.s / 613.0) + (random() - 0.5)
                ELSE 62 + 12 * sin(extract(doy FROM r.started_at) / 365.0 * 2 * pi() - 1.4)
                     + (18 + 2 * p.sequence + CASE WHEN p.code = 'T3' AND $4 THEN 8 ELSE 0 END) * (1 - exp(-s.s / 1800.0))
                     + (random() - 0.5) * 0.6
              END,
              p.unit, r.started_at + make_interval(secs => s.s), 'logger'
         FROM runs r
         CROSS JOIN generate_series(0, $3::int - 1) AS s(s)
         CROSS JOIN measurement_points p
        WHERE r.engine_id = $1 AND r.title LIKE $2 AND p.engine_id = r.engine_id
        ORDER BY r.started_at, s.s, p.sequence`,
      [eng.id, `Season ${y} %`, RUN_SECONDS, s === SEASONS - 1],
    );
    log(`season ${y}: ${r.rowCount} readings in ${((performance.now() - ts) / 1000).toFixed(0)} s`);
  }
} finally {
  await q(`ALTER TABLE readings ENABLE TRIGGER ALL`);
  const ti = performance.now();
  for (const i of indexes) await q(i.indexdef);
  log(`rebuilt ${indexes.length} indexes in ${((performance.now() - ti) / 1000).toFixed(0)} s`);
}
// Closed only now that their readings are in (a closed run's figures are kept once computed, and the
// service's background pass may look at any moment).
await q(`UPDATE runs SET state = 'closed', closed_at = stopped_at + interval '1 hour' WHERE engine_id = $1 AND title = ANY($2::text[])`, [
  eng.id,
  runs.filter((r) => r.state === 'closed').map((r) => r.title),
]);
await q(`DELETE FROM run_point_stats WHERE run_id IN (SELECT id FROM runs WHERE engine_id = $1)`, [eng.id]);
// The per-run figures the service's storing statement keeps as readings arrive (run_point_figures): the load went
// straight into the table, so they are added up here once, as the ingest path would have.
const tf = performance.now();
await q(`DELETE FROM run_point_figures WHERE run_id IN (SELECT id FROM runs WHERE engine_id = $1)`, [eng.id]);
await q(
  `INSERT INTO run_point_figures (run_id, point_id, count, total, peak, least, first_at, last_at)
   SELECT run_id, point_id, count(*), sum(value), max(value), min(value), min(taken_at), max(taken_at)
     FROM readings WHERE engine_id = $1 GROUP BY run_id, point_id`,
  [eng.id],
);
log(`kept per-run figures added up in ${((performance.now() - tf) / 1000).toFixed(0)} s`);
const tv = performance.now();
await q(`VACUUM (ANALYZE) readings`);
log(`VACUUM ANALYZE in ${((performance.now() - tv) / 1000).toFixed(0)} s`);
const [{ n, size }] = (
  await q(
    `SELECT (SELECT count(*) FROM readings WHERE engine_id = $1)::int AS n, pg_size_pretty(pg_total_relation_size('readings')) AS size`,
    [eng.id],
  )
).rows;
await db.end();
log(`engine D holds ${n} readings; the readings table with its indexes is ${size}`);
writeResult('b4-data', {
  readings: n,
  runs: runs.length,
  seasons: SEASONS,
  runSeconds: RUN_SECONDS,
  tableSize: size,
  loadSeconds: round((performance.now() - t0) / 1000, 0),
  indexesRebuilt: indexes.map((i) => i.indexname),
});
process.exit(0);
