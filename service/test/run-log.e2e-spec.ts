import { randomUUID } from 'node:crypto';
import type { AlarmDto, EngineDetail, IngestResult, ReadingDto, RunDetail, RunDetailWithEngine } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, engineBody, reading } from './factories/engine.factory.js';
import { messagesTo, waitForMessage } from './utils/mail-inbox.js';
import { qualifyInDb } from './factories/checklists.factory.js';

describe('the run log (engines, runs, readings, alarms) against PostgreSQL', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let observer: SignedIn;
  let maintenance: SignedIn;
  let engine: EngineDetail;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    observer = await login(t, 'observer');
    maintenance = await login(t, 'maintenance_lead');
    engine = await createEngine(t, chief.accessToken);
    // Answering alarms needs a current "start and run" qualification on the engine.
    await qualifyInDb(t, operator.account.id, engine.id, ['start_and_run']);
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('engines', () => {
    it('only the chief engineer edits an engine; others read', async () => {
      expect((await signedIn(t, operator).post('/api/engines').send(engineBody())).status).toBe(403);
      expect((await signedIn(t, observer).get(`/api/engines/${engine.id}`)).status).toBe(200);
      expect((await t.http.get('/api/engines')).status).toBe(401);
    });

    it('keeps every change to a limit with who, when and the old value', async () => {
      const body = engineBody(engine.name);
      const detail = (await signedIn(t, chief).get(`/api/engines/${engine.id}`)).body as EngineDetail;
      body.measurementPoints = detail.measurementPoints.map((p) => (p.code === 'MB' ? { ...p, highLimit: 128 } : p));
      body.cylinders = detail.cylinders;
      body.bearings = detail.bearings;
      body.lubricationPoints = detail.lubricationPoints;
      const res = await signedIn(t, chief).put(`/api/engines/${engine.id}`).send(body);
      expect(res.status).toBe(200);
      const changes = (await signedIn(t, observer).get(`/api/engines/${engine.id}/limit-changes`)).body;
      const c = changes.find((x: { field: string }) => x.field === 'highLimit');
      expect(c).toMatchObject({ oldValue: 130, newValue: 128, changedByName: chief.account.displayName });
      // Put it back for the alarm tests below.
      body.measurementPoints = res.body.measurementPoints.map((p: { code: string }) => (p.code === 'MB' ? { ...p, highLimit: 130 } : p));
      engine = (await signedIn(t, chief).put(`/api/engines/${engine.id}`).send(body)).body;
    });

    it('refuses a piston rod as big as its bore, with the field named, and changes nothing', async () => {
      const body = engineBody();
      body.cylinders[0].pistonRodIn = 20;
      const res = await signedIn(t, chief).post('/api/engines').send(body);
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.message)).toContain('cylinders.0.pistonRodIn');
      expect((await signedIn(t, chief).get('/api/engines')).body.some((e: { name: string }) => e.name === body.name)).toBe(false);
    });
  });

  describe('readings and alarms', () => {
    let run: RunDetail;
    beforeAll(async () => {
      run = await createPreparingRun(t, operator.accessToken, engine.id);
    });

    it('a reading crossing high-high raises one alarm and one e-mail to the chief engineer and the maintenance lead', async () => {
      const t0 = Date.now() - 10 * 60_000;
      const res = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({
          takenAt: new Date(t0).toISOString(),
          readings: [reading(point('MB'), 120, new Date(t0)), reading(point('AMB'), 75, new Date(t0))],
        });
      expect(res.status).toBe(201);
      const hot = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: new Date().toISOString(), readings: [reading(point('MB'), 150)] });
      expect(hot.status).toBe(201);
      expect(hot.body.stored).toBe(1);
      const again = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: new Date().toISOString(), readings: [reading(point('MB'), 151)] });
      expect(again.status).toBe(201);
      const alarms = (await signedIn(t, observer).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[];
      const hh = alarms.filter((a) => a.kind === 'high_high' && a.pointId === point('MB'));
      expect(hh).toHaveLength(1);
      expect(hh[0].state).toBe('active_unacknowledged');
      const mail = await waitForMessage(chief.account.email, { subject: /High-high/ });
      expect(mail.text).toContain('Main bearing');
      await waitForMessage(maintenance.account.email, { subject: /High-high/ });
      await new Promise((r) => setTimeout(r, 500));
      expect((await messagesTo(chief.account.email)).filter((m) => /High-high/.test(m.subject))).toHaveLength(1);
      expect((await messagesTo(operator.account.email)).length).toBe(0);
    });

    it('an observer cannot acknowledge; an operator can, and it is recorded', async () => {
      const [a] = ((await signedIn(t, observer).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[]).filter(
        (x) => x.kind === 'high_high',
      );
      expect((await signedIn(t, observer).post(`/api/alarms/${a.id}/acknowledge`)).status).toBe(403);
      const ack = await signedIn(t, operator).post(`/api/alarms/${a.id}/acknowledge`);
      expect(ack.status).toBe(200);
      expect(ack.body).toMatchObject({ state: 'active_acknowledged', acknowledgedByName: operator.account.displayName });
      const twice = await signedIn(t, operator).post(`/api/alarms/${a.id}/acknowledge`);
      expect(twice.status).toBe(400);
    });

    it('shelving needs a reason and at most 24 hours', async () => {
      const [a] = ((await signedIn(t, observer).get(`/api/runs/${run.id}/alarms`)).body as AlarmDto[]).filter((x) => x.kind === 'high');
      expect((await signedIn(t, operator).post(`/api/alarms/${a.id}/shelve`).send({ reason: '', minutes: 30 })).status).toBe(400);
      expect(
        (await signedIn(t, operator).post(`/api/alarms/${a.id}/shelve`).send({ reason: 'Gauge being changed', minutes: 2000 })).status,
      ).toBe(400);
      const ok = await signedIn(t, operator).post(`/api/alarms/${a.id}/shelve`).send({ reason: 'Gauge being changed', minutes: 30 });
      expect(ok.status).toBe(200);
      expect(ok.body).toMatchObject({ state: 'shelved', shelveReason: 'Gauge being changed' });
      expect((await signedIn(t, operator).post(`/api/alarms/${a.id}/unshelve`)).body.state).not.toBe('shelved');
    });

    it('the same reading sent twice is stored once, whatever route it came by', async () => {
      const r = reading(point('THR'), 130);
      const first = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: r.takenAt, readings: [r] });
      expect(first.body).toMatchObject({ stored: 1, duplicates: 0 });
      const second = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: r.takenAt, readings: [r, r] });
      expect(second.body).toMatchObject({ stored: 0, duplicates: 1 });
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE client_id = $1`, [r.clientId]);
      expect(n).toBe(1);
    });

    it('an amendment keeps both values, the reason, who and when', async () => {
      const r = reading(point('SPD'), 47);
      await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: r.takenAt, readings: [r] });
      const list = (await signedIn(t, observer).get(`/api/runs/${run.id}/readings?pointId=${point('SPD')}`)).body as ReadingDto[];
      const stored = list.find((x) => x.clientId === r.clientId)!;
      expect(
        (await signedIn(t, observer).post(`/api/readings/${stored.id}/amendments`).send({ value: 74, reason: 'Misread' })).status,
      ).toBe(403);
      expect((await signedIn(t, operator).post(`/api/readings/${stored.id}/amendments`).send({ value: 74 })).status).toBe(400);
      const res = await signedIn(t, operator)
        .post(`/api/readings/${stored.id}/amendments`)
        .send({ value: 74, reason: 'Misread the counter: 47 for 74' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ value: 74, originalValue: 47 });
      expect(res.body.amendments[0]).toMatchObject({
        oldValue: 47,
        newValue: 74,
        reason: 'Misread the counter: 47 for 74',
        byName: operator.account.displayName,
      });
      const [row] = await t.db.query(`SELECT value, amended_value FROM readings WHERE id = $1`, [stored.id]);
      expect(row).toEqual({ value: 47, amended_value: 74 });
    });

    it('an amendment sent again with its clientId is stored once; the same id with other content is refused', async () => {
      const r = reading(point('SPD'), 52);
      await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: r.takenAt, readings: [r] });
      const list = (await signedIn(t, observer).get(`/api/runs/${run.id}/readings?pointId=${point('SPD')}`)).body as ReadingDto[];
      const stored = list.find((x) => x.clientId === r.clientId)!;
      const clientId = randomUUID();
      const body = { value: 25, reason: 'Digits swapped on the tablet', clientId };
      expect(
        (
          await signedIn(t, operator)
            .post(`/api/readings/${stored.id}/amendments`)
            .send({ ...body, clientId: 'x' })
        ).status,
      ).toBe(400);
      const first = await signedIn(t, operator).post(`/api/readings/${stored.id}/amendments`).send(body);
      expect(first.status).toBe(201);
      const again = await signedIn(t, operator).post(`/api/readings/${stored.id}/amendments`).send(body);
      expect(again.status).toBe(201);
      expect(again.body).toMatchObject({ value: 25, originalValue: 52 });
      expect(again.body.amendments).toHaveLength(1);
      const other = await signedIn(t, operator)
        .post(`/api/readings/${stored.id}/amendments`)
        .send({ ...body, value: 26 });
      expect(other.status).toBe(409);
      expect(other.body.message).toContain('clientId');
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM reading_amendments WHERE reading_id = $1`, [stored.id]);
      expect(n).toBe(1);
      const [row] = await t.db.query(`SELECT amended_value FROM readings WHERE id = $1`, [stored.id]);
      expect(row.amended_value).toBe(25);
    });

    it('bad input gets a 400 naming the problem, and the good part of the batch is kept', async () => {
      const good = reading(point('THR'), 131);
      const res = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({
          takenAt: new Date().toISOString(),
          readings: [
            good,
            { ...reading(point('THR'), 0), value: 'lots' },
            reading(randomUUID(), 10),
            { ...reading(point('THR'), 130), unit: 'bar' },
            reading(point('MB'), 5000),
            reading(point('THR'), 130, new Date(Date.now() + 86_400_000)),
          ],
        });
      expect(res.status).toBe(400);
      const d = res.body.details as IngestResult;
      expect(d.stored).toBe(1);
      expect(d.rejected.map((x) => x.field)).toEqual(['value', 'pointId', 'unit', 'value', 'takenAt']);
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE client_id = $1`, [good.clientId]);
      expect(n).toBe(1);
    });

    it('a CSV file with bad rows keeps the good ones and reports each bad one by line and column', async () => {
      const now = Date.now();
      const iso = (m: number) => new Date(now - m * 60_000).toISOString();
      const csv = [
        'taken_at,point,value,unit',
        `${iso(9)},THR,129.5,psig`,
        `${iso(8)},SPD,74.8,`,
        `not-a-date,THR,130,psig`,
        `${iso(7)},NOPE,12,`,
        `${iso(6)},THR,abc,psig`,
        `${iso(5)},THR,130,bar`,
        `${iso(4)},MB,118.5,degF`,
      ].join('\n');
      const res = await signedIn(t, operator).post(`/api/runs/${run.id}/imports`).set('content-type', 'text/csv').send(csv);
      expect(res.status).toBe(201);
      expect(res.body.stored).toBe(3);
      expect(res.body.rejected.map((r: { line: number; column: string }) => [r.line, r.column])).toEqual([
        [4, 'taken_at'],
        [6, 'value'],
        [5, 'point'],
        [7, 'unit'],
      ]);
      const again = await signedIn(t, operator).post(`/api/runs/${run.id}/imports`).set('content-type', 'text/csv').send(csv);
      expect(again.body).toMatchObject({ stored: 0, duplicates: 3 });
      const wrongType = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/imports`)
        .set('content-type', 'application/json')
        .send({ a: 1 });
      expect(wrongType.status).toBe(415);
      const noHeader = await signedIn(t, operator).post(`/api/runs/${run.id}/imports`).set('content-type', 'text/csv').send('a,b\n1,2');
      expect(noHeader.status).toBe(400);
    });

    it('exports CSV with formula-looking text neutralised, and the PDF log sheet', async () => {
      const csv = await signedIn(t, observer).get(`/api/runs/${run.id}/readings.csv`);
      expect(csv.status).toBe(200);
      expect(csv.headers['content-type']).toContain('text/csv');
      expect(csv.text.split('\r\n')[0]).toBe('taken_at,point,point_label,value,unit,original_value,amendment_reason,source,reading_id');
      expect(csv.text).toContain('Misread the counter: 47 for 74');
      const pdf = await signedIn(t, observer)
        .get(`/api/runs/${run.id}/log-sheet.pdf`)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(pdf.status).toBe(200);
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    });

    it('a data logger pushes with its own key; a revoked key is refused; a user token is not a logger key', async () => {
      const admin = await login(t, 'administrator');
      expect((await signedIn(t, operator).post('/api/loggers').send({ engineId: engine.id, name: 'L1' })).status).toBe(403);
      const issued = await signedIn(t, admin).post('/api/loggers').send({ engineId: engine.id, name: 'Bearing logger' });
      expect(issued.status).toBe(201);
      const key = issued.body.key as string;
      const batch = {
        runId: run.id,
        readings: [{ clientId: randomUUID(), pointCode: 'MB', value: 119, takenAt: new Date().toISOString() }],
      };
      const ok = await t.http.post('/api/logger/readings').set('x-logger-key', key).send(batch);
      expect(ok.status).toBe(201);
      expect(ok.body.stored).toBe(1);
      expect((await signedIn(t, operator).post('/api/logger/readings').send(batch)).status).toBe(401);
      expect((await signedIn(t, admin).post(`/api/loggers/${issued.body.id}/revoke`)).status).toBe(200);
      expect((await t.http.post('/api/logger/readings').set('x-logger-key', key).send(batch)).status).toBe(401);
    });

    it('a closed run refuses new readings and amendments', async () => {
      const other = await createPreparingRun(t, operator.accessToken, (await createEngine(t, chief.accessToken)).id);
      await t.db.query(`UPDATE runs SET state = 'closed' WHERE id = $1`, [other.id]);
      const res = await signedIn(t, operator)
        .post(`/api/runs/${other.id}/rounds`)
        .send({ takenAt: new Date().toISOString(), readings: [reading(randomUUID(), 1)] });
      expect(res.status).toBe(409);
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE run_id = $1`, [other.id]);
      expect(n).toBe(0);
    });
  });

  describe('run states', () => {
    it('refuses a transition that skips a step, and one the role may not make', async () => {
      const run = await createPreparingRun(t, operator.accessToken, (await createEngine(t, chief.accessToken)).id);
      expect((await signedIn(t, operator).post(`/api/runs/${run.id}/transitions`).send({ to: 'closed' })).status).toBe(403);
      expect((await signedIn(t, operator).post(`/api/runs/${run.id}/transitions`).send({ to: 'stopped' })).status).toBe(409);
      expect((await signedIn(t, operator).post(`/api/runs/${run.id}/transitions`).send({ to: 'cleared' })).status).toBe(403);
      expect((await signedIn(t, observer).post(`/api/runs/${run.id}/transitions`).send({ to: 'abandoned', note: 'x' })).status).toBe(403);
      expect((await signedIn(t, operator).post(`/api/runs/${run.id}/transitions`).send({ to: 'abandoned' })).status).toBe(400);
      const ab = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/transitions`)
        .send({ to: 'abandoned', note: 'Boiler feed pump failed' });
      expect(ab.status).toBe(200);
      expect(ab.body).toMatchObject({ state: 'abandoned', abandonedReason: 'Boiler feed pump failed' });
      expect((await signedIn(t, operator).patch(`/api/runs/${run.id}`).send({ notes: 'later' })).status).toBe(409);
    });

    it("a run's answer carries its engine's detail, as the engine's own route gives it, to every role that reads the run", async () => {
      const e = await createEngine(t, chief.accessToken);
      const run = await createPreparingRun(t, operator.accessToken, e.id);
      const own = (await signedIn(t, observer).get(`/api/engines/${e.id}`)).body as EngineDetail;
      for (const who of [observer, maintenance, operator, chief]) {
        const res = await signedIn(t, who).get(`/api/runs/${run.id}`);
        expect(res.status).toBe(200);
        const body = res.body as RunDetailWithEngine;
        expect(body).toMatchObject({ id: run.id, engineId: e.id });
        expect(body.engine).toEqual(own);
      }
      expect((await t.http.get(`/api/runs/${run.id}`)).status).toBe(401);
      expect((await signedIn(t, observer).get(`/api/runs/${randomUUID()}`)).status).toBe(404);
      // The answers of a change stay the run alone.
      const patched = await signedIn(t, operator).patch(`/api/runs/${run.id}`).send({ notes: 'oil checked' });
      expect(patched.status).toBe(200);
      expect(patched.body.engine).toBeUndefined();
    });

    it('an alarm left open by an earlier run is closed out, and the next run raises its own', async () => {
      const e = await createEngine(t, chief.accessToken);
      const mb = e.measurementPoints.find((p) => p.code === 'MB')!.id;
      const first = await createPreparingRun(t, operator.accessToken, e.id);
      await signedIn(t, operator)
        .post(`/api/runs/${first.id}/rounds`)
        .send({ takenAt: new Date().toISOString(), readings: [reading(mb, 135)] });
      await signedIn(t, operator).post(`/api/runs/${first.id}/transitions`).send({ to: 'abandoned', note: 'Called off' });
      const second = await createPreparingRun(t, operator.accessToken, e.id);
      await signedIn(t, operator)
        .post(`/api/runs/${second.id}/rounds`)
        .send({ takenAt: new Date().toISOString(), readings: [reading(mb, 136)] });
      const a1 = (await signedIn(t, observer).get(`/api/runs/${first.id}/alarms`)).body as AlarmDto[];
      const a2 = (await signedIn(t, observer).get(`/api/runs/${second.id}/alarms`)).body as AlarmDto[];
      expect(a1.find((a) => a.kind === 'high')?.state).toBe('normal');
      expect(a2.find((a) => a.kind === 'high')?.state).toBe('active_unacknowledged');
    });

    it('only one run of an engine is under way at a time', async () => {
      const e = await createEngine(t, chief.accessToken);
      await createPreparingRun(t, operator.accessToken, e.id);
      const second = await signedIn(t, operator).post('/api/runs').send({ engineId: e.id, purpose: 'test', title: 'Second' });
      const res = await signedIn(t, operator).post(`/api/runs/${second.body.id}/transitions`).send({ to: 'preparing' });
      expect(res.status).toBe(409);
    });
  });
});
