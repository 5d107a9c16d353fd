/**
 * A high-high alarm nobody acknowledges within the engine's escalation time is e-mailed a second time, to the next
 * people on the engine's call list. The escalation is a queued job due at raise time + escalateAfterMinutes; the test
 * checks when it is due, then brings it forward in the queue's table rather than waiting the minutes out.
 */
import type { AlarmDto, EngineDetail, RunDetail } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, engineBody, reading } from './factories/engine.factory.js';
import { messagesTo, waitForMessage } from './utils/mail-inbox.js';
import { qualifyInDb } from './factories/checklists.factory.js';

describe('escalation of a high-high alarm nobody acknowledged (API)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let standby: SignedIn;
  let engine: EngineDetail;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    standby = await login(t, 'operator');
    engine = await createEngine(t, chief.accessToken);
    await qualifyInDb(t, operator.account.id, engine.id, ['start_and_run']);
  });
  afterAll(async () => {
    await t?.close();
  });

  /** A high-high alarm on a fresh run (of a fresh engine with the same settings for the second time: one run per engine). */
  async function raiseHighHigh(fresh = false): Promise<AlarmDto> {
    if (fresh) {
      engine = await createEngine(t, chief.accessToken, { ...engineBody(), escalateAfterMinutes: 2, callList: [standby.account.id] });
      await qualifyInDb(t, operator.account.id, engine.id, ['start_and_run']);
    }
    const run: RunDetail = await createPreparingRun(t, operator.accessToken, engine.id);
    const res = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({ takenAt: new Date().toISOString(), readings: [reading(point('MB'), 150)] });
    expect(res.status).toBe(201);
    const alarms = (await signedIn(t, operator).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[];
    const hh = alarms.find((a) => a.kind === 'high_high' && a.pointId === point('MB'));
    expect(hh).toBeDefined();
    return hh!;
  }

  /** The escalation job of an alarm: when it is due. Then made due now. */
  async function bringForward(alarmId: string): Promise<Date> {
    const rows: { start_after: Date }[] = await t.db.query(
      `SELECT start_after FROM pgboss.job WHERE name = 'alarm-escalation' AND data->>'alarmId' = $1`,
      [alarmId],
    );
    expect(rows).toHaveLength(1);
    await t.db.query(`UPDATE pgboss.job SET start_after = now() WHERE name = 'alarm-escalation' AND data->>'alarmId' = $1`, [alarmId]);
    return rows[0].start_after;
  }

  it('the chief engineer sets the escalation time and the call list; a bad list is refused with the field named', async () => {
    const body = { ...engineBody(engine.name), ...engine, escalateAfterMinutes: 2, callList: [chief.account.id, standby.account.id] };
    const bad = await signedIn(t, chief)
      .put(`/api/engines/${engine.id}`)
      .send({ ...body, callList: ['not-a-person'] });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.message)).toContain('callList');
    const { id: _id, runningHours: _h, revolutions: _r, activeRunId: _a, ...write } = body;
    const res = await signedIn(t, chief).put(`/api/engines/${engine.id}`).send(write);
    expect(res.status).toBe(200);
    engine = res.body as EngineDetail;
    expect(engine).toMatchObject({ escalateAfterMinutes: 2, callList: [chief.account.id, standby.account.id] });
  });

  it('unacknowledged after the engine’s time: the next person on the call list is e-mailed, once; recorded on the alarm', async () => {
    const a = await raiseHighHigh();
    const due = await bringForward(a.id);
    expect(Math.round((due.getTime() - new Date(a.raisedAt).getTime()) / 1000)).toBe(120);
    const mail = await waitForMessage(standby.account.email, { subject: /Not acknowledged/ });
    expect(mail.text).toContain('next on the engine’s call list');
    await new Promise((r) => setTimeout(r, 1500));
    expect(await messagesTo(standby.account.email)).toHaveLength(1);
    // The chief engineer had the first e-mail: not e-mailed again.
    expect((await messagesTo(chief.account.email)).filter((m) => m.subject.includes(a.message))).toHaveLength(1);
    const events: { event: string }[] = await t.db.query(`SELECT event FROM alarm_events WHERE alarm_id = $1`, [a.id]);
    expect(events.map((e) => e.event)).toContain('escalate');
  });

  it('acknowledged in time: nobody further is e-mailed', async () => {
    const a = await raiseHighHigh(true);
    expect((await signedIn(t, operator).post(`/api/alarms/${a.id}/acknowledge`)).status).toBe(200);
    const before = (await messagesTo(standby.account.email)).length;
    await bringForward(a.id);
    for (let i = 0; i < 50; i++) {
      const [job]: { state: string }[] = await t.db.query(
        `SELECT state FROM pgboss.job WHERE name = 'alarm-escalation' AND data->>'alarmId' = $1`,
        [a.id],
      );
      if (job?.state === 'completed') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(await messagesTo(standby.account.email)).toHaveLength(before);
  });
});
