import type {
  BearingHistory,
  BearingLubricationAnalysis,
  DueList,
  EngineDetail,
  EngineLubrication,
  InspectionDto,
  InspectionPlanDto,
  OilDto,
  WorkRecordDto,
} from '@crankjournal/shared-types';
import { AppConfig } from '../src/config/app-config.service.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, engineBody } from './factories/engine.factory.js';
import { insertClosedRun, TINY_PDF, TINY_PNG } from './factories/maintenance.factory.js';

const DAY = 86_400_000;

describe('maintenance and lubrication (API against PostgreSQL and the object store)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let lead: SignedIn;
  let operator: SignedIn;
  let observer: SignedIn;
  let millLead: SignedIn;
  let engine: EngineDetail;
  const bearing = () => engine.bearings.find((b) => b.label === 'Main')!;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    lead = await login(t, 'maintenance_lead');
    operator = await login(t, 'operator');
    observer = await login(t, 'observer');
    millLead = await login(t, 'mill_lead');
    const body = engineBody();
    body.rotatingWeightLb = 60_000;
    body.bearings = [{ ...body.bearings[0], radialClearanceIn: 0.006 }];
    engine = await createEngine(t, chief.accessToken, body);
  });
  afterAll(async () => {
    await t?.close();
  });

  const inspectionBody = (over: Record<string, unknown> = {}) => ({
    engineId: engine.id,
    bearingId: bearing().id,
    kind: 'bearing_clearance',
    title: 'Main bearing clearance check',
    inspectedAt: new Date(Date.now() - DAY).toISOString(),
    findings: 'Top half scored on one side.',
    followUpActions: [{ text: 'Scrape and reset the clearance' }],
    measurements: [
      {
        kind: 'clearance_lead_wire',
        label: 'Top, centre',
        value: 0.027,
        unit: 'in',
        nominal: 0.016,
        toleranceMin: 0.012,
        toleranceMax: 0.02,
      },
      { kind: 'clearance_feeler', label: 'Side', value: 0.009, unit: 'in', toleranceMin: 0.004, toleranceMax: 0.012 },
    ],
    ...over,
  });

  describe('inspections', () => {
    it('a measurement above its tolerance is marked out of tolerance, by how much, and kept so in the record', async () => {
      const res = await signedIn(t, lead).post('/api/maintenance/inspections').send(inspectionBody());
      expect(res.status).toBe(201);
      const i = res.body as InspectionDto;
      expect(i.outOfToleranceCount).toBe(1);
      const [lead1, side] = i.measurements;
      expect(lead1).toMatchObject({ outOfTolerance: true, status: 'above' });
      expect(lead1.excess).toBeCloseTo(0.007, 9);
      expect(side).toMatchObject({ outOfTolerance: false, status: 'within', excess: 0 });
      const rows = await t.db.query(
        `SELECT label, out_of_tolerance FROM inspection_measurements WHERE inspection_id = $1 ORDER BY sequence`,
        [i.id],
      );
      expect(rows).toEqual([
        { label: 'Top, centre', out_of_tolerance: true },
        { label: 'Side', out_of_tolerance: false },
      ]);
      const again = (await signedIn(t, observer).get(`/api/maintenance/inspections/${i.id}`)).body as InspectionDto;
      expect(again.measurements[0].outOfTolerance).toBe(true);
      expect(again.recordedByName).toBe(lead.account.displayName);
    });

    it(
      'refuses, naming the field, a range upside down, a web deflection without its crank angle and a bearing of ' + 'another engine',
      async () => {
        const upside = await signedIn(t, lead)
          .post('/api/maintenance/inspections')
          .send(
            inspectionBody({
              measurements: [{ kind: 'shaft_level', label: 'MB', value: 0.001, unit: 'in/ft', toleranceMin: 0.002, toleranceMax: -0.002 }],
            }),
          );
        expect(upside.status).toBe(400);
        expect(JSON.stringify(upside.body.message)).toContain('measurements.0.toleranceMin');
        const web = await signedIn(t, lead)
          .post('/api/maintenance/inspections')
          .send(
            inspectionBody({
              kind: 'crank_web_deflection',
              measurements: [{ kind: 'web_deflection', label: '90°', value: 0.001, unit: 'in' }],
            }),
          );
        expect(web.status).toBe(400);
        expect(JSON.stringify(web.body.message)).toContain('crankAngleDeg');
        const other = await createEngine(t, chief.accessToken);
        const wrong = await signedIn(t, lead)
          .post('/api/maintenance/inspections')
          .send(inspectionBody({ engineId: other.id }));
        expect(wrong.status).toBe(400);
        expect(
          (
            await signedIn(t, lead)
              .post('/api/maintenance/inspections')
              .send(inspectionBody({ unit: 'furlong' }))
          ).status,
        ).toBe(400);
        expect(
          (
            await signedIn(t, lead)
              .post('/api/maintenance/inspections')
              .send(inspectionBody({ engineId: '6f1c2d3e-4b5a-4c6d-8e7f-0a1b2c3d4e5f' }))
          ).status,
        ).toBe(404);
        expect((await signedIn(t, lead).get('/api/maintenance/inspections/not-a-uuid')).status).toBe(400);
      },
    );

    it('observers, operators and the mill lead cannot record; the chief engineer can', async () => {
      for (const who of [observer, operator, millLead])
        expect((await signedIn(t, who).post('/api/maintenance/inspections').send(inspectionBody())).status).toBe(403);
      expect(
        (
          await signedIn(t, chief)
            .post('/api/maintenance/inspections')
            .send(inspectionBody({ title: 'By the chief' }))
        ).status,
      ).toBe(201);
      expect((await signedIn(t, observer).get('/api/maintenance/inspections')).status).toBe(200);
      expect((await t.http.get('/api/maintenance/inspections')).status).toBe(401);
    });
  });

  describe('photos and documents', () => {
    let inspectionId: string;
    beforeAll(async () => {
      inspectionId = (
        (
          await signedIn(t, lead)
            .post('/api/maintenance/inspections')
            .send(inspectionBody({ title: 'With photos' }))
        ).body as InspectionDto
      ).id;
    });
    const upload = (who: SignedIn, body: Buffer, name: string, type: string) =>
      signedIn(t, who)
        .post(`/api/maintenance/inspections/${inspectionId}/attachments`)
        .field('caption', 'Top half as lifted')
        .attach('file', body, { filename: name, contentType: type });

    it('stores an image in the object store, judged by its bytes, and gives the same bytes back', async () => {
      const res = await upload(lead, TINY_PNG, 'shell.png', 'image/png');
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        kind: 'image',
        contentType: 'image/png',
        sizeBytes: TINY_PNG.length,
        caption: 'Top half as lifted',
      });
      const back = await signedIn(t, observer)
        .get(`/api/maintenance/attachments/${res.body.id}/content`)
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(back.status).toBe(200);
      expect(back.headers['content-type']).toBe('image/png');
      expect(Buffer.compare(back.body as Buffer, TINY_PNG)).toBe(0);
    });

    it('takes a PDF document', async () => {
      const res = await upload(chief, TINY_PDF, 'report.pdf', 'application/pdf');
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ kind: 'pdf', contentType: 'application/pdf' });
    });

    it('refuses a file that is not an image or a PDF, whatever its name and declared type', async () => {
      const text = await upload(lead, Buffer.from('this is only text, not a photograph'), 'photo.png', 'image/png');
      expect(text.status).toBe(415);
      expect(JSON.stringify(text.body.message)).toMatch(/photos .* and PDF/);
      const zip = await upload(lead, Buffer.from('504b0304140000000800', 'hex'), 'photo.jpg', 'image/jpeg');
      expect(zip.status).toBe(415);
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM inspection_attachments WHERE inspection_id = $1`, [inspectionId]);
      expect(n).toBe(2);
    });

    it('refuses a file larger than UPLOAD_MAX_BYTES with 413', async () => {
      const max = t.app.get(AppConfig).get('UPLOAD_MAX_BYTES');
      const big = Buffer.concat([TINY_PNG, Buffer.alloc(max + 1 - TINY_PNG.length)]);
      const res = await upload(lead, big, 'big.png', 'image/png');
      expect(res.status).toBe(413);
    });

    it('an observer cannot upload; no file is a 400', async () => {
      expect((await upload(observer, TINY_PNG, 'shell.png', 'image/png')).status).toBe(403);
      const none = await signedIn(t, lead).post(`/api/maintenance/inspections/${inspectionId}/attachments`).field('caption', 'nothing');
      expect(none.status).toBe(400);
    });
  });

  describe('plans, the due list and work that resets them', () => {
    it('calendar: a 30-day plan last done 40 days ago is overdue in the due list, governed by the calendar', async () => {
      const res = await signedIn(t, lead)
        .post('/api/maintenance/plans')
        .send({
          engineId: engine.id,
          componentKind: 'bearing',
          bearingId: bearing().id,
          title: 'Monthly look at the main bearing',
          inspectionKind: 'general',
          intervalDays: 30,
          lastDoneAt: new Date(Date.now() - 40 * DAY).toISOString(),
          hazards: ['lockout'],
        });
      expect(res.status).toBe(201);
      const plan = res.body as InspectionPlanDto;
      expect(plan.due.status).toBe('overrun');
      expect(plan.due.governing).toBe('calendar_days');
      const due = (await signedIn(t, observer).get(`/api/maintenance/due?engineId=${engine.id}`)).body as DueList;
      expect(due.items[0].id).toBe(plan.id);
      expect(due.ruleText).toMatch(/whichever/);
    });

    it('running hours: the hours run since it was last done count, and come due before the calendar', async () => {
      const plan = (
        await signedIn(t, chief)
          .post('/api/maintenance/plans')
          .send({
            engineId: engine.id,
            componentKind: 'crankshaft',
            componentLabel: 'Crankshaft webs',
            title: 'Web deflection',
            inspectionKind: 'crank_web_deflection',
            intervalRunHours: 4,
            intervalDays: 365,
            lastDoneAt: new Date(Date.now() - 20 * DAY).toISOString(),
          })
      ).body as InspectionPlanDto;
      expect(plan.due.status).toBe('in_hand');
      await insertClosedRun(t, engine, chief.account.id, {
        title: 'Hours run',
        startedAt: new Date(Date.now() - 10 * DAY),
        hours: 5,
        ambientF: 60,
        riseF: 40,
        speedRpm: 75,
      });
      const after = (await signedIn(t, observer).get(`/api/maintenance/plans/${plan.id}`)).body as InspectionPlanDto;
      expect(after.due.status).toBe('overrun');
      expect(after.due.governing).toBe('run_hours');
      const hours = after.due.criteria.find((c) => c.criterion === 'run_hours')!;
      expect(hours.used).toBeCloseTo(5, 6);
      expect(hours.remaining).toBeCloseTo(-1, 6);
    });

    it('closing a work record resets the counters of the plans it satisfies; a closed record cannot change', async () => {
      const plan = (
        await signedIn(t, lead)
          .post('/api/maintenance/plans')
          .send({
            engineId: engine.id,
            componentKind: 'bearing',
            bearingId: bearing().id,
            title: 'Clearance every 2 h',
            inspectionKind: 'bearing_clearance',
            intervalRunHours: 2,
            lastDoneAt: new Date(Date.now() - 30 * DAY).toISOString(),
          })
      ).body as InspectionPlanDto;
      expect(plan.due.status).toBe('overrun');
      const created = await signedIn(t, lead)
        .post('/api/maintenance/work-records')
        .send({
          engineId: engine.id,
          bearingId: bearing().id,
          title: 'Scraped and shimmed',
          performedBy: 'Test crew',
          parts: [{ description: 'Shim', quantity: 2, unit: 'pieces' }],
          labourHours: 6,
          hazards: ['lockout', 'lifting'],
          satisfiesPlanIds: [plan.id],
          startedAt: new Date(Date.now() - 2 * DAY).toISOString(),
        });
      expect(created.status).toBe(201);
      const work = created.body as WorkRecordDto;
      expect(work.status).toBe('open');
      expect((await signedIn(t, observer).post(`/api/maintenance/work-records/${work.id}/close`).send({})).status).toBe(403);
      const completedAt = new Date(Date.now() - DAY);
      const closed = await signedIn(t, lead)
        .post(`/api/maintenance/work-records/${work.id}/close`)
        .send({ completedAt: completedAt.toISOString(), note: 'Done' });
      expect(closed.status).toBe(200);
      const c = closed.body as WorkRecordDto;
      const counters = (await signedIn(t, lead).get(`/api/engines/${engine.id}`)).body as EngineDetail;
      expect(c).toMatchObject({
        status: 'closed',
        resetPlans: [{ id: plan.id, title: plan.title }],
        closedByName: lead.account.displayName,
      });
      expect(c.runHoursAtCompletion).toBeCloseTo(counters.runningHours, 6);
      const reset = (await signedIn(t, lead).get(`/api/maintenance/plans/${plan.id}`)).body as InspectionPlanDto;
      expect(reset.lastDoneAt).toBe(completedAt.toISOString());
      expect(reset.lastResetByWorkRecordId).toBe(work.id);
      expect(reset.lastDoneRunHours).toBeCloseTo(counters.runningHours, 6);
      expect(reset.due.status).toBe('in_hand');
      expect((await signedIn(t, lead).post(`/api/maintenance/work-records/${work.id}/close`).send({})).status).toBe(409);
      expect((await signedIn(t, lead).patch(`/api/maintenance/work-records/${work.id}`).send({ title: 'Changed' })).status).toBe(409);
    });

    it(
      'refuses a plan without an interval, a completion before the work started, and writers other than the ' +
        'maintenance lead and the chief',
      async () => {
        const none = await signedIn(t, lead)
          .post('/api/maintenance/plans')
          .send({ engineId: engine.id, componentKind: 'engine', title: 'No interval', inspectionKind: 'general' });
        expect(none.status).toBe(400);
        expect(JSON.stringify(none.body.message)).toMatch(/at least one interval/);
        for (const who of [observer, operator]) {
          expect(
            (
              await signedIn(t, who)
                .post('/api/maintenance/plans')
                .send({ engineId: engine.id, componentKind: 'engine', title: 'x', inspectionKind: 'general', intervalDays: 5 })
            ).status,
          ).toBe(403);
          expect(
            (await signedIn(t, who).post('/api/maintenance/work-records').send({ engineId: engine.id, title: 'x', performedBy: 'x' }))
              .status,
          ).toBe(403);
        }
        const w = (
          await signedIn(t, chief)
            .post('/api/maintenance/work-records')
            .send({ engineId: engine.id, title: 'Early close', performedBy: 'Chief', startedAt: new Date(Date.now() - DAY).toISOString() })
        ).body as WorkRecordDto;
        expect(
          (
            await signedIn(t, chief)
              .post(`/api/maintenance/work-records/${w.id}/close`)
              .send({ completedAt: new Date(Date.now() - 3 * DAY).toISOString() })
          ).status,
        ).toBe(400);
      },
    );

    it('work prompted by an inspection carries out its follow-up actions', async () => {
      const i = (
        await signedIn(t, lead)
          .post('/api/maintenance/inspections')
          .send(inspectionBody({ title: 'Prompting inspection' }))
      ).body as InspectionDto;
      const bad = await signedIn(t, lead)
        .post('/api/maintenance/work-records')
        .send({ engineId: engine.id, title: 'Follow-up', performedBy: 'Crew', promptedByInspectionId: i.id, followUpActionIndexes: [3] });
      expect(bad.status).toBe(400);
      const w = (
        await signedIn(t, lead)
          .post('/api/maintenance/work-records')
          .send({ engineId: engine.id, title: 'Follow-up', performedBy: 'Crew', promptedByInspectionId: i.id, followUpActionIndexes: [0] })
      ).body as WorkRecordDto;
      const after = (await signedIn(t, observer).get(`/api/maintenance/inspections/${i.id}`)).body as InspectionDto;
      expect(after.followUpActions[0].workRecordId).toBe(w.id);
      expect(after.workRecords.map((x) => x.id)).toContain(w.id);
    });
  });

  describe('bearing history and the drift flag', () => {
    let hotRun: string;
    let fresh: EngineDetail;
    beforeAll(async () => {
      const body = engineBody();
      fresh = await createEngine(t, chief.accessToken, body);
      // Synthetic season: six runs at 75 rpm with rises of about 40 °F, one of them 75 °F.
      const rises = [40.2, 41.0, 39.8, 75.0, 40.6, 40.1];
      for (const [i, rise] of rises.entries()) {
        const id = await insertClosedRun(t, fresh, chief.account.id, {
          title: `Season run ${i + 1}`,
          startedAt: new Date(Date.now() - (60 - i * 7) * DAY),
          hours: 3,
          ambientF: 60 + i,
          riseF: rise,
          speedRpm: 75,
        });
        if (rise > 70) hotRun = id;
      }
    });

    it('flags the run above the band and no other, and states the rule', async () => {
      const b = fresh.bearings[0];
      const res = await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history`);
      expect(res.status).toBe(200);
      const h = res.body as BearingHistory;
      expect(h.runs).toHaveLength(6);
      expect(h.runs.filter((r) => r.drift?.flagged).map((r) => r.runId)).toEqual([hotRun]);
      expect(h.runs[0].drift).toBeNull();
      // Runs 2 and 3 have one and two earlier runs: too few to judge; the hot fourth run is judged against three.
      expect(h.runs.slice(1, 3).map((r) => [r.drift, r.driftNote])).toEqual([
        [null, 'Too few runs to judge: 1 earlier run, at least 3 are needed.'],
        [null, 'Too few runs to judge: 2 earlier runs, at least 3 are needed.'],
      ]);
      expect(h.settings).toMatchObject({ confidence: 0.95, minRunsToJudge: 3 });
      expect(h.ruleText).toMatch(/95 % prediction interval/);
      expect(h.loadMeasure).toBe('speed_rpm');
      expect(h.ruleText).toMatch(/more than 5 °F above the top of the band/);
      const hot = h.runs.find((r) => r.runId === hotRun)!;
      expect(hot.riseAtPeakF).toBeGreaterThan(hot.drift!.limitF);
      // A prediction interval about the mean of three runs at one speed: 2 degrees of freedom, t(0.975, 2) = 4.303
      // (NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2).
      expect(hot.drift).toMatchObject({ historyRuns: 3, bandKind: 'mean', degreesOfFreedom: 2, confidence: 0.95 });
      expect(hot.drift!.tQuantile).toBeCloseTo(4.303, 3);
      expect(hot.drift!.limitF - hot.drift!.halfWidthF - 5).toBeCloseTo(hot.drift!.expectedRiseF, 9);
      expect(hot.meanSpeedRpm).toBeCloseTo(75, 9);
      expect(h.band!.pointCount).toBe(5);
      // Closed runs' figures are kept for the next time.
      const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM run_point_stats WHERE run_id = $1`, [hotRun]);
      expect(n).toBeGreaterThanOrEqual(3);
      const again = (await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history`)).body as BearingHistory;
      expect(again.runs.map((r) => r.peakTemperature)).toEqual(h.runs.map((r) => r.peakTemperature));
      // Answers go compressed to a client that accepts it (a tablet on poor Wi-Fi), plain to one that does not.
      const gz = await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history`).set('Accept-Encoding', 'gzip');
      expect(gz.headers['content-encoding']).toBe('gzip');
      expect((gz.body as BearingHistory).runs).toEqual(again.runs);
      const plain = await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history`).set('Accept-Encoding', 'identity');
      expect(plain.headers['content-encoding']).toBeUndefined();
    });

    it('puts inspections and work on the same timeline', async () => {
      const b = fresh.bearings[0];
      await signedIn(t, lead)
        .post('/api/maintenance/inspections')
        .send(inspectionBody({ engineId: fresh.id, bearingId: b.id, title: 'After the hot run', promptedByRunId: hotRun }));
      const h = (await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history`)).body as BearingHistory;
      const kinds = h.timeline.map((e) => e.type);
      expect(kinds).toContain('inspection');
      const insp = h.timeline.find((e) => e.type === 'inspection')!;
      expect(insp.attention).toBe(true);
      expect(h.timeline.map((e) => e.at)).toEqual([...h.timeline.map((e) => e.at)].sort());
    });

    it('gives the history as CSV (cells neutralised) and as a PDF report', async () => {
      const b = fresh.bearings[0];
      await signedIn(t, lead)
        .post('/api/maintenance/inspections')
        .send(inspectionBody({ engineId: fresh.id, bearingId: b.id, title: '=HYPERLINK("http://example.test")' }));
      const csv = await signedIn(t, observer).get(`/api/maintenance/bearings/${b.id}/history.csv`);
      expect(csv.status).toBe(200);
      expect(csv.headers['content-type']).toMatch(/text\/csv/);
      const text = csv.text;
      expect(text.split('\r\n')[0]).toMatch(/^record,date,title/);
      expect(text).toMatch(/Season run 4.*DRIFT/);
      // OWASP CSV-injection advice: a text cell a spreadsheet would run as a formula is prefixed with an apostrophe.
      expect(text).toContain(`"'=HYPERLINK(""http://example.test"")"`);
      expect(text).not.toMatch(/(^|,)=HYPERLINK/m);
      const pdf = await signedIn(t, observer)
        .get(`/api/maintenance/bearings/${b.id}/history.pdf`)
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(pdf.status).toBe(200);
      expect((pdf.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect((await signedIn(t, observer).get('/api/maintenance/bearings/6f1c2d3e-4b5a-4c6d-8e7f-0a1b2c3d4e5f/history')).status).toBe(404);
    });
  });

  describe('lubrication', () => {
    let oil: OilDto;
    let runId: string;
    it('adds an oil (the maintenance lead), refuses the same name twice and a 100 °C figure above the 40 °C one', async () => {
      const body = {
        name: `Test VG 150 ${engine.id.slice(0, 6)}`,
        grade: 'ISO VG 150',
        viscosity40cSt: 150,
        viscosity100cSt: 14.5,
        densityKgM3At15C: 890,
        figuresSource: 'typical of the grade',
      };
      expect((await signedIn(t, operator).post('/api/lubrication/oils').send(body)).status).toBe(403);
      const res = await signedIn(t, lead).post('/api/lubrication/oils').send(body);
      expect(res.status).toBe(201);
      oil = res.body as OilDto;
      expect((await signedIn(t, lead).post('/api/lubrication/oils').send(body)).status).toBe(409);
      expect(
        (
          await signedIn(t, lead)
            .post('/api/lubrication/oils')
            .send({ ...body, name: 'x', viscosity100cSt: 200 })
        ).status,
      ).toBe(400);
      const assigned = await signedIn(t, lead).put(`/api/lubrication/points/${engine.lubricationPoints[0].id}/oil`).send({ oilId: oil.id });
      expect(assigned.status).toBe(200);
      expect(assigned.body).toMatchObject({ oilId: oil.id, matchedBy: 'assigned' });
    });

    it('logs oil used per run and gives it per run-hour and per thousand revolutions', async () => {
      runId = await insertClosedRun(t, engine, chief.account.id, {
        title: 'Oil run',
        startedAt: new Date(Date.now() - 5 * DAY),
        hours: 4,
        ambientF: 65,
        riseF: 38,
        speedRpm: 75,
      });
      const point = engine.lubricationPoints[0].id;
      expect(
        (
          await signedIn(t, observer)
            .post('/api/lubrication/consumption')
            .send({ runId, lubricationPointId: point, method: 'added', quantityLitres: 1 })
        ).status,
      ).toBe(403);
      expect(
        (
          await signedIn(t, operator)
            .post('/api/lubrication/consumption')
            .send({ runId, lubricationPointId: point, method: 'levels', levelStartLitres: 3, levelEndLitres: 4 })
        ).status,
      ).toBe(400);
      const a = await signedIn(t, operator)
        .post('/api/lubrication/consumption')
        .send({ runId, lubricationPointId: point, method: 'added', quantityLitres: 1.2 });
      expect(a.status).toBe(201);
      const b = await signedIn(t, operator)
        .post('/api/lubrication/consumption')
        .send({ runId, lubricationPointId: point, method: 'levels', levelStartLitres: 5, levelEndLitres: 4.4 });
      expect(b.status).toBe(201);
      expect(b.body.usedLitres).toBeCloseTo(0.6, 9);
      const l = (await signedIn(t, observer).get(`/api/lubrication/engines/${engine.id}`)).body as EngineLubrication;
      const row = l.consumption.find((p) => p.lubricationPointId === point)!.runs.find((r) => r.runId === runId)!;
      // 1.8 L over 4 h at 75 rpm (18,000 revolutions): 0.45 L per hour, 0.1 L per thousand revolutions.
      expect(row.usedLitres).toBeCloseTo(1.8, 9);
      expect(row.litresPerRunHour).toBeCloseTo(0.45, 9);
      expect(row.litresPerThousandRevolutions).toBeCloseTo(0.1, 9);
    });

    it('works out each main bearing at a run: load from the rotating weight × share, viscosity, Petroff friction', async () => {
      const res = await signedIn(t, observer).get(`/api/lubrication/engines/${engine.id}/bearings?runId=${runId}`);
      expect(res.status).toBe(200);
      const a = res.body as BearingLubricationAnalysis;
      const row = a.rows.find((r) => r.label === 'Main')!;
      expect(row.loadLbf).toBe(60_000);
      expect(row.unitLoadPsi).toBeCloseTo(60_000 / (12 * 18), 9);
      expect(row.speedRpm).toBeCloseTo(75, 9);
      expect(row.kinematicCst).toBeGreaterThan(14.5);
      expect(row.kinematicCst).toBeLessThan(150 * 5);
      expect(row.powerLossHp).toBeGreaterThan(0);
      expect(row.missing).toEqual([]);
      const other = await createEngine(t, chief.accessToken);
      expect((await signedIn(t, observer).get(`/api/lubrication/engines/${other.id}/bearings?runId=${runId}`)).status).toBe(400);
    });
  });

  describe('stateless calculator routes', () => {
    it(
      'journal-friction: the centrifugal-pump bearing example loses 16.32 hp (V. S. Lobanoff & R. R. Ross, ' +
        'Centrifugal Pumps: Design and Application, 2nd ed., hydrodynamic bearings chapter; attribution from memory, ' +
        'seen in an online reproduction)',
      async () => {
        const res = await signedIn(t, observer)
          .post('/api/calculations/journal-friction')
          .send({ diameterIn: 5, lengthIn: 5, radialClearanceIn: 0.0025, speedRpm: 5000, viscosityReyn: 2e-6, loadLbf: 1000 });
        expect(res.status).toBe(200);
        expect(Object.keys(res.body)).toEqual(
          expect.arrayContaining(['frictionTorqueLbfIn', 'frictionCoefficient', 'powerLossHp', 'sommerfeldNumber', 'unitLoadPsi']),
        );
        expect(res.body.powerLossHp).toBeCloseTo(16.32, 1);
        expect(res.body.unitLoadPsi).toBeCloseTo(40, 9);
      },
    );

    it('oil-viscosity: gives back the data-sheet figure at 40 °C and answers every signed-in role', async () => {
      for (const who of [observer, operator, millLead]) {
        const res = await signedIn(t, who)
          .post('/api/calculations/oil-viscosity')
          .send({ viscosity40cSt: 150, viscosity100cSt: 14.5, temperatureC: 40 });
        expect(res.status).toBe(200);
        expect(res.body.kinematicCst).toBeCloseTo(150, 6);
        expect(res.body.densityAssumed).toBe(true);
      }
      expect(
        (await t.http.post('/api/calculations/oil-viscosity').send({ viscosity40cSt: 150, viscosity100cSt: 14.5, temperatureC: 40 }))
          .status,
      ).toBe(401);
    });

    it('refuses bad figures with the field named', async () => {
      const s = await signedIn(t, observer)
        .post('/api/calculations/journal-friction')
        .send({ diameterIn: '5', lengthIn: 5, radialClearanceIn: 0.0025, speedRpm: 5000, viscosityReyn: 2e-6, loadLbf: 1000 });
      expect(s.status).toBe(400);
      expect(JSON.stringify(s.body.message)).toContain('diameterIn');
      const v = await signedIn(t, observer)
        .post('/api/calculations/oil-viscosity')
        .send({ viscosity40cSt: 10, viscosity100cSt: 20, temperatureC: 50 });
      expect(v.status).toBe(400);
      expect(JSON.stringify(v.body.message)).toContain('viscosity100cSt');
      const extra = await signedIn(t, observer)
        .post('/api/calculations/oil-viscosity')
        .send({ viscosity40cSt: 150, viscosity100cSt: 14.5, temperatureC: 40, temperatureF: 104 });
      expect(extra.status).toBe(400);
    });

    it(
      'lift-pressure and jack-capacity carry their rule and the caution; four 50-ton jacks under 225,000 lb give a ' +
        'margin of about 1.78 (common practice, no source)',
      async () => {
        const lift = await signedIn(t, observer).post('/api/calculations/lift-pressure').send({ loadLbf: 112500, pocketAreaIn2: 75 });
        expect(lift.status).toBe(200);
        expect(lift.body.liftPressurePsi).toBeCloseTo(1500, 9);
        expect(lift.body.caution).toMatch(/licensed practice/);
        const jacks = await signedIn(t, observer)
          .post('/api/calculations/jack-capacity')
          .send({ jackCount: 4, jackCapacityShortTons: 50, loadLbf: 225000 });
        expect(jacks.body.margin).toBeCloseTo(1.78, 2);
        expect(jacks.body.belowRequiredMargin).toBe(false);
        expect(
          (
            await signedIn(t, observer)
              .post('/api/calculations/jack-capacity')
              .send({ jackCount: 2.5, jackCapacityShortTons: 50, loadLbf: 225000 })
          ).status,
        ).toBe(400);
      },
    );

    it('are documented in OpenAPI with the unit field names', async () => {
      const doc = (await t.http.get('/api/docs-json')).body as {
        paths: Record<string, unknown>;
        components: { schemas: Record<string, { properties?: Record<string, unknown> }> };
      };
      expect(doc.paths['/api/calculations/oil-viscosity']).toBeDefined();
      expect(doc.paths['/api/calculations/journal-friction']).toBeDefined();
      const req = doc.components.schemas.JournalFrictionRequestDto.properties!;
      expect(Object.keys(req).sort()).toEqual(['diameterIn', 'lengthIn', 'loadLbf', 'radialClearanceIn', 'speedRpm', 'viscosityReyn']);
      const out = doc.components.schemas.JournalFrictionResponse.properties!;
      expect(Object.keys(out)).toEqual(
        expect.arrayContaining(['frictionTorqueLbfIn', 'frictionCoefficient', 'powerLossHp', 'sommerfeldNumber', 'unitLoadPsi']),
      );
    });
  });
});
