import { randomUUID } from 'node:crypto';
import type {
  ChecklistDetail,
  ChecklistTemplateContent,
  ChecklistTemplateDetail,
  Duty,
  LiveAck,
  RunDetail,
  StartGateVerdict,
} from '@crankjournal/shared-types';
import { type TestApp } from '../utils/test-app.js';
import { connected, socketAs } from '../utils/socket.js';
import { signedIn } from '../utils/signed-in.js';
import { createEngine, createPreparingRun } from './engine.factory.js';
import type { SignedIn } from './users.factory.js';

const DAY_MS = 86_400_000;
export const isoDate = (offsetDays: number) => new Date(Date.now() + offsetDays * DAY_MS).toISOString().slice(0, 10);

/** A small engine of the tests' own, with one bearing temperature point that can raise a high-high alarm. */
export async function gateEngine(
  t: TestApp,
  chief: SignedIn,
  opts: { preLubeFreshnessMinutes?: number } = {},
): Promise<{ id: string; name: string; pointId: string }> {
  const name = `Test engine ${randomUUID().slice(0, 8)}`;
  const engine = await createEngine(t, chief, {
    name,
    builder: 'Test works',
    yearBuilt: '1900',
    type: 'simple',
    ratedSpeedRpm: 70,
    overspeedRpm: 80,
    mawpPsig: 150,
    preLubeFreshnessMinutes: opts.preLubeFreshnessMinutes ?? 30,
    cylinders: [{ label: 'C', role: 'single', boreIn: 20, strokeIn: 40, pistonRodIn: 4, tailRodIn: 0, clearancePercent: 6 }],
    lubricationPoints: [],
    bearings: [],
    measurementPoints: [
      {
        code: 'MB1-T',
        label: 'Main bearing temperature',
        kind: 'bearing_temperature',
        unit: 'degF',
        sequence: 1,
        highLimit: 130,
        highHighLimit: 145,
        deadband: 2,
      },
    ],
  });
  return { id: engine.id, name, pointId: engine.measurementPoints[0].id };
}

/** Grants qualifications through the API as the chief engineer (dates relative to today). */
export async function grant(
  t: TestApp,
  chief: SignedIn,
  userId: string,
  engineId: string,
  duties: Duty[],
  dates: { from?: number; to?: number } = {},
) {
  const out: string[] = [];
  for (const duty of duties) {
    const res = await signedIn(t, chief)
      .post('/api/qualifications')
      .send({ userId, engineId, duty, grantedOn: isoDate(dates.from ?? -100), expiresOn: isoDate(dates.to ?? 200) });
    if (res.status !== 201) throw new Error(`qualification not granted: ${res.status} ${JSON.stringify(res.body)}`);
    out.push(res.body.id);
  }
  return out;
}

/**
 * Qualifies people straight in the database, for other areas' tests that start runs or acknowledge alarms
 * and are not about qualifications: `await qualifyInDb(t, user.id, engineId, ['start_and_run'])`.
 */
export async function qualifyInDb(t: TestApp, userId: string, engineId: string, duties: Duty[]) {
  for (const duty of duties) {
    await t.db.query(
      `INSERT INTO qualifications (user_id, engine_id, duty, granted_on, expires_on, notes, granted_by)
       VALUES ($1, $2, $3, current_date - 1, current_date + 365, 'test', $1)
       ON CONFLICT DO NOTHING`,
      [userId, engineId, duty],
    );
  }
}

export const PRE_LUBE: ChecklistTemplateContent = {
  name: 'Pre-lube',
  purpose: 'pre_lube',
  requiredWhen: 'before_start',
  requiredDuty: 'pre_lube',
  description: 'Oil under the journals before the first turn.',
  sections: [
    {
      key: 'lines',
      title: 'Lines',
      items: [
        { key: 'valves', kind: 'tick', label: 'Line valves open', required: true },
        {
          key: 'pressure',
          kind: 'reading',
          label: 'Pre-lube line pressure',
          required: true,
          unit: 'psig',
          min: 15,
          max: 30,
          caution: { hazard: 'pressure', text: 'Lines under pressure while the pump runs.' },
        },
        { key: 'photo', kind: 'photo', label: 'Gauge photo', required: false },
      ],
    },
  ],
};
export const INSPECTION: ChecklistTemplateContent = {
  name: 'Pre-start inspection',
  purpose: 'pre_start_inspection',
  requiredWhen: 'before_start',
  requiredDuty: 'start_and_run',
  description: '',
  sections: [
    {
      key: 'round',
      title: 'Round the engine',
      items: [
        { key: 'guards', kind: 'tick', label: 'Guards in place', required: true },
        {
          key: 'barring',
          kind: 'choice',
          label: 'Barring gear',
          required: true,
          choices: ['Out and locked', 'Engaged'],
          acceptable: ['Out and locked'],
        },
        { key: 'remarks', kind: 'note', label: 'Remarks', required: false },
      ],
    },
  ],
};
export const SHUTDOWN: ChecklistTemplateContent = {
  name: 'Shutdown',
  purpose: 'shutdown',
  requiredWhen: 'after_stop',
  requiredDuty: 'shutdown',
  description: '',
  sections: [{ key: 'stop', title: 'Stop', items: [{ key: 'locked', kind: 'tick', label: 'Stop valve locked', required: true }] }],
};

export async function createTemplate(
  t: TestApp,
  chief: SignedIn,
  engineId: string,
  content: ChecklistTemplateContent,
): Promise<ChecklistTemplateDetail> {
  const res = await signedIn(t, chief)
    .post('/api/checklist-templates')
    .send({ ...content, engineId, issue: true });
  if (res.status !== 201) throw new Error(`template not created: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** A new run of the engine, moved to preparing; any other open run of the engine is set aside first (test set-up only). */
export async function preparingRun(t: TestApp, by: SignedIn, engineId: string): Promise<RunDetail> {
  await t.db.query(
    `UPDATE runs SET state = 'abandoned', abandoned_reason = 'test set-up' WHERE engine_id = $1 AND state NOT IN ('closed', 'abandoned')`,
    [engineId],
  );
  await t.db.query(`UPDATE engines SET active_run_id = NULL WHERE id = $1`, [engineId]);
  return createPreparingRun(t, by, engineId, { title: `Test run ${randomUUID().slice(0, 6)}` });
}

export async function startChecklist(t: TestApp, by: SignedIn, runId: string, templateId: string): Promise<ChecklistDetail> {
  const res = await signedIn(t, by).post(`/api/runs/${runId}/checklists`).send({ templateId });
  if (res.status !== 201) throw new Error(`checklist not started: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

export function fill(t: TestApp, by: SignedIn, checklistId: string, itemKey: string, value: Record<string, unknown>) {
  return signedIn(t, by).put(`/api/checklists/${checklistId}/items/${itemKey}`).send(value);
}

export function sign(t: TestApp, by: SignedIn, checklistId: string, signature = by.account.password) {
  return signedIn(t, by).post(`/api/checklists/${checklistId}/sign`).send({ signature });
}

/** Good values for every required item of the test templates. */
export const GOOD: Record<string, Record<string, unknown>> = {
  valves: { tick: true },
  pressure: { value: 22 },
  guards: { tick: true },
  barring: { choice: 'Out and locked' },
  locked: { tick: true },
};

/** Starts, fills with good values and signs a checklist; returns it signed. */
export async function completeChecklist(
  t: TestApp,
  by: SignedIn,
  runId: string,
  templateId: string,
  signer: SignedIn = by,
): Promise<ChecklistDetail> {
  const c = await startChecklist(t, by, runId, templateId);
  for (const e of c.entries) {
    const v = GOOD[e.itemKey];
    if (!v) continue;
    const r = await fill(t, by, c.id, e.itemKey, v);
    if (r.status !== 200) throw new Error(`item ${e.itemKey} not filled: ${r.status} ${JSON.stringify(r.body)}`);
  }
  const s = await sign(t, signer, c.id);
  if (s.status !== 200) throw new Error(`checklist not signed: ${s.status} ${JSON.stringify(s.body)}`);
  return s.body;
}

/** Starts a run through the REST route; returns status and body. */
export async function startByRest(
  t: TestApp,
  by: SignedIn,
  runId: string,
): Promise<{ status: number; verdict: StartGateVerdict | null; run: RunDetail | null }> {
  const res = await signedIn(t, by).post(`/api/runs/${runId}/transitions`).send({ to: 'running' });
  return {
    status: res.status,
    verdict: res.status === 409 ? (res.body.details as StartGateVerdict) : null,
    run: res.status === 200 ? res.body : null,
  };
}

/** Starts a run through the live channel's 'run:start' event; returns the same shape as startByRest. */
export async function startBySocket(
  t: TestApp,
  by: SignedIn,
  runId: string,
): Promise<{ status: number; verdict: StartGateVerdict | null; run: RunDetail | null }> {
  const s = socketAs(t.url, by);
  try {
    await connected(s);
    const ack = (await s.timeout(10_000).emitWithAck('run:start', { runId })) as LiveAck<RunDetail | StartGateVerdict>;
    if (ack.ok) return { status: 200, verdict: null, run: ack.data as RunDetail };
    return { status: ack.status ?? 500, verdict: (ack.details as StartGateVerdict) ?? null, run: null };
  } finally {
    s.disconnect();
  }
}
