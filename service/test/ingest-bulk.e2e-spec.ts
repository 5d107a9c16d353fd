import { randomUUID } from 'node:crypto';
import type { EngineDetail, RunDetail } from '@crankjournal/shared-types';
import { RunStatsService } from '../src/modules/maintenance/run-stats.service.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun } from './factories/engine.factory.js';

/**
 * Large batches (CSV chunks, logger pushes) are stored through a staging table (COPY, then one INSERT ... SELECT ...
 * ON CONFLICT); the run's figures per point are kept in the same statement. What a caller sees must be what the
 * row-by-row path gave: each reading stored once, bad lines reported by line, alarms raised by the rules.
 */
describe('storing large batches (by COPY) and the kept per-run figures', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let engine: EngineDetail;
  let run: RunDetail;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;
  const t0 = Date.now() - 3 * 3600_000;
  const at = (s: number) => new Date(t0 + s * 1000).toISOString();
  /**
   * 1,200 rows: MB and AMB every 6 s for two hours; MB warms from 100 °F to 139 °F, over its 130 °F high limit
   * (and stays within 60 °F of ambient).
   */
  const mbAt = (i: number) => 100 + (39 * i) / 599;
  const lines: string[] = [];
  for (let i = 0; i < 600; i++) {
    lines.push(`${at(i * 6)},MB,${mbAt(i).toFixed(3)}`);
    lines.push(`${at(i * 6)},AMB,85`);
  }

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    engine = await createEngine(t, chief.accessToken);
    run = await createPreparingRun(t, operator.accessToken, engine.id);
  });
  afterAll(async () => {
    await t?.close();
  });

  const importCsv = (rows: string[]) =>
    signedIn(t, operator)
      .post(`/api/runs/${run.id}/imports`)
      .set('content-type', 'text/csv')
      .send(['taken_at,point,value', ...rows].join('\n'));

  const figures = async (code: string) => {
    const [f] = await t.db.query(
      'SELECT count, total, peak, least, first_at, last_at FROM run_point_figures WHERE run_id = $1 AND point_id = $2',
      [run.id, point(code)],
    );
    const [n] = await t.db.query(
      `SELECT count(*)::int AS count, sum(COALESCE(amended_value, value)) AS total, max(COALESCE(amended_value, value)) AS peak,
              min(COALESCE(amended_value, value)) AS least, min(taken_at) AS first_at, max(taken_at) AS last_at
         FROM readings WHERE run_id = $1 AND point_id = $2`,
      [run.id, point(code)],
    );
    return { kept: f, recount: n };
  };

  it('stores a 1,200-row file once, reports its bad lines by line number, and raises the high alarm once', async () => {
    // Three bad lines among the good ones: line numbers count the header as line 1.
    const rows = [
      ...lines.slice(0, 500),
      'not-a-date,MB,120',
      ...lines.slice(500, 900),
      `${at(1)},NOPE,1`,
      ...lines.slice(900),
      `${at(2)},MB,abc`,
    ];
    const res = await importCsv(rows);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ stored: 1200, duplicates: 0, rejectedCount: 3 });
    expect(res.body.rejected.map((r: { line: number; column: string }) => [r.line, r.column])).toEqual([
      [502, 'taken_at'],
      [1204, 'value'],
      [903, 'point'],
    ]);
    expect(res.body.alarmsRaised).toBe(1);
    const alarms = (await signedIn(t, operator).get(`/api/alarms?engineId=${engine.id}`)).body as { pointId: string; kind: string }[];
    expect(alarms.filter((a) => a.pointId === point('MB') && a.kind === 'high')).toHaveLength(1);

    const again = await importCsv(lines);
    expect(again.body).toMatchObject({ stored: 0, duplicates: 1200, rejectedCount: 0 });
  });

  it('keeps each point’s figures of the run equal to a recount of its readings, also after an amendment', async () => {
    for (const code of ['MB', 'AMB']) {
      const { kept, recount } = await figures(code);
      expect(kept.count).toBe(600);
      expect(kept.count).toBe(recount.count);
      expect(kept.total).toBeCloseTo(Number(recount.total), 6);
      expect(kept.peak).toBe(Number(recount.peak));
      expect(kept.least).toBe(Number(recount.least));
      expect(new Date(kept.first_at).toISOString()).toBe(new Date(recount.first_at).toISOString());
      expect(new Date(kept.last_at).toISOString()).toBe(new Date(recount.last_at).toISOString());
    }
    expect((await figures('MB')).kept.peak).toBeCloseTo(139, 6);

    // Amending the hottest reading down lowers the kept peak to the next one.
    const [hot] = await t.db.query('SELECT id FROM readings WHERE run_id = $1 AND point_id = $2 ORDER BY value DESC LIMIT 1', [
      run.id,
      point('MB'),
    ]);
    const amend = await signedIn(t, operator).post(`/api/readings/${hot.id}/amendments`).send({ value: 101, reason: 'Probe knocked' });
    expect(amend.status).toBe(201);
    const { kept, recount } = await figures('MB');
    expect(kept.peak).toBeCloseTo(mbAt(598), 3);
    expect(kept.peak).toBe(Number(recount.peak));
    expect(kept.total).toBeCloseTo(Number(recount.total), 6);

    // What the bearing history reads for an open run: the kept figures (mean = total / count).
    const stats = await t.app.get(RunStatsService).stats([point('MB')], [{ id: run.id, state: run.state }]);
    expect(stats).toHaveLength(1);
    expect(stats[0]).toMatchObject({ runId: run.id, pointId: point('MB'), count: 600, peak: kept.peak, least: 100 });
    expect(stats[0].mean).toBeCloseTo(Number(recount.total) / 600, 6);
  });

  it('a logger batch of 300 readings with 100 already stored counts those as duplicates', async () => {
    const admin = await login(t, 'administrator');
    const issued = await signedIn(t, admin).post('/api/loggers').send({ engineId: engine.id, name: 'Bulk logger' });
    expect(issued.status).toBe(201);
    const before = (await figures('THR')).kept;
    expect(before).toBeUndefined();
    const prefix = randomUUID().slice(0, 24); // fresh ids on every run of the file (the e2e database is kept)
    const mk = (i: number) => ({
      clientId: `${prefix}${String(i).padStart(12, '0')}`,
      pointCode: 'THR',
      value: 120 + (i % 10),
      takenAt: at(7200 + i),
    });
    const first = await t.http
      .post('/api/logger/readings')
      .set('x-logger-key', issued.body.key)
      .send({ runId: run.id, readings: Array.from({ length: 100 }, (_, i) => mk(i)) });
    expect(first.body).toMatchObject({ stored: 100, duplicates: 0 });
    const second = await t.http
      .post('/api/logger/readings')
      .set('x-logger-key', issued.body.key)
      .send({ runId: run.id, readings: Array.from({ length: 300 }, (_, i) => mk(i)) });
    expect(second.status).toBe(201);
    expect(second.body).toMatchObject({ stored: 200, duplicates: 100, rejectedCount: 0 });
    const { kept, recount } = await figures('THR');
    expect(kept.count).toBe(300);
    expect(kept.count).toBe(recount.count);
    expect(kept.peak).toBe(129);
    expect(kept.least).toBe(120);
    // A stored id sent again with another value, in a batch large enough to go by COPY: refused whole, nothing kept.
    const reused = await t.http
      .post('/api/logger/readings')
      .set('x-logger-key', issued.body.key)
      .send({ runId: run.id, readings: [...Array.from({ length: 250 }, (_, i) => mk(300 + i)), { ...mk(5), value: 99 }] });
    expect(reused.status).toBe(409);
    expect(reused.body.message).toContain(`clientId ${mk(5).clientId} was already used in this run`);
    expect((await figures('THR')).kept.count).toBe(300);
    // The same id twice in one large batch (in upper case the second time) is one reading.
    const twice = await t.http
      .post('/api/logger/readings')
      .set('x-logger-key', issued.body.key)
      .send({
        runId: run.id,
        readings: [...Array.from({ length: 250 }, (_, i) => mk(300 + i)), { ...mk(300), clientId: mk(300).clientId.toUpperCase() }],
      });
    expect(twice.status).toBe(201);
    expect(twice.body).toMatchObject({ stored: 250, duplicates: 1 });
    expect((await figures('THR')).kept).toMatchObject({ count: 550, peak: 129, least: 120 });
  });
});
