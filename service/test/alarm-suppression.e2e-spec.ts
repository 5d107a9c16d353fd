import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import { ALARM_DUTY, type AlarmDto, type EngineDetail, type EngineWriteRequest, type RunSummary } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, reading } from './factories/engine.factory.js';
import { qualifyInDb } from './factories/checklists.factory.js';

/** The demo engine's settings (samples/engine-no2.json): main bearing 2 high 130, high-high 145, 60 above ambient, deadband 2 (°F). */
function demoEngine(): EngineWriteRequest {
  const raw = JSON.parse(readFileSync(new URL('../../samples/engine-no2.json', import.meta.url), 'utf8')) as Record<string, unknown>;
  // The seed's counters are not part of the engine form.
  delete raw.baselineHours;
  delete raw.baselineRevolutions;
  const body = raw as unknown as EngineWriteRequest;
  body.name = `Demo copy ${randomUUID().slice(0, 8)}`;
  // The chief engineer's choice for the test: oil pressure low means nothing while the run is being prepared.
  body.measurementPoints = body.measurementPoints.map((p) => (p.code === 'OIL-P' ? { ...p, suppressedInStates: ['preparing'] } : p));
  return body;
}

describe('alarms suppressed by design and by state', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let engine: EngineDetail;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;
  const runAlarms = async (runId: string) => (await signedIn(t, operator).get(`/api/runs/${runId}/alarms`)).body as AlarmDto[];
  const round = async (runId: string, at: Date, rows: [string, number][]) => {
    const res = await signedIn(t, operator)
      .post(`/api/runs/${runId}/rounds`)
      .send({ takenAt: at.toISOString(), readings: rows.map(([code, v]) => reading(point(code), v, at)) });
    expect(res.status).toBe(201);
    return res.body as { alarmsRaised: number };
  };

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    engine = await createEngine(t, chief.accessToken, demoEngine());
    await qualifyInDb(t, operator.account.id, engine.id, [ALARM_DUTY]);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('the 152 °F round on main bearing 2 raises one annunciated alarm and two suppressed by it; ack, clear release', async () => {
    const run = await createPreparingRun(t, operator.accessToken, engine.id);
    const t0 = Date.now() - 20 * 60_000;
    const first = await round(run.id, new Date(t0), [
      ['AMB-T', 80],
      ['MB2-T', 152],
    ]);
    expect(first.alarmsRaised).toBe(1);
    let alarms = (await runAlarms(run.id)).filter((a) => a.pointId === point('MB2-T'));
    const byKind = (k: string) => alarms.find((a) => a.kind === k)!;
    expect(alarms.map((a) => a.kind).sort()).toEqual(['above_ambient', 'high', 'high_high']);
    const hh = byKind('high_high');
    expect(hh).toMatchObject({ suppression: null, state: 'active_unacknowledged' });
    for (const k of ['high', 'above_ambient'])
      expect(byKind(k)).toMatchObject({ suppression: 'design', suppressedById: hh.id, suppressedByLabel: 'High-high' });
    // Not counted as waiting: the run list counts the one annunciated alarm.
    const list = (await signedIn(t, operator).get(`/api/runs?engineId=${engine.id}`)).body as RunSummary[];
    expect(list.find((r) => r.id === run.id)?.openAlarms).toBe(1);

    // Acknowledging the high-high leaves the others suppressed.
    expect((await signedIn(t, operator).post(`/api/alarms/${hh.id}/acknowledge`)).status).toBe(200);
    alarms = (await runAlarms(run.id)).filter((a) => a.pointId === point('MB2-T'));
    expect(byKind('high').suppression).toBe('design');

    // 140 °F: below 145 − 2, high-high clears; still above 130 − 2, so high is released (annunciated, waiting)
    // and the rise above ambient (140 − 80 = 60, not below 60 − 2) is now suppressed by high.
    const second = await round(run.id, new Date(t0 + 10 * 60_000), [['MB2-T', 140]]);
    expect(second.alarmsRaised).toBe(1);
    alarms = (await runAlarms(run.id)).filter((a) => a.pointId === point('MB2-T'));
    expect(byKind('high_high').state).toBe('normal');
    expect(byKind('high')).toMatchObject({ suppression: null, state: 'active_unacknowledged' });
    expect(byKind('above_ambient')).toMatchObject({ suppression: 'design', suppressedById: byKind('high').id, suppressedByLabel: 'High' });

    // 125 °F: high returns to normal (waits for acknowledgement); the suppressed rise above ambient (45) goes straight to normal.
    await round(run.id, new Date(t0 + 20 * 60_000), [['MB2-T', 125]]);
    alarms = (await runAlarms(run.id)).filter((a) => a.pointId === point('MB2-T'));
    expect(byKind('high').state).toBe('returned_unacknowledged');
    expect(byKind('above_ambient')).toMatchObject({ state: 'normal', suppression: null });

    // Every suppression and release is on the record.
    const events: { kind: string; event: string; note: string }[] = await t.db.query(
      `SELECT a.kind, e.event, e.note FROM alarm_events e JOIN alarms a ON a.id = e.alarm_id
        WHERE a.run_id = $1 AND e.event IN ('suppress', 'release') ORDER BY e.at, a.kind`,
      [run.id],
    );
    expect(events).toEqual([
      { kind: 'above_ambient', event: 'suppress', note: 'Suppressed by High-high.' },
      { kind: 'high', event: 'suppress', note: 'Suppressed by High-high.' },
      { kind: 'above_ambient', event: 'suppress', note: 'Suppressed by High.' },
      { kind: 'high', event: 'release', note: 'Released: the alarm that suppressed it cleared.' },
    ]);
  });

  it('oil pressure low while the run is being prepared is suppressed by state, recorded and not annunciated', async () => {
    // A second copy of the engine: the first one's run is still being prepared.
    engine = await createEngine(t, chief.accessToken, demoEngine());
    const run = await createPreparingRun(t, operator.accessToken, engine.id);
    const res = await round(run.id, new Date(), [['OIL-P', 2]]);
    expect(res.alarmsRaised).toBe(0);
    const [low] = (await runAlarms(run.id)).filter((a) => a.pointId === point('OIL-P'));
    expect(low).toMatchObject({ kind: 'low', suppression: 'state', suppressedByLabel: 'the run state', state: 'active_unacknowledged' });

    // The run is cleared to start: the change itself releases the alarm (no further reading of the point).
    expect((await signedIn(t, chief).post(`/api/runs/${run.id}/transitions`).send({ to: 'cleared' })).status).toBe(200);
    const [released] = (await runAlarms(run.id)).filter((a) => a.pointId === point('OIL-P'));
    expect(released).toMatchObject({ id: low.id, kind: 'low', suppression: null, suppressedByLabel: null, state: 'active_unacknowledged' });
    const events: { event: string; note: string }[] = await t.db.query(
      `SELECT event, note FROM alarm_events WHERE alarm_id = $1 AND event IN ('suppress', 'release') ORDER BY at`,
      [low.id],
    );
    expect(events).toEqual([
      { event: 'suppress', note: 'Suppressed by run state preparing.' },
      { event: 'release', note: 'Released: the run state changed to cleared to start.' },
    ]);
    // Back to preparing (the chief engineer's choice): the still-active alarm is suppressed by state again.
    expect((await signedIn(t, chief).post(`/api/runs/${run.id}/transitions`).send({ to: 'preparing' })).status).toBe(200);
    const [again] = (await runAlarms(run.id)).filter((a) => a.pointId === point('OIL-P'));
    expect(again).toMatchObject({ id: low.id, suppression: 'state' });
  });

  it('the engine page carries the suppression settings of each point', async () => {
    const got = (await signedIn(t, operator).get(`/api/engines/${engine.id}`)).body as EngineDetail;
    const oil = got.measurementPoints.find((p) => p.code === 'OIL-P')!;
    expect(oil).toMatchObject({ suppressedInStates: ['preparing'], relatedSuppression: true });
    const bad = await signedIn(t, chief)
      .put(`/api/engines/${engine.id}`)
      .send({ ...demoEngine(), measurementPoints: [{ ...got.measurementPoints[0], suppressedInStates: ['asleep'] }] });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/suppressedInStates/);
  });
});
