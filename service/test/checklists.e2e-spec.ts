import { randomUUID } from 'node:crypto';
import type { ChecklistDetail, ChecklistTemplateDetail, StartGateVerdict } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import {
  GOOD,
  INSPECTION,
  PRE_LUBE,
  SHUTDOWN,
  completeChecklist,
  gateEngine,
  createTemplate,
  fill,
  grant,
  preparingRun,
  sign,
  startByRest,
  startBySocket,
  startChecklist,
} from './factories/checklists.factory.js';

/** The smallest valid PNG file: signature, IHDR (1×1, 8-bit grey), IDAT, IEND. */
const PNG_1x1 = Buffer.from(
  '89504e470d0a1a0a0000000d4948445200000001000000010800000000376ef9240000000a49444154789c63600000000200014815b4a40000000049454e44ae426082',
  'hex',
);

describe('checklists and the start gate (API)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let lapsed: SignedIn;
  let unqualified: SignedIn;
  let observer: SignedIn;
  let engine: { id: string; name: string; pointId: string };
  let preLube: ChecklistTemplateDetail;
  let inspection: ChecklistTemplateDetail;
  let shutdown: ChecklistTemplateDetail;

  const detail = async (id: string): Promise<ChecklistDetail> => (await signedIn(t, operator).get(`/api/checklists/${id}`)).body;
  const clearByChief = async (id: string) => {
    const r = await signedIn(t, chief).post(`/api/runs/${id}/transitions`).send({ to: 'cleared' });
    if (r.status !== 200) throw new Error(`not cleared: ${r.status} ${JSON.stringify(r.body)}`);
  };
  const runState = async (id: string): Promise<string> => (await signedIn(t, operator).get(`/api/runs/${id}`)).body.state;

  beforeAll(async () => {
    t = await startTestApp();
    chief = await login(t, 'chief_engineer');
    operator = await login(t, 'operator');
    lapsed = await login(t, 'operator');
    unqualified = await login(t, 'operator');
    observer = await login(t, 'observer');
    engine = await gateEngine(t, chief);
    preLube = await createTemplate(t, chief, engine.id, PRE_LUBE);
    inspection = await createTemplate(t, chief, engine.id, INSPECTION);
    shutdown = await createTemplate(t, chief, engine.id, SHUTDOWN);
    await grant(t, chief, chief.account.id, engine.id, ['pre_lube', 'start_and_run', 'shutdown']);
    await grant(t, chief, operator.account.id, engine.id, ['pre_lube', 'start_and_run', 'shutdown']);
    await grant(t, chief, lapsed.account.id, engine.id, ['start_and_run'], { from: -400, to: -1 });
  }, 180_000);
  afterAll(async () => {
    await t?.close();
  });

  /** A preparing run with both pre-start checklists signed by the qualified operator (so it is cleared). */
  async function readyRun() {
    const run = await preparingRun(t, operator, engine.id);
    const lube = await completeChecklist(t, operator, run.id, preLube.id);
    const insp = await completeChecklist(t, operator, run.id, inspection.id);
    return { run, lube, insp };
  }

  describe.each([
    ['REST', startByRest],
    ['socket', startBySocket],
  ] as const)('the start gate through %s', (_route, start) => {
    const codes = (v: StartGateVerdict | null) => v?.reasons.map((r) => r.code) ?? [];

    it('is allowed when every condition holds, and the run starts', async () => {
      const { run } = await readyRun();
      expect(await runState(run.id)).toBe('cleared');
      const r = await start(t, operator, run.id);
      expect(r.status).toBe(200);
      expect(r.run?.state).toBe('running');
      expect(await runState(run.id)).toBe('running');
    });

    it(
      'is refused for a missing checklist alone (checklist_missing, naming it), even when the chief engineer cleared ' + 'the run',
      async () => {
        const run = await preparingRun(t, operator, engine.id);
        await completeChecklist(t, operator, run.id, preLube.id);
        await clearByChief(run.id);
        const r = await start(t, operator, run.id);
        expect(r.status).toBe(409);
        expect(codes(r.verdict)).toEqual(['checklist_missing']);
        expect(r.verdict!.reasons[0].subject).toBe('Pre-start inspection');
        expect(r.verdict!.reasons[0].message).toContain('Pre-start inspection');
        expect(await runState(run.id)).toBe('cleared');
      },
    );

    it('is refused for an unsigned checklist alone (checklist_unsigned, saying how far it got)', async () => {
      const run = await preparingRun(t, operator, engine.id);
      await completeChecklist(t, operator, run.id, preLube.id);
      const c = await startChecklist(t, operator, run.id, inspection.id);
      expect((await fill(t, operator, c.id, 'guards', { tick: true })).status).toBe(200);
      await clearByChief(run.id);
      const r = await start(t, operator, run.id);
      expect(r.status).toBe(409);
      expect(codes(r.verdict)).toEqual(['checklist_unsigned']);
      expect(r.verdict!.reasons[0].message).toContain('1 of 2 required items done');
    });

    it('is refused for a stale pre-lube alone (pre_lube_stale, saying how old it is)', async () => {
      const { run, lube } = await readyRun();
      // The pre-lube was signed 31 minutes ago; the engine's window is 30 minutes.
      await t.db.query(`UPDATE checklists SET signed_at = now() - interval '31 minutes' WHERE id = $1`, [lube.id]);
      const r = await start(t, operator, run.id);
      expect(r.status).toBe(409);
      expect(codes(r.verdict)).toEqual(['pre_lube_stale']);
      expect(r.verdict!.reasons[0].message).toMatch(/is 31 min old; .* window is 30 min/);
      expect(Date.parse(r.verdict!.preLubeFreshUntil!)).toBeLessThan(Date.now());
      expect(await runState(run.id)).toBe('cleared');
    });

    it('is refused when the person starting has an expired qualification alone (qualification_expired)', async () => {
      const { run } = await readyRun();
      const r = await start(t, lapsed, run.id);
      expect(r.status).toBe(409);
      expect(codes(r.verdict)).toEqual(['qualification_expired']);
      expect(r.verdict!.reasons[0].message).toContain('expired on');
    });

    it('is refused when the person starting holds no qualification (qualification_missing)', async () => {
      const { run } = await readyRun();
      const r = await start(t, unqualified, run.id);
      expect(r.status).toBe(409);
      expect(codes(r.verdict)).toEqual(['qualification_missing']);
    });

    it('is refused while a high-high alarm is active on the engine alone (active_high_high_alarm)', async () => {
      const { run } = await readyRun();
      const now = new Date().toISOString();
      const round = await signedIn(t, operator)
        .post(`/api/runs/${run.id}/rounds`)
        .send({ takenAt: now, readings: [{ clientId: randomUUID(), pointId: engine.pointId, value: 150, takenAt: now }] });
      expect(round.status).toBe(201);
      try {
        const r = await start(t, operator, run.id);
        expect(r.status).toBe(409);
        expect(codes(r.verdict)).toEqual(['active_high_high_alarm']);
      } finally {
        // The condition clears with a reading back under the limit, for the tests that follow.
        const later = new Date(Date.now() + 1000).toISOString();
        await signedIn(t, operator)
          .post(`/api/runs/${run.id}/rounds`)
          .send({ takenAt: later, readings: [{ clientId: randomUUID(), pointId: engine.pointId, value: 100, takenAt: later }] });
      }
      // Back to normal but nobody has acknowledged it: still refused until a person does.
      const held = await start(t, operator, run.id);
      expect(codes(held.verdict)).toEqual(['active_high_high_alarm']);
      const alarms = (await signedIn(t, operator).get(`/api/runs/${run.id}/alarms`)).body as {
        id: string;
        priority: string;
        state: string;
      }[];
      for (const a of alarms.filter((x) => x.priority === 'high_high' && x.state !== 'normal'))
        expect((await signedIn(t, operator).post(`/api/alarms/${a.id}/acknowledge`)).status).toBe(200);
      expect((await start(t, operator, run.id)).status).toBe(200);
    });
  });

  it('GET /runs/:id/start-gate gives the same verdict and the pre-lube freshness while cleared', async () => {
    const { run, lube } = await readyRun();
    const v = (await signedIn(t, operator).get(`/api/runs/${run.id}/start-gate`)).body as StartGateVerdict;
    expect(v.allowed).toBe(true);
    expect(Date.parse(v.preLubeFreshUntil!) - Date.parse(lube.signedAt!)).toBe(30 * 60_000);
    const o = (await signedIn(t, observer).get(`/api/runs/${run.id}/checklists`)).body;
    expect(o.preLubeFreshUntil).toBe(v.preLubeFreshUntil);
    expect(o.templates.map((x: { progress: string }) => x.progress)).toEqual(['signed', 'signed', 'not_started']);
  });

  it('clears a preparing run once the pre-start checklists are all signed, under the signer’s name', async () => {
    const run = await preparingRun(t, operator, engine.id);
    await completeChecklist(t, operator, run.id, preLube.id);
    expect(await runState(run.id)).toBe('preparing');
    await completeChecklist(t, operator, run.id, inspection.id);
    const d = (await signedIn(t, operator).get(`/api/runs/${run.id}`)).body;
    expect(d.state).toBe('cleared');
    const last = d.history[d.history.length - 1];
    expect(last).toMatchObject({ from: 'preparing', to: 'cleared', by: operator.account.id });
    expect(last.note).toContain('every checklist required before a start is signed');
  });

  describe('a signature made on a tablet without a connection', () => {
    /** A pre-lube checklist with every item done, not yet signed. */
    const filledPreLube = async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      for (const e of c.entries) if (GOOD[e.itemKey]) expect((await fill(t, operator, c.id, e.itemKey, GOOD[e.itemKey])).status).toBe(200);
      return { run, c };
    };

    it('keeps the tablet’s time beside the server’s, and the pre-lube freshness counts from the earlier', async () => {
      const { run, c } = await filledPreLube();
      // Begun before the connection dropped; signed on the tablet 12 minutes ago; sent now.
      await t.db.query(`UPDATE checklists SET started_at = now() - interval '20 minutes' WHERE id = $1`, [c.id]);
      const onTablet = new Date(Date.now() - 12 * 60_000).toISOString();
      const before = Date.now();
      const r = await signedIn(t, operator)
        .post(`/api/checklists/${c.id}/sign`)
        .send({ signature: operator.account.password, signedOnDeviceAt: onTablet });
      expect(r.status).toBe(200);
      const d = r.body as ChecklistDetail;
      expect(d.signedOnDeviceAt).toBe(onTablet);
      expect(Date.parse(d.signedAt!)).toBeGreaterThanOrEqual(before - 1000);
      expect((await detail(c.id)).signedOnDeviceAt).toBe(onTablet);
      const o = (await signedIn(t, operator).get(`/api/runs/${run.id}/checklists`)).body;
      // 30 minutes of freshness (the test engine's setting) from the tablet's 12-minutes-ago, not from the server's now.
      expect(Date.parse(o.preLubeFreshUntil) - Date.parse(onTablet)).toBe(30 * 60_000);
    });

    it('signed online, the tablet time stays empty', async () => {
      const { c } = await filledPreLube();
      const r = await sign(t, operator, c.id);
      expect(r.status).toBe(200);
      expect(r.body.signedOnDeviceAt).toBeNull();
    });

    it('refuses a tablet time in the future, before the checklist began, or not a time, and signs nothing', async () => {
      const { c } = await filledPreLube();
      for (const signedOnDeviceAt of [new Date(Date.now() + 60 * 60_000).toISOString(), '2001-01-01T00:00:00Z', 'yesterday']) {
        const r = await signedIn(t, operator)
          .post(`/api/checklists/${c.id}/sign`)
          .send({ signature: operator.account.password, signedOnDeviceAt });
        expect(r.status).toBe(400);
        expect(JSON.stringify(r.body.message)).toMatch(/signedOnDeviceAt/);
      }
      expect((await detail(c.id)).status).toBe('in_progress');
    });
  });

  it('pre-lubing again makes a stale pre-lube fresh', async () => {
    const { run, lube } = await readyRun();
    await t.db.query(`UPDATE checklists SET signed_at = now() - interval '45 minutes' WHERE id = $1`, [lube.id]);
    expect((await startByRest(t, operator, run.id)).status).toBe(409);
    await completeChecklist(t, operator, run.id, preLube.id);
    expect((await startByRest(t, operator, run.id)).status).toBe(200);
  });

  describe('after a stop', () => {
    it('refuses to close until the shutdown checklist is signed, then closes', async () => {
      const { run } = await readyRun();
      expect((await startByRest(t, operator, run.id)).status).toBe(200);
      expect((await signedIn(t, operator).post(`/api/runs/${run.id}/transitions`).send({ to: 'stopped' })).status).toBe(200);
      const refused = await signedIn(t, chief)
        .post(`/api/runs/${run.id}/transitions`)
        .send({ to: 'closed', signature: chief.account.password });
      expect(refused.status).toBe(409);
      expect(refused.body.details.reasons.map((r: { code: string }) => r.code)).toEqual(['shutdown_checklist_missing']);
      await completeChecklist(t, operator, run.id, shutdown.id);
      const closed = await signedIn(t, chief)
        .post(`/api/runs/${run.id}/transitions`)
        .send({ to: 'closed', signature: chief.account.password });
      expect(closed.status).toBe(200);
      expect(closed.body.state).toBe('closed');
    });

    it('does not let a shutdown checklist be filled before the stop', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const r = await signedIn(t, operator).post(`/api/runs/${run.id}/checklists`).send({ templateId: shutdown.id });
      expect(r.status).toBe(409);
      expect(r.body.message).toContain('stopped');
    });
  });

  describe('template versions', () => {
    it('leaves a checklist completed against version 1 unchanged after version 2 is issued', async () => {
      const tpl = await createTemplate(t, chief, engine.id, {
        ...PRE_LUBE,
        name: `Versioned ${randomUUID().slice(0, 6)}`,
        requiredWhen: 'not_required',
      });
      expect(tpl.currentVersion).toBe(1);
      const run = await preparingRun(t, operator, engine.id);
      const done = await completeChecklist(t, operator, run.id, tpl.id);
      const before = await detail(done.id);

      const v2 = structuredClone(PRE_LUBE);
      v2.name = tpl.name;
      v2.requiredWhen = 'not_required';
      v2.sections[0].items[1] = { ...v2.sections[0].items[1], label: 'Line pressure after two minutes', min: 18, max: 28 };
      v2.sections[0].items.push({ key: 'drains', kind: 'tick', label: 'Drains open', required: true });
      const draft = await signedIn(t, chief).put(`/api/checklist-templates/${tpl.id}/draft`).send(v2);
      expect(draft.status).toBe(200);
      expect(draft.body.currentVersion).toBe(1);
      const issuedV2 = await signedIn(t, chief)
        .post(`/api/checklist-templates/${tpl.id}/issue`)
        .send({ changeNote: 'Tighter range, drains added.' });
      expect(issuedV2.status).toBe(200);
      expect(issuedV2.body.currentVersion).toBe(2);
      expect(issuedV2.body.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);

      const after = await detail(done.id);
      expect(after).toEqual(before);
      expect(after.version).toBe(1);
      expect(after.sections[0].items.map((i) => i.key)).toEqual(['valves', 'pressure', 'photo']);
      expect(after.sections[0].items[1]).toMatchObject({ label: 'Pre-lube line pressure', min: 15, max: 30 });

      const next = await startChecklist(t, operator, run.id, tpl.id);
      expect(next.version).toBe(2);
      expect(next.sections[0].items.map((i) => i.key)).toEqual(['valves', 'pressure', 'photo', 'drains']);
      const v1 = await signedIn(t, observer).get(`/api/checklist-templates/${tpl.id}/versions/1`);
      expect(v1.status).toBe(200);
      expect(v1.body.content.sections[0].items[1].label).toBe('Pre-lube line pressure');
    });

    it('refuses to issue with nothing in preparation and refuses a template whose content does not hold together', async () => {
      expect((await signedIn(t, chief).post(`/api/checklist-templates/${preLube.id}/issue`).send({})).status).toBe(409);
      const bad = structuredClone(PRE_LUBE);
      bad.sections[0].items[1] = { ...bad.sections[0].items[1], min: 40, max: 30 };
      const r = await signedIn(t, chief)
        .post('/api/checklist-templates')
        .send({ ...bad, name: 'Bad ranges', engineId: engine.id });
      expect(r.status).toBe(400);
      expect(r.body.message.join(' ')).toContain('min must not be above max');
    });

    it('a template stands in preparation, issued or withdrawn, in our words in its answers and messages', async () => {
      const body = { ...SHUTDOWN, name: `Words ${randomUUID().slice(0, 6)}`, engineId: engine.id, issue: false };
      const made = await signedIn(t, chief).post('/api/checklist-templates').send(body);
      expect(made.status).toBe(201);
      expect(made.body.state).toBe('in_preparation');
      const issued = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/issue`).send({ changeNote: 'First issue.' });
      expect(issued.body.state).toBe('issued');
      expect(issued.body.issuedAt).toEqual(expect.any(String));
      expect(issued.body.versions[0]).toMatchObject({ version: 1, changeNote: 'First issue.', issuedByName: expect.any(String) });
      const again = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/issue`).send({});
      expect(again.status).toBe(409);
      expect(JSON.stringify(again.body.message)).toContain('nothing in preparation to issue');
      const withdrawn = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/withdraw`).send({});
      expect(withdrawn.body.state).toBe('withdrawn');
      expect(withdrawn.body.withdrawn).toBe(true);
      const twice = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/withdraw`).send({});
      expect(twice.status).toBe(409);
      expect(JSON.stringify(twice.body.message)).toContain('already withdrawn');
      const list = (await signedIn(t, observer).get(`/api/checklist-templates?engineId=${engine.id}`)).body as {
        id: string;
        state: string;
      }[];
      expect(list.find((x) => x.id === made.body.id)?.state).toBe('withdrawn');
      const reissued = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/reissue`).send({});
      expect(reissued.status).toBe(200);
      expect(reissued.body).toMatchObject({ state: 'issued', withdrawn: false, currentVersion: 1 });
      const notWithdrawn = await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/reissue`).send({});
      expect(notWithdrawn.status).toBe(409);
      expect(JSON.stringify(notWithdrawn.body.message)).toContain('not withdrawn');
      // The old spellings are gone from the API.
      expect((await signedIn(t, chief).post(`/api/checklist-templates/${made.body.id}/retire`).send({})).status).toBe(404);
    });

    it('is written by the chief engineer only; everyone reads and prints', async () => {
      const body = { ...SHUTDOWN, name: `Role test ${randomUUID().slice(0, 6)}`, engineId: engine.id };
      expect((await signedIn(t, operator).post('/api/checklist-templates').send(body)).status).toBe(403);
      expect((await signedIn(t, observer).post('/api/checklist-templates').send(body)).status).toBe(403);
      expect((await signedIn(t, chief).post('/api/checklist-templates').send(body)).status).toBe(201);
      expect((await signedIn(t, observer).get(`/api/checklist-templates?engineId=${engine.id}`)).status).toBe(200);
      const pdf = await signedIn(t, observer)
        .get(`/api/checklist-templates/${preLube.id}/blank.pdf`)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(pdf.status).toBe(200);
      expect(pdf.headers['content-type']).toBe('application/pdf');
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    });
  });

  describe('out-of-range readings', () => {
    it('block the signature until the chief engineer records an override, which an operator may not', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      await fill(t, operator, c.id, 'valves', { tick: true });
      const low = await fill(t, operator, c.id, 'pressure', { value: 12 });
      expect(low.status).toBe(200);
      expect(low.body.entries.find((e: { itemKey: string }) => e.itemKey === 'pressure')).toMatchObject({
        value: 12,
        outOfRange: true,
        override: null,
      });
      expect(low.body.blockedItems).toBe(1);

      const refused = await sign(t, operator, c.id);
      expect(refused.status).toBe(409);
      expect(refused.body.message.join(' ')).toContain('12 psig is outside the acceptance range (15 to 30 psig)');

      const byOperator = await signedIn(t, operator)
        .post(`/api/checklists/${c.id}/items/pressure/override`)
        .send({ reason: 'Gauge reads low, known fault.' });
      expect(byOperator.status).toBe(403);
      const noReason = await signedIn(t, chief).post(`/api/checklists/${c.id}/items/pressure/override`).send({ reason: '' });
      expect(noReason.status).toBe(400);
      const byChief = await signedIn(t, chief)
        .post(`/api/checklists/${c.id}/items/pressure/override`)
        .send({ reason: 'Gauge reads 4 psi low; checked against the test gauge.' });
      expect(byChief.status).toBe(200);
      const entry = byChief.body.entries.find((e: { itemKey: string }) => e.itemKey === 'pressure');
      expect(entry.override).toMatchObject({
        reason: 'Gauge reads 4 psi low; checked against the test gauge.',
        byName: chief.account.displayName,
      });

      const signed = await sign(t, operator, c.id);
      expect(signed.status).toBe(200);
      const kept = (await detail(c.id)).entries.find((e) => e.itemKey === 'pressure')!;
      expect(kept.override?.reason).toContain('checked against the test gauge');
      expect(kept.outOfRange).toBe(true);
    });

    it('void an override when the value changes', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      await fill(t, operator, c.id, 'valves', { tick: true });
      await fill(t, operator, c.id, 'pressure', { value: 12 });
      await signedIn(t, chief).post(`/api/checklists/${c.id}/items/pressure/override`).send({ reason: 'Accepted for today only.' });
      const changed = await fill(t, operator, c.id, 'pressure', { value: 11 });
      expect(changed.body.entries.find((e: { itemKey: string }) => e.itemKey === 'pressure').override).toBeNull();
      expect((await sign(t, operator, c.id)).status).toBe(409);
    });
  });

  describe('signing', () => {
    it('asks for the password again: a wrong one refuses the signature, the right one records who, when and the version', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      await fill(t, operator, c.id, 'valves', { tick: true });
      await fill(t, operator, c.id, 'pressure', { value: 20 });
      const wrong = await sign(t, operator, c.id, 'not-my-password');
      expect(wrong.status).toBe(400);
      expect(wrong.body.message).toContain('not right');
      expect((await detail(c.id)).status).toBe('in_progress');
      const right = await sign(t, operator, c.id);
      expect(right.status).toBe(200);
      expect(right.body).toMatchObject({ status: 'signed', signedByName: operator.account.displayName, version: 1 });
      expect(Math.abs(Date.parse(right.body.signedAt) - Date.now())).toBeLessThan(60_000);
    });

    it('accepts the signing PIN instead of the password', async () => {
      const pin = '482917';
      expect(
        (await signedIn(t, operator).post('/api/auth/signing-pin').send({ currentPassword: operator.account.password, pin })).status,
      ).toBeLessThan(300);
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      await fill(t, operator, c.id, 'valves', { tick: true });
      await fill(t, operator, c.id, 'pressure', { value: 20 });
      expect((await sign(t, operator, c.id, pin)).status).toBe(200);
    });

    it('needs the template’s qualification: refused without it, whatever the role', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, unqualified, run.id, inspection.id);
      await fill(t, unqualified, c.id, 'guards', { tick: true });
      await fill(t, unqualified, c.id, 'barring', { choice: 'Out and locked' });
      const r = await sign(t, unqualified, c.id);
      expect(r.status).toBe(403);
      expect(r.body.message).toContain('start and run qualification');
      const otherChief = await login(t, 'chief_engineer');
      expect((await sign(t, otherChief, c.id)).status).toBe(403);
      const admin = await login(t, 'administrator');
      expect((await sign(t, admin, c.id)).status).toBe(403);
      expect((await sign(t, operator, c.id)).status).toBe(200);
    });

    it('refuses an observer anything but reading', async () => {
      const run = await preparingRun(t, operator, engine.id);
      expect((await signedIn(t, observer).post(`/api/runs/${run.id}/checklists`).send({ templateId: preLube.id })).status).toBe(403);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      expect((await fill(t, observer, c.id, 'valves', { tick: true })).status).toBe(403);
      expect((await signedIn(t, observer).get(`/api/checklists/${c.id}`)).status).toBe(200);
    });
  });

  describe('items', () => {
    it('can be filled in any order and take only the field of their kind', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, inspection.id);
      expect((await fill(t, operator, c.id, 'barring', { choice: 'Out and locked' })).body.requiredDone).toBe(1);
      expect((await fill(t, operator, c.id, 'guards', { value: 3 })).status).toBe(400);
      expect((await fill(t, operator, c.id, 'barring', { choice: 'Half in' })).status).toBe(400);
      expect((await fill(t, operator, c.id, 'nope', { tick: true })).status).toBe(404);
      const done = await fill(t, operator, c.id, 'guards', { tick: true });
      expect(done.body).toMatchObject({ requiredDone: 2, requiredItems: 2, blockedItems: 0 });
      const second = await signedIn(t, operator).post(`/api/runs/${run.id}/checklists`).send({ templateId: inspection.id });
      expect(second.status).toBe(409);
      expect(second.body.details.checklistId).toBe(c.id);
    });

    it('take a photo by content type (PNG, JPEG, WebP), refuse other files and give the photo back', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await startChecklist(t, operator, run.id, preLube.id);
      const up = await signedIn(t, operator)
        .put(`/api/checklists/${c.id}/items/photo/photo`)
        .set('Content-Type', 'image/png')
        .send(PNG_1x1);
      expect(up.status).toBe(200);
      expect(up.body.entries.find((e: { itemKey: string }) => e.itemKey === 'photo').hasPhoto).toBe(true);
      const back = await signedIn(t, observer)
        .get(`/api/checklists/${c.id}/items/photo/photo`)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = [];
          res.on('data', (x: Buffer) => chunks.push(x));
          res.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(back.status).toBe(200);
      expect(back.headers['content-type']).toBe('image/png');
      expect(Buffer.compare(back.body as Buffer, PNG_1x1)).toBe(0);

      const fake = await signedIn(t, operator)
        .put(`/api/checklists/${c.id}/items/photo/photo`)
        .set('Content-Type', 'image/png')
        .send(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"></svg>'));
      expect(fake.status).toBe(415);
      const notImage = await signedIn(t, operator)
        .put(`/api/checklists/${c.id}/items/photo/photo`)
        .set('Content-Type', 'text/plain')
        .send('hello');
      expect(notImage.status).toBe(415);
      const big = Buffer.alloc(10 * 1024 * 1024 + 1, 0);
      PNG_1x1.copy(big);
      const tooBig = await signedIn(t, operator)
        .put(`/api/checklists/${c.id}/items/photo/photo`)
        .set('Content-Type', 'image/png')
        .send(big);
      expect(tooBig.status).toBe(413);
      const wrongItem = await signedIn(t, operator)
        .put(`/api/checklists/${c.id}/items/valves/photo`)
        .set('Content-Type', 'image/png')
        .send(PNG_1x1);
      expect(wrongItem.status).toBe(400);
    });
  });

  describe('completed checklists', () => {
    it('are read-only; a mistake is corrected by an amendment with a reason, the value as signed kept', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await completeChecklist(t, operator, run.id, preLube.id);
      expect((await fill(t, operator, c.id, 'pressure', { value: 25 })).status).toBe(409);
      expect((await signedIn(t, operator).post(`/api/checklists/${c.id}/amendments`).send({ itemKey: 'pressure', value: 24 })).status).toBe(
        400,
      );
      const am = await signedIn(t, operator)
        .post(`/api/checklists/${c.id}/amendments`)
        .send({ itemKey: 'pressure', value: 24, reason: 'Misread the gauge; it was 24.' });
      expect(am.status).toBe(201);
      const e = am.body.entries.find((x: { itemKey: string }) => x.itemKey === 'pressure');
      expect(e.value).toBe(24);
      expect(e.original).toEqual({ value: 22 });
      expect(e.amendments).toHaveLength(1);
      expect(e.amendments[0]).toMatchObject({
        oldValue: { value: 22 },
        newValue: { value: 24 },
        reason: 'Misread the gauge; it was 24.',
        byName: operator.account.displayName,
      });
      expect(am.body).toMatchObject({ status: 'signed', signedByName: operator.account.displayName, amendmentCount: 1 });
    });

    it('take an out-of-range amendment only from the chief engineer, with an override reason', async () => {
      const run = await preparingRun(t, operator, engine.id);
      const c = await completeChecklist(t, operator, run.id, preLube.id);
      const byOperator = await signedIn(t, operator)
        .post(`/api/checklists/${c.id}/amendments`)
        .send({ itemKey: 'pressure', value: 35, reason: 'Gauge photo shows 35.' });
      expect(byOperator.status).toBe(409);
      const noOverride = await signedIn(t, chief)
        .post(`/api/checklists/${c.id}/amendments`)
        .send({ itemKey: 'pressure', value: 35, reason: 'Gauge photo shows 35.' });
      expect(noOverride.status).toBe(400);
      const ok = await signedIn(t, chief).post(`/api/checklists/${c.id}/amendments`).send({
        itemKey: 'pressure',
        value: 35,
        reason: 'Gauge photo shows 35.',
        overrideReason: 'Relief valve set high that day; reset since.',
      });
      expect(ok.status).toBe(201);
      const e = ok.body.entries.find((x: { itemKey: string }) => x.itemKey === 'pressure');
      expect(e.override.reason).toContain('Relief valve');
      expect(e.amendments[0].overrideReason).toContain('Relief valve');
    });
  });

  it('answers unknown ids with 404 and bad ids with 400', async () => {
    expect((await signedIn(t, operator).get(`/api/checklists/${randomUUID()}`)).status).toBe(404);
    expect((await signedIn(t, operator).get('/api/checklists/not-an-id')).status).toBe(400);
    expect((await signedIn(t, operator).get(`/api/runs/${randomUUID()}/checklists`)).status).toBe(404);
    expect((await signedIn(t, operator).post(`/api/runs/${randomUUID()}/checklists`).send({ templateId: preLube.id })).status).toBe(404);
    expect((await signedIn(t, operator).get(`/api/checklist-templates/${preLube.id}/versions/9`)).status).toBe(404);
  });
});
