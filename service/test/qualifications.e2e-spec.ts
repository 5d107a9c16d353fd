import { randomUUID } from 'node:crypto';
import type { QualificationDto, QualificationMatrix } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { gateEngine, grant, isoDate, preparingRun } from './factories/checklists.factory.js';

describe('crew qualifications (API)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let admin: SignedIn;
  let observer: SignedIn;
  let engine: { id: string; name: string; pointId: string };
  const post = (who: SignedIn, body: Record<string, unknown>) => signedIn(t, who).post('/api/qualifications').send(body);

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    admin = await login(t, 'administrator');
    observer = await login(t, 'observer');
    engine = await gateEngine(t, chief);
  }, 180_000);
  afterAll(async () => {
    await t?.close();
  });

  describe('granting', () => {
    it('is the chief engineer’s: an operator and an administrator are refused with 403', async () => {
      const someone = await login(t, 'operator');
      const body = { userId: someone.account.id, engineId: engine.id, duty: 'pre_lube', grantedOn: isoDate(-1), expiresOn: isoDate(300) };
      expect((await post(operator, body)).status).toBe(403);
      expect((await post(admin, body)).status).toBe(403);
      const ok = await post(chief, { ...body, notes: 'Assessed on the spring training day.' });
      expect(ok.status).toBe(201);
      expect(ok.body).toMatchObject({
        userId: someone.account.id,
        engineId: engine.id,
        duty: 'pre_lube',
        status: 'current',
        daysToExpiry: 300,
        notes: 'Assessed on the spring training day.',
        grantedByName: chief.account.displayName,
      });
    });

    it('refuses a second standing grant of the same duty (409), bad dates (400), unknown people (404) and observers (400)', async () => {
      const someone = await login(t, 'operator');
      const body = { userId: someone.account.id, engineId: engine.id, duty: 'shutdown', grantedOn: isoDate(-1), expiresOn: isoDate(100) };
      expect((await post(chief, body)).status).toBe(201);
      const again = await post(chief, body);
      expect(again.status).toBe(409);
      expect(again.body.message).toContain('Renew it instead');
      expect((await post(chief, { ...body, duty: 'start_and_run', grantedOn: isoDate(10), expiresOn: isoDate(5) })).status).toBe(400);
      const notADate = await post(chief, { ...body, duty: 'start_and_run', expiresOn: '2026-02-30' });
      expect(notADate.status).toBe(400);
      expect(notADate.body.message).toContain('expiresOn must be a date like 2026-12-05');
      expect((await post(chief, { ...body, duty: 'sweeping' })).status).toBe(400);
      expect((await post(chief, { ...body, userId: randomUUID() })).status).toBe(404);
      expect((await post(chief, { ...body, engineId: randomUUID() })).status).toBe(404);
      expect((await post(chief, { ...body, userId: observer.account.id })).status).toBe(400);
    });
  });

  it('shows everyone their own qualifications, observers included', async () => {
    const me = await login(t, 'operator');
    await grant(t, chief, me.account.id, engine.id, ['pre_lube', 'start_and_run']);
    const mine = await signedIn(t, me).get('/api/qualifications/mine');
    expect(mine.status).toBe(200);
    expect((mine.body as QualificationDto[]).map((q) => q.duty).sort()).toEqual(['pre_lube', 'start_and_run']);
    expect(mine.body.every((q: QualificationDto) => q.userId === me.account.id)).toBe(true);
    const theirs = await signedIn(t, observer).get('/api/qualifications/mine');
    expect(theirs.status).toBe(200);
    expect(theirs.body).toEqual([]);
    expect((await signedIn(t, me).get('/api/qualifications')).status).toBe(403);
  });

  it('gives the chief engineer a matrix of the crew with what is about to expire or has expired', async () => {
    const soon = await login(t, 'operator');
    const gone = await login(t, 'operator');
    await grant(t, chief, soon.account.id, engine.id, ['start_and_run'], { from: -300, to: 10 });
    await grant(t, chief, gone.account.id, engine.id, ['start_and_run'], { from: -400, to: -3 });
    await grant(t, chief, gone.account.id, engine.id, ['pre_lube'], { from: -30, to: 300 });
    const res = await signedIn(t, chief).get(`/api/qualifications/matrix?engineId=${engine.id}`);
    expect(res.status).toBe(200);
    const m = res.body as QualificationMatrix;
    expect(m.duties).toEqual(['pre_lube', 'start_and_run', 'shutdown', 'mill_operation']);
    expect(m.warningDays).toBe(30);
    const row = (id: string) => m.rows.find((r) => r.userId === id)!;
    expect(row(soon.account.id).cells.start_and_run).toMatchObject({ status: 'expiring_soon', daysToExpiry: 10 });
    expect(row(gone.account.id).cells.start_and_run).toMatchObject({ status: 'expired', daysToExpiry: -3 });
    expect(row(gone.account.id).cells.pre_lube?.status).toBe('current');
    expect(row(gone.account.id).cells.shutdown).toBeNull();
    expect(m.rows.some((r) => r.userId === observer.account.id)).toBe(false);
    const attention = m.attention.map((q) => q.userId);
    expect(attention).toEqual(expect.arrayContaining([soon.account.id, gone.account.id]));
    // Soonest first: the expired one before the one expiring in ten days.
    expect(attention.indexOf(gone.account.id)).toBeLessThan(attention.indexOf(soon.account.id));
    expect((await signedIn(t, operator).get(`/api/qualifications/matrix?engineId=${engine.id}`)).status).toBe(403);
    expect((await signedIn(t, admin).get(`/api/qualifications/matrix?engineId=${engine.id}`)).status).toBe(200);
    expect((await signedIn(t, chief).get(`/api/qualifications/matrix?engineId=${randomUUID()}`)).status).toBe(404);
  });

  it('renews by withdrawing the old grant and granting a new one, so the old dates stay in the record', async () => {
    const p = await login(t, 'operator');
    const [id] = await grant(t, chief, p.account.id, engine.id, ['start_and_run'], { from: -360, to: -2 });
    expect(
      (
        await signedIn(t, operator)
          .post(`/api/qualifications/${id}/renew`)
          .send({ expiresOn: isoDate(365) })
      ).status,
    ).toBe(403);
    const renewed = await signedIn(t, chief)
      .post(`/api/qualifications/${id}/renew`)
      .send({ expiresOn: isoDate(365) });
    expect(renewed.status).toBe(201);
    expect(renewed.body).toMatchObject({ status: 'current', grantedOn: isoDate(0), expiresOn: isoDate(365) });
    const all = (await signedIn(t, chief).get(`/api/qualifications?userId=${p.account.id}&includeWithdrawn=true`))
      .body as QualificationDto[];
    expect(all).toHaveLength(2);
    const old = all.find((q) => q.id === id)!;
    expect(old).toMatchObject({ status: 'withdrawn', expiresOn: isoDate(-2), withdrawnByName: chief.account.displayName });
    expect(old.withdrawnReason).toContain('Renewed until');
    expect(
      (
        await signedIn(t, chief)
          .post(`/api/qualifications/${id}/renew`)
          .send({ expiresOn: isoDate(365) })
      ).status,
    ).toBe(409);
  });

  describe('withdrawing', () => {
    it('needs a reason, is the chief engineer’s, and takes effect at the start gate at once', async () => {
      const p = await login(t, 'operator');
      const [id] = await grant(t, chief, p.account.id, engine.id, ['start_and_run']);
      const run = await preparingRun(t, p, engine.id);
      await signedIn(t, chief).post(`/api/runs/${run.id}/transitions`).send({ to: 'cleared' });
      const before = (await signedIn(t, p).get(`/api/runs/${run.id}/start-gate`)).body;
      expect(before.reasons.map((r: { code: string }) => r.code)).not.toContain('qualification_missing');

      expect((await signedIn(t, chief).post(`/api/qualifications/${id}/withdraw`).send({ reason: '' })).status).toBe(400);
      expect((await signedIn(t, operator).post(`/api/qualifications/${id}/withdraw`).send({ reason: 'Not allowed' })).status).toBe(403);
      const w = await signedIn(t, chief).post(`/api/qualifications/${id}/withdraw`).send({ reason: 'Missed the refresher course.' });
      expect(w.status).toBe(200);
      expect(w.body).toMatchObject({ status: 'withdrawn', withdrawnReason: 'Missed the refresher course.' });
      expect((await signedIn(t, chief).post(`/api/qualifications/${id}/withdraw`).send({ reason: 'Twice' })).status).toBe(409);

      const after = await signedIn(t, p).post(`/api/runs/${run.id}/transitions`).send({ to: 'running' });
      expect(after.status).toBe(409);
      const reason = after.body.details.reasons.find((r: { code: string }) => r.code === 'qualification_missing');
      expect(reason.message).toContain('was withdrawn');
    });
  });

  describe('acknowledging alarms', () => {
    /** A run of a fresh engine with an active high-high alarm. */
    async function alarmOn() {
      const e = await gateEngine(t, chief);
      const starter = await login(t, 'operator');
      const run = await preparingRun(t, starter, e.id);
      const now = new Date().toISOString();
      await signedIn(t, starter)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: now, readings: [{ clientId: randomUUID(), pointId: e.pointId, value: 150, takenAt: now }] });
      const alarms = (await signedIn(t, starter).get(`/api/runs/${run.id}/alarms`)).body;
      expect(alarms.length).toBeGreaterThan(0);
      return { e, alarmId: alarms[0].id as string };
    }

    it('needs a current start-and-run qualification on that engine; nobody is exempt', async () => {
      const { e, alarmId } = await alarmOn();
      const unq = await login(t, 'operator');
      const refused = await signedIn(t, unq).post(`/api/alarms/${alarmId}/acknowledge`).send();
      expect(refused.status).toBe(403);
      expect(refused.body.message).toContain('start and run qualification for');
      expect(refused.body.message).toContain('answer alarms');
      const chiefWithout = await login(t, 'chief_engineer');
      expect((await signedIn(t, chiefWithout).post(`/api/alarms/${alarmId}/acknowledge`).send()).status).toBe(403);
      const expired = await login(t, 'operator');
      await grant(t, chief, expired.account.id, e.id, ['start_and_run'], { from: -400, to: -1 });
      const exp = await signedIn(t, expired).post(`/api/alarms/${alarmId}/acknowledge`).send();
      expect(exp.status).toBe(403);
      expect(exp.body.message).toContain('expired on');
      const qualifiedElsewhere = await login(t, 'operator');
      await grant(t, chief, qualifiedElsewhere.account.id, engine.id, ['start_and_run']);
      expect((await signedIn(t, qualifiedElsewhere).post(`/api/alarms/${alarmId}/acknowledge`).send()).status).toBe(403);
      const ok = await login(t, 'operator');
      await grant(t, chief, ok.account.id, e.id, ['start_and_run']);
      const acked = await signedIn(t, ok).post(`/api/alarms/${alarmId}/acknowledge`).send();
      expect(acked.status).toBe(200);
      expect(acked.body.acknowledgedByName).toBe(ok.account.displayName);
    });

    it('applies to shelving as well', async () => {
      const { alarmId } = await alarmOn();
      const unq = await login(t, 'operator');
      expect(
        (await signedIn(t, unq).post(`/api/alarms/${alarmId}/shelve`).send({ reason: 'Known sensor fault.', minutes: 30 })).status,
      ).toBe(403);
    });
  });
});
