import type { AlarmDto, AlarmFiguresDto, BoardPoint, EngineDetail } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, reading } from './factories/engine.factory.js';

/**
 * A constructed flood run, counted by hand: the throttle (high 145 psig, deadband 2) reads 146 and 140 in turn
 * every 10 s for 10 minutes (30 raises of its high alarm: one per 146), then 146, 140, 146 a minute apart
 * (2 more) — 32 alarms; 30 in the first 10-minute period (a flood), 2 in the second, none after.
 */
describe('alarm system figures', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let maintenance: SignedIn;
  let engine: EngineDetail;
  let runId: string;
  let figures: AlarmFiguresDto;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    maintenance = await login(t, 'maintenance_lead');
    engine = await createEngine(t, chief.accessToken);
    const thr = engine.measurementPoints.find((p) => p.code === 'THR')!.id;
    const run = await createPreparingRun(t, operator.accessToken, engine.id);
    runId = run.id;
    const T = Date.now() - 25 * 60_000;
    const rows = Array.from({ length: 60 }, (_, i) => reading(thr, i % 2 === 0 ? 146 : 140, new Date(T + i * 10_000)));
    rows.push(
      reading(thr, 146, new Date(T + 12 * 60_000)),
      reading(thr, 140, new Date(T + 13 * 60_000)),
      reading(thr, 146, new Date(T + 14 * 60_000)),
    );
    const res = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({ takenAt: new Date(T).toISOString(), readings: rows });
    expect(res.status).toBe(201);
    const got = await signedIn(t, chief).get(`/api/runs/${run.id}/alarm-figures`);
    expect(got.status).toBe(200);
    figures = got.body as AlarmFiguresDto;
  });
  afterAll(async () => {
    await t?.close();
  });

  it('match the hand counts of the constructed flood run', () => {
    expect(figures.total).toBe(32);
    expect(figures.peakPerTenMinutes).toBe(30);
    expect(figures.floods).toBe(1);
    expect(figures.minutes).toBeGreaterThan(25);
    expect(figures.averagePerTenMinutes).toBeCloseTo((32 * 10) / figures.minutes, 9);
    expect(figures.floodSharePercent).toBeCloseTo((100 * 10) / figures.minutes, 9);
    expect(figures.topTen).toEqual([{ key: 'Throttle · High', count: 32, sharePercent: 100 }]);
    // Raises 20 s apart: four inside one minute, more than the default two, so chattering; the 140 psig
    // readings that cleared it sit 5 psig under the limit, so a deadband of 5.5 would have held it in.
    expect(figures.chattering).toEqual([{ key: 'Throttle · High', count: 4, suggestedDeadband: 5.5, unit: 'psig' }]);
    expect(figures.rows.find((r) => r.label.startsWith('Floods'))).toMatchObject({ value: '1', met: false });
  });

  it('a season adds up its runs; the chief engineer and the maintenance lead may read the figures, an operator may not', async () => {
    const year = new Date().getUTCFullYear();
    const season = await signedIn(t, maintenance).get(`/api/runs/alarm-figures?engineId=${engine.id}&year=${year}`);
    expect(season.status).toBe(200);
    expect(season.body).toMatchObject({ runs: 1, total: 32, floods: 1 });
    expect((await signedIn(t, operator).get(`/api/runs/${runId}/alarm-figures`)).status).toBe(403);
    expect((await signedIn(t, operator).get(`/api/runs/alarm-figures?engineId=${engine.id}&year=${year}`)).status).toBe(403);
    const none = await signedIn(t, chief).get(`/api/runs/alarm-figures?engineId=${engine.id}&year=1990`);
    expect(none.status).toBe(200);
    expect(none.body).toMatchObject({ runs: 0, total: 0, floods: 0, averagePerTenMinutes: 0 });
    const bad = await signedIn(t, chief).get(`/api/runs/alarm-figures?engineId=${engine.id}&year=next`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/year must be a whole number/);
  });

  it('the live board forecasts a steady rise: 110 °F + 1.5 °F/min for 10 min reaches high 130 in about 3.3 min, a pre-alarm', async () => {
    const other = await createEngine(t, chief.accessToken);
    const mb = other.measurementPoints.find((p) => p.code === 'MB')!.id;
    const run = await createPreparingRun(t, operator.accessToken, other.id);
    const T = Date.now() - 11 * 60_000;
    const rows = Array.from({ length: 21 }, (_, i) => reading(mb, 110 + 1.5 * (i * 0.5), new Date(T + i * 30_000)));
    expect(
      (
        await signedIn(t, operator)
          .post(`/api/runs/${run.id}/rounds`)
          .send({ takenAt: new Date(T).toISOString(), readings: rows })
      ).status,
    ).toBe(201);
    const board = (await signedIn(t, operator).get(`/api/runs/${run.id}/board`)).body as BoardPoint[];
    const f = board.find((b) => b.pointId === mb)!.forecast!;
    expect(f).toMatchObject({ limitKind: 'high', limit: 130, preAlarm: true, preAlarmMinutes: 10 });
    expect(Math.abs(f.minutesToLimit - 5 / 1.5)).toBeLessThan(0.1 * (5 / 1.5));
    expect(f.method).toMatch(/Theil–Sen/);

    // The pre-alarm is on the record: an advisory alarm with the forecast it was raised on.
    const recorded = ((await signedIn(t, operator).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[]).filter((a) => a.pointId === mb);
    const pre = recorded.find((a) => a.kind === 'pre_alarm')!;
    expect(pre).toMatchObject({ priority: 'advisory', state: 'active_unacknowledged', limit: 130, suppression: null });
    expect(pre.forecast?.limitKind).toBe('high');
    expect(Math.abs(pre.forecast!.minutesToLimit - 5 / 1.5)).toBeLessThan(0.1 * (5 / 1.5));
    expect(pre.forecast!.ratePerMin).toBeCloseTo(1.5, 1);
    expect(pre.message).toMatch(/high \(130 °F\) in about 3 min/);

    // The bearing cools back to 112 °F: no steady trend toward the limit, the pre-alarm returns to normal.
    const T2 = Date.now() - 30_000;
    const cool = Array.from({ length: 8 }, (_, i) => reading(mb, 118 - i, new Date(T2 - (7 - i) * 1_000)));
    expect(
      (
        await signedIn(t, operator)
          .post(`/api/runs/${run.id}/rounds`)
          .send({ takenAt: new Date(T2).toISOString(), readings: cool })
      ).status,
    ).toBe(201);
    const after = ((await signedIn(t, operator).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[]).find((a) => a.id === pre.id)!;
    expect(after.state).toBe('returned_unacknowledged');
    // Advisory: never counted in the alarm system's figures.
    const figures = (await signedIn(t, chief).get(`/api/runs/${run.id}/alarm-figures`)).body as { total: number };
    expect(figures.total).toBe(0);
  });
});
