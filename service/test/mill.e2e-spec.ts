import { randomUUID } from 'node:crypto';
import type {
  BarDto,
  EngineDetail,
  LoggedPassDto,
  LotDetail,
  MillDto,
  MillTimelineItem,
  QuoteDto,
  RunDetail,
  ScheduleDetail,
} from '@crankjournal/shared-types';
import { LotWords1796424481387 } from '../src/database/migrations/1796424481387-LotWords.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { reading } from './factories/engine.factory.js';
import { createMill, createMillRun, forceRunState, millBody, millEngine, scheduleBody } from './factories/mill.factory.js';
import { waitForMessage } from './utils/mail-inbox.js';

const rect = (heightMm: number, widthMm: number) => ({ shape: 'rectangle' as const, heightMm, widthMm });

describe('the mill (API)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let lead: SignedIn;
  let observer: SignedIn;
  let operator: SignedIn;
  let engine: EngineDetail;
  let mill: MillDto;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    lead = await login(t, 'mill_lead');
    observer = await login(t, 'observer');
    operator = await login(t, 'operator');
    engine = await millEngine(t, chief.accessToken);
    mill = await createMill(t, chief.accessToken, engine.id);
  }, 120_000);
  afterAll(async () => {
    await t?.close();
  });

  describe('the mill described per site', () => {
    it('the chief engineer and the mill lead describe it; observers and operators read only', async () => {
      expect(mill.stands.map((s) => s.position)).toEqual([1, 2, 3]);
      const body = {
        ...millBody(engine.id, mill.name),
        stands: mill.stands.map((s) => (s.position === 3 ? { ...s, maxSeparatingForceKn: 950 } : s)),
      };
      const upd = await signedIn(t, lead).put(`/api/mill/mills/${mill.id}`).send(body);
      expect(upd.status).toBe(200);
      expect((upd.body as MillDto).stands.find((s) => s.position === 3)!.maxSeparatingForceKn).toBe(950);
      expect((upd.body as MillDto).stands.find((s) => s.position === 3)!.id).toBe(mill.stands.find((s) => s.position === 3)!.id);
      expect((await signedIn(t, observer).put(`/api/mill/mills/${mill.id}`).send(body)).status).toBe(403);
      expect((await signedIn(t, operator).post('/api/mill/mills').send(millBody(engine.id))).status).toBe(403);
      const read = await signedIn(t, observer).get(`/api/mill/mills/${mill.id}`);
      expect(read.status).toBe(200);
      expect((read.body as MillDto).engineName).toBe(engine.name);
      expect((await t.http.get('/api/mill/mills')).status).toBe(401);
    });

    it('refuses bad descriptions with messages a person can act on', async () => {
      const twice = millBody(engine.id);
      twice.stands[1].position = 1;
      const r1 = await signedIn(t, chief).post('/api/mill/mills').send(twice);
      expect(r1.status).toBe(400);
      expect(JSON.stringify(r1.body.message)).toMatch(/same position/);
      const r2 = await signedIn(t, chief).post('/api/mill/mills').send(millBody(randomUUID()));
      expect(r2.status).toBe(400);
      expect(JSON.stringify(r2.body.message)).toMatch(/engineId names no engine/);
      const r3 = await signedIn(t, chief)
        .post('/api/mill/mills')
        .send({ ...millBody(engine.id), stands: [] });
      expect(r3.status).toBe(400);
      expect(r3.body.message).toContain('a mill needs at least one stand');
      expect((await signedIn(t, chief).get(`/api/mill/mills/${randomUUID()}`)).status).toBe(404);
      expect((await signedIn(t, chief).get('/api/mill/mills/not-a-uuid')).status).toBe(400);
    });
  });

  describe('POST /api/calculations/rolling-pass', () => {
    const kalpakjian = {
      rollDiameterMm: 600,
      entryThicknessMm: 25,
      exitThicknessMm: 20,
      entryWidthMm: 228,
      temperatureC: 20,
      carbonPct: 0,
      rollSpeedRpm: 100,
      standMaxForceKn: 2000,
      frictionFactor: 1,
      meanFlowStressMPa: 180,
    };
    it('refuses the hot flow-stress equation at 20 °C with a 400 naming temperatureC (it once answered 770,000 MPa)', async () => {
      const { meanFlowStressMPa: _given, ...withoutFlowStress } = kalpakjian;
      const res = await signedIn(t, observer).post('/api/calculations/rolling-pass').send(withoutFlowStress);
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.message)).toMatch(/temperatureC: 20 °C is below 750 °C/);
    });

    it('says which model each figure used, and warns of a draft the rolls cannot bite', async () => {
      const res = await signedIn(t, observer)
        .post('/api/calculations/rolling-pass')
        .send({ ...kalpakjian, frictionCoefficient: 0.1, forceModel: 'plane_strain' });
      expect(res.status).toBe(200);
      expect(res.body.bites).toBe(false);
      expect(res.body.warnings.map((w: { code: string }) => w.code)).toContain('bite');
      expect(res.body.models.force).toMatch(/plane strain/);
      expect(res.body.geometryFactor).toBeGreaterThan(0);
    });

    it('reproduces the flat rolling example: F ≈ 1.59 MN, P ≈ 645 kW', async () => {
      // Kalpakjian & Schmid, Manufacturing Engineering and Technology, Example 13.1 (annealed copper, 228 mm wide,
      // 25 → 20 mm, R = 300 mm, 100 rpm, Y_avg = 180 MPa), as listed in REFERENCES.md.
      const res = await signedIn(t, observer).post('/api/calculations/rolling-pass').send(kalpakjian);
      expect(res.status).toBe(200);
      expect(res.body.forceKn / 1000).toBeCloseTo(1.59, 2);
      expect(res.body.powerRollPairKw).toBeCloseTo(645, 0);
      expect(res.body.contactLengthMm).toBeCloseTo(38.7, 1);
      expect(res.body.flowStress.model).toBe('given');
      expect(res.body.flywheel).toBeNull();
      expect(res.body.warnings).toEqual([]);
      expect(res.body.caution).toMatch(/qualified crew/);
    });

    it('hot steel uses the cited flow stress model, flags the extrapolation and both overloads', async () => {
      const res = await signedIn(t, lead).post('/api/calculations/rolling-pass').send({
        rollDiameterMm: 406.4,
        entryThicknessMm: 40,
        exitThicknessMm: 25,
        entryWidthMm: 150,
        exitWidthMm: 155,
        temperatureC: 850,
        carbonPct: 0.45,
        rollSpeedRpm: 75,
        standMaxForceKn: 1200,
        flywheelMassLb: 156800,
        flywheelRadiusOfGyrationFt: 9.9,
        engineSpeedRpm: 75,
        ratedSpeedRpm: 75,
        barExitLengthM: 10,
        indicatedHp: 650,
        baseLoadHp: 60,
      });
      expect(res.status).toBe(200);
      expect(res.body.flowStress.model).toBe('misaka');
      expect(res.body.flowStress.citation).toMatch(/Misaka & Yoshimoto \(1967\)/);
      expect(res.body.flowStress.extrapolated).toBe(true);
      expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['stand_force', 'speed_drop']);
      expect(res.body.flywheel.endSpeedRpm).toBeLessThan(67.5);
    });

    it.each([
      ['a missing field', { ...kalpakjian, rollDiameterMm: undefined }, /rollDiameterMm must be a number/],
      ['a number sent as text', { ...kalpakjian, temperatureC: '850' }, /temperatureC must be a number/],
      ['an unknown field', { ...kalpakjian, rollDiameterInches: 16 }, /rollDiameterInches should not exist/],
      ['an exit no thinner than the entry', { ...kalpakjian, exitThicknessMm: 26 }, /exit height must be less than the entry height/],
      [
        'half the flywheel group',
        { ...kalpakjian, flywheelMassLb: 156800 },
        /missing: flywheelRadiusOfGyrationFt, engineSpeedRpm, ratedSpeedRpm, barExitLengthM, indicatedHp/,
      ],
      ['a negative roll speed', { ...kalpakjian, rollSpeedRpm: -5 }, /rollSpeedRpm must be at least/],
    ])('answers 400 for %s', async (_what, body, message) => {
      const res = await signedIn(t, lead).post('/api/calculations/rolling-pass').send(body);
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.message)).toMatch(message);
    });

    it('is documented in the OpenAPI description with units in the field names', async () => {
      const doc = (await t.http.get('/api/docs-json')).body as {
        paths: Record<string, { post?: { requestBody?: unknown } }>;
        components: { schemas: Record<string, { properties: Record<string, unknown> }> };
      };
      expect(doc.paths['/api/calculations/rolling-pass']?.post).toBeDefined();
      const props = Object.keys(doc.components.schemas.RollingPassDto.properties);
      expect(props).toEqual(
        expect.arrayContaining([
          'rollDiameterMm',
          'entryThicknessMm',
          'temperatureC',
          'carbonPct',
          'rollSpeedRpm',
          'standMaxForceKn',
          'flywheelMassLb',
        ]),
      );
    });
  });

  describe('pass schedules and templates', () => {
    let template: ScheduleDetail;
    it('a template is saved with each pass calculated, and a schedule is planned from it', async () => {
      const res = await signedIn(t, lead).post('/api/mill/schedules').send(scheduleBody(mill.id, true));
      expect(res.status).toBe(201);
      template = res.body;
      expect(template.isTemplate).toBe(true);
      expect(template.passes).toHaveLength(3);
      const p1 = template.passes[0];
      expect(p1.calc!.reduction).toBeCloseTo((76.2 - 62) / 76.2, 9);
      expect(p1.calc!.elongation).toBeCloseTo((76.2 * 76.2) / (62 * 80), 9);
      expect(p1.calc!.flowStress.extrapolated).toBe(true);
      expect(p1.calc!.flywheel!.startSpeedRpm).toBe(75);
      expect(template.totalElongation).toBeCloseTo((76.2 * 76.2) / (50.8 * 50.8), 9);

      const copy = await signedIn(t, lead).post(`/api/mill/schedules/${template.id}/copies`).send({ name: 'Planned from the template' });
      expect(copy.status).toBe(201);
      expect(copy.body.isTemplate).toBe(false);
      expect(copy.body.templateId).toBe(template.id);
      expect(copy.body.templateName).toBe(template.name);
      expect(copy.body.passes.map((p: { exit: unknown }) => p.exit)).toEqual(template.passes.map((p) => p.exit));
      const list = await signedIn(t, observer).get(`/api/mill/schedules?millId=${mill.id}&templates=true`);
      expect(list.status).toBe(200);
      expect(list.body.map((s: { id: string }) => s.id)).toContain(template.id);
      expect(list.body.map((s: { id: string }) => s.id)).not.toContain(copy.body.id);
    });

    it('refuses a stand the mill does not have, and writers only', async () => {
      const body = scheduleBody(mill.id);
      body.passes[0].standPosition = 7;
      const res = await signedIn(t, chief).post('/api/mill/schedules').send(body);
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.message)).toMatch(/has no stand 7/);
      expect((await signedIn(t, observer).post('/api/mill/schedules').send(scheduleBody(mill.id))).status).toBe(403);
      expect((await signedIn(t, operator).post(`/api/mill/schedules/${template.id}/copies`).send({ name: 'x' })).status).toBe(403);
    });
  });

  describe('logging passes during a run', () => {
    let run: RunDetail;
    let bar: BarDto;
    const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;

    beforeAll(async () => {
      run = await createMillRun(t, chief.accessToken, engine.id);
    });

    it('refuses bars while the run is only planned', async () => {
      const res = await signedIn(t, lead)
        .post(`/api/mill/runs/${run.id}/bars`)
        .send({ barCode: 'B-01', stock: rect(76.2, 76.2), stockLengthMm: 1500 });
      expect(res.status).toBe(409);
      expect(res.body.message).toMatch(/passes are logged while the run is running, or stopped and not yet closed/);
    });

    it('logs a normal pass with its calculation, taking the speed from the run’s latest speed reading', async () => {
      await forceRunState(t, run.id, 'running');
      const round = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({
          takenAt: new Date(Date.now() - 10 * 60_000).toISOString(),
          readings: [
            reading(point('SPD'), 72, new Date(Date.now() - 10 * 60_000)),
            reading(point('MB'), 150, new Date(Date.now() - 10 * 60_000)),
          ],
        });
      expect(round.status).toBe(201);
      const b = await signedIn(t, lead)
        .post(`/api/mill/runs/${run.id}/bars`)
        .send({ barCode: 'B-01', stock: rect(76.2, 76.2), stockLengthMm: 1500 });
      expect(b.status).toBe(201);
      bar = b.body;
      expect(
        (
          await signedIn(t, lead)
            .post(`/api/mill/runs/${run.id}/bars`)
            .send({ barCode: 'B-01', stock: rect(76.2, 76.2), stockLengthMm: 1500 })
        ).status,
      ).toBe(409);
      const res = await signedIn(t, lead)
        .post(`/api/mill/bars/${bar.id}/passes`)
        .send({ passNumber: 1, standPosition: 1, measuredTemperatureC: 1140, exit: rect(62, 80) });
      expect(res.status).toBe(201);
      const p = res.body as LoggedPassDto;
      expect(p.entry).toEqual(rect(76.2, 76.2));
      expect(p.calc.warnings).toEqual([]);
      expect(p.calc.flywheel!.startSpeedRpm).toBe(72);
      expect(p.calc.flywheel!.startSpeedSource).toMatch(/speed reading SPD/);
      expect(p.calc.flywheel!.indicatedHpSource).toMatch(/site setting/);
      expect(p.calc.rollSpeedRpm).toBe(72);
      const again = await signedIn(t, lead)
        .post(`/api/mill/bars/${bar.id}/passes`)
        .send({ passNumber: 1, standPosition: 1, measuredTemperatureC: 1140, exit: rect(62, 80) });
      expect(again.status).toBe(409);
      expect(again.body.message).toMatch(/Pass 1 of bar B-01 is already logged/);
    });

    it('flags an overloaded pass: stand force and the flywheel speed drop', async () => {
      const b = await signedIn(t, chief)
        .post(`/api/mill/runs/${run.id}/bars`)
        .send({ barCode: 'B-02', stock: rect(40, 150), stockLengthMm: 6000 });
      expect(b.status).toBe(201);
      const res = await signedIn(t, lead)
        .post(`/api/mill/bars/${b.body.id}/passes`)
        .send({ passNumber: 1, standPosition: 1, measuredTemperatureC: 850, exit: rect(25, 155) });
      expect(res.status).toBe(201);
      const codes = (res.body as LoggedPassDto).calc.warnings.map((w) => w.code);
      expect(codes).toContain('stand_force');
      expect(codes).toContain('speed_drop');
    });

    it('only the mill lead and the chief engineer log passes', async () => {
      const body = { passNumber: 2, standPosition: 2, measuredTemperatureC: 1100, exit: rect(60, 66), entry: rect(80, 62) };
      expect((await signedIn(t, observer).post(`/api/mill/bars/${bar.id}/passes`).send(body)).status).toBe(403);
      expect((await signedIn(t, operator).post(`/api/mill/bars/${bar.id}/passes`).send(body)).status).toBe(403);
      expect((await signedIn(t, chief).post(`/api/mill/bars/${bar.id}/passes`).send(body)).status).toBe(201);
      expect(
        (
          await signedIn(t, lead)
            .post(`/api/mill/bars/${bar.id}/passes`)
            .send({ ...body, passNumber: 3, standPosition: 9 })
        ).status,
      ).toBe(400);
      expect(
        (
          await signedIn(t, lead)
            .post(`/api/mill/bars/${randomUUID()}/passes`)
            .send({ ...body, passNumber: 3 })
        ).status,
      ).toBe(404);
    });

    it('puts passes, rounds of readings and alarms of the run on one timeline', async () => {
      const res = await signedIn(t, observer).get(`/api/mill/runs/${run.id}/timeline`);
      expect(res.status).toBe(200);
      const items = res.body as MillTimelineItem[];
      const kinds = new Set(items.map((i) => i.kind));
      expect(kinds).toEqual(new Set(['pass', 'round', 'alarm']));
      expect(items.filter((i) => i.kind === 'pass')).toHaveLength(3);
      expect(items.map((i) => i.at)).toEqual([...items.map((i) => i.at)].sort());
      const roundItem = items.find((i) => i.kind === 'round') as Extract<MillTimelineItem, { kind: 'round' }>;
      expect(roundItem.readings.map((r) => r.code)).toEqual(['SPD', 'MB']);
    });

    it('refuses passes once the run is closed, and still shows its log', async () => {
      await forceRunState(t, run.id, 'stopped');
      expect(
        (
          await signedIn(t, lead)
            .post(`/api/mill/bars/${bar.id}/passes`)
            .send({ passNumber: 3, standPosition: 3, measuredTemperatureC: 1050, exit: rect(50.8, 50.8) })
        ).status,
      ).toBe(201);
      await forceRunState(t, run.id, 'closed');
      const res = await signedIn(t, lead)
        .post(`/api/mill/bars/${bar.id}/passes`)
        .send({ passNumber: 4, standPosition: 3, measuredTemperatureC: 1000, exit: rect(48, 48) });
      expect(res.status).toBe(409);
      expect(res.body.message).toMatch(/closed/);
      expect((await signedIn(t, lead).patch(`/api/mill/bars/${bar.id}`).send({ weightKg: 60 })).status).toBe(409);
      const log = await signedIn(t, observer).get(`/api/mill/runs/${run.id}`);
      expect(log.status).toBe(200);
      expect(log.body.canLog).toBe(false);
      expect(log.body.bars.map((b: BarDto) => b.passes.length)).toEqual([3, 1]);
    });
  });

  describe('customer lots', () => {
    const lotBody = () => ({
      customerName: 'Test customer',
      customerEmail: `buyer-${randomUUID().slice(0, 8)}@e2e.crankjournal.test`,
      productShape: 'square',
      productHeightMm: 50.8,
      productWidthMm: 50.8,
      steelGrade: 'Mild steel, 0.20 % C',
      carbonPct: 0.2,
      quantityTonnes: 10,
      dueDate: '2027-03-31',
      millId: mill.id,
    });
    const move = (s: SignedIn, id: string, to: string) => signedIn(t, s).post(`/api/mill/lots/${id}/transitions`).send({ to });

    it('only the mill lead and the chief engineer change lots; observers read', async () => {
      expect((await signedIn(t, observer).post('/api/mill/lots').send(lotBody())).status).toBe(403);
      expect((await signedIn(t, operator).post('/api/mill/lots').send(lotBody())).status).toBe(403);
      const created = await signedIn(t, chief).post('/api/mill/lots').send(lotBody());
      expect(created.status).toBe(201);
      const id = created.body.id as string;
      expect(created.body.reference).toMatch(/^BL\d{2}-\d{3}$/);
      expect((await signedIn(t, observer).patch(`/api/mill/lots/${id}`).send({ notes: 'x' })).status).toBe(403);
      expect((await signedIn(t, lead).patch(`/api/mill/lots/${id}`).send({ notes: 'Call before delivery.' })).status).toBe(200);
      expect((await move(operator, id, 'priced')).status).toBe(403);
      expect((await signedIn(t, observer).post(`/api/mill/lots/${id}/quotes`).send({ engineHours: 1, crewHours: 1 })).status).toBe(403);
      const read = await signedIn(t, observer).get(`/api/mill/lots/${id}`);
      expect(read.status).toBe(200);
      expect(read.body.notes).toBe('Call before delivery.');
      expect((await signedIn(t, observer).get('/api/mill/lots')).status).toBe(200);
      expect((await signedIn(t, observer).get(`/api/mill/lots/${randomUUID()}`)).status).toBe(404);
      const bad = await signedIn(t, lead)
        .post('/api/mill/lots')
        .send({ ...lotBody(), dueDate: '31/03/2027', customerEmail: 'nobody' });
      expect(bad.status).toBe(400);
      expect(bad.body.message).toEqual(
        expect.arrayContaining(['dueDate must be a date like 2026-07-31', 'customerEmail must be an e-mail address']),
      );
    });

    it('the status flow goes one step at a time and refuses skipping with a message (409)', async () => {
      const lot = (await signedIn(t, lead).post('/api/mill/lots').send(lotBody())).body as LotDetail;
      expect(lot.status).toBe('on_the_slate');
      expect(lot.nextStatus).toBe('priced');
      const skip = await move(lead, lot.id, 'ordered');
      expect(skip.status).toBe(409);
      expect(skip.body.message).toMatch(/next step is priced, so it cannot skip to ordered/);
      const noQuote = await move(lead, lot.id, 'priced');
      expect(noQuote.status).toBe(409);
      expect(noQuote.body.message).toMatch(/Make a quote/);
      expect((await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/quotes`).send({ engineHours: 6, crewHours: 8 })).status).toBe(201);
      expect((await move(lead, lot.id, 'priced')).status).toBe(200);
      expect((await move(lead, lot.id, 'priced')).status).toBe(409);
      expect((await move(lead, lot.id, 'dispatched')).status).toBe(409);
      expect((await move(chief, lot.id, 'ordered')).status).toBe(200);
      const late = await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/quotes`).send({ engineHours: 1, crewHours: 1 });
      expect(late.status).toBe(409);
      expect(late.body.message).toMatch(/price is fixed/);
      const noRun = await move(lead, lot.id, 'on_roll_plan');
      expect(noRun.status).toBe(409);
      expect(noRun.body.message).toMatch(/Link the run/);
      const run = await createMillRun(t, chief.accessToken, engine.id);
      expect((await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/runs`).send({ runId: run.id })).status).toBe(200);
      const unpaid = await move(lead, lot.id, 'on_roll_plan');
      expect(unpaid.status).toBe(409);
      expect(unpaid.body.message).toMatch(/deposit for this lot is not paid.*chief engineer may put it on the roll plan/);
      const notChief = await signedIn(t, lead)
        .post(`/api/mill/lots/${lot.id}/transitions`)
        .send({ to: 'on_roll_plan', overrideReason: 'Regular customer' });
      expect(notChief.status).toBe(403);
      const overridden = await signedIn(t, chief)
        .post(`/api/mill/lots/${lot.id}/transitions`)
        .send({ to: 'on_roll_plan', overrideReason: 'Regular customer, pays on account' });
      expect(overridden.status).toBe(200);
      expect((overridden.body as LotDetail).history.at(-1)?.note).toMatch(
        /^Override by the chief engineer: Regular customer, pays on account/,
      );
      const notRolled = await move(lead, lot.id, 'rolled');
      expect(notRolled.status).toBe(409);
      expect(notRolled.body.message).toMatch(/tonnage produced/);
      expect((await signedIn(t, lead).patch(`/api/mill/lots/${lot.id}`).send({ producedTonnes: 9.6, scrappedTonnes: 0.3 })).status).toBe(
        200,
      );
      expect((await signedIn(t, lead).patch(`/api/mill/lots/${lot.id}`).send({ quantityTonnes: 12 })).status).toBe(409);
      for (const to of ['rolled', 'passed', 'dispatched']) expect((await move(lead, lot.id, to)).status).toBe(200);
      const back = await move(lead, lot.id, 'rolled');
      expect(back.status).toBe(409);
      expect(back.body.message).toMatch(/dispatched/);
      expect((await signedIn(t, lead).patch(`/api/mill/lots/${lot.id}`).send({ notes: 'late' })).status).toBe(409);
      const done = (await signedIn(t, observer).get(`/api/mill/lots/${lot.id}`)).body as LotDetail;
      expect(done.history.map((h) => h.to)).toEqual([
        'on_the_slate',
        'priced',
        'ordered',
        'on_roll_plan',
        'rolled',
        'passed',
        'dispatched',
      ]);
      expect(done.runs.map((r) => r.id)).toEqual([run.id]);
      expect(done.producedTonnes).toBe(9.6);
      expect(done.nextStatus).toBeNull();

      // Lots stored in the old words read in ours once the migration has run (and back again).
      await t.db.query(`UPDATE mill_lots SET status = 'delivered', reference = 'LOT-2025-907' WHERE id = $1`, [lot.id]);
      await t.db.query(`UPDATE mill_lot_status_changes SET to_status = 'scheduled' WHERE lot_id = $1 AND to_status = 'on_roll_plan'`, [
        lot.id,
      ]);
      const q = t.db.createQueryRunner();
      try {
        await new LotWords1796424481387().up(q);
      } finally {
        await q.release();
      }
      const converted = (await signedIn(t, observer).get(`/api/mill/lots/${lot.id}`)).body as LotDetail;
      expect(converted.status).toBe('dispatched');
      expect(converted.reference).toBe('BL25-907');
      expect(converted.history.map((h) => h.to)).toContain('on_roll_plan');
    });

    it('quote totals follow the site’s rates (stock after yield loss, engine and crew hours, fixed costs)', async () => {
      // Arithmetic of the quoting rules (common practice, no source), with the test mill's rates:
      // stock 10 t / (1 − 0.10) = 11.111 t × 900 = 10,000.00; engine 6 h × 250 = 1,500; crew 8 h × 5 × 22.50 = 900;
      // fixed 1,200 + 150; subtotal 13,750; contingency 10 % = 1,375; margin 15 % of 15,125 = 2,268.75; total 17,393.75.
      const lot = (await signedIn(t, lead).post('/api/mill/lots').send(lotBody())).body as LotDetail;
      const res = await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/quotes`).send({ engineHours: 6, crewHours: 8 });
      expect(res.status).toBe(201);
      const q = res.body as QuoteDto;
      expect(q.number).toBe(1);
      expect(q.stockTonnes).toBeCloseTo(11.111, 3);
      expect(q.lines.map((l) => l.amount)).toEqual([10000, 1500, 900, 1200, 150]);
      expect(q.subtotal).toBe(13750);
      expect(q.contingency.amount).toBe(1375);
      expect(q.margin.amount).toBe(2268.75);
      expect(q.total).toBe(17393.75);
      expect(q.currency).toBe('GBP');
      const second = await signedIn(t, chief)
        .post(`/api/mill/lots/${lot.id}/quotes`)
        .send({ engineHours: 6, crewHours: 8, extraFixedCosts: [{ label: 'Haulage', amount: 100 }] });
      expect(second.body.number).toBe(2);
      // 100 more before contingency and margin: 100 × 1.10 × 1.15 = 126.50
      expect(second.body.total).toBe(17393.75 + 126.5);
      expect((await signedIn(t, observer).get(`/api/mill/lots/${lot.id}`)).body.latestQuoteTotal).toBe(17520.25);
    });

    it('the quote is a PDF, and e-mailing it sends the PDF to the customer and marks a lot on the slate priced', async () => {
      const body = lotBody();
      const lot = (await signedIn(t, lead).post('/api/mill/lots').send(body)).body as LotDetail;
      const q = (await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/quotes`).send({ engineHours: 2, crewHours: 3 })).body as QuoteDto;
      const pdf = await signedIn(t, observer)
        .get(`/api/mill/quotes/${q.id}/quote.pdf`)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(pdf.status).toBe(200);
      expect(pdf.headers['content-type']).toMatch(/application\/pdf/);
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
      expect((await signedIn(t, observer).post(`/api/mill/quotes/${q.id}/send`).send({})).status).toBe(403);
      const sent = await signedIn(t, lead).post(`/api/mill/quotes/${q.id}/send`).send({ message: 'Our price for the square bar.' });
      expect(sent.status).toBe(200);
      expect(sent.body.sentTo).toBe(body.customerEmail);
      const mail = await waitForMessage(body.customerEmail, { subject: lot.reference });
      expect(mail.text).toContain('Our price for the square bar.');
      expect(mail.attachments).toEqual([
        expect.objectContaining({ contentType: 'application/pdf', filename: `quote-${lot.reference.toLowerCase()}-q1.pdf` }),
      ]);
      const after = (await signedIn(t, lead).get(`/api/mill/lots/${lot.id}`)).body as LotDetail;
      expect(after.status).toBe('priced');
      expect(after.quotes[0].sentAt).not.toBeNull();
    });
  });
});
