/**
 * Exports: text that a spreadsheet would run as a formula (a cell beginning with =, +, -, @, tab or carriage
 * return) comes out neutralised in every CSV the API serves. Every GET route ending in .csv is found in the
 * router; each needs a fixture below that puts such text into the data it exports, through the API. A CSV
 * route without a fixture fails, saying so.
 */
import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { INSPECTION_KINDS, type EngineDetail, type ReadingDto } from '@crankjournal/shared-types';
import { startTestApp } from '../utils/test-app.js';
import { authHeader, fetchJson } from '../utils/signed-in.js';
import { engineBody } from '../factories/engine.factory.js';
import { concretePath, routerRoutes } from './support/routes.js';
import { sessionsForEveryRole } from './support/sessions.js';

/** Text each fixture plants; every one begins with a character a spreadsheet treats as a formula. */
const FORMULAS = ['=HYPERLINK("http://example.invalid/x","open me")', '+SUM(1,1)', '-2+3 cmd', '@SUM(A1:A2)', "=cmd|' /C calc'!A0"];
/** A cell that begins like a formula is acceptable only as a plain number (a negative reading is a number). */
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const DANGEROUS_START = /^[=+\-@\t\r]/;

const t = await startTestApp();
const s = await sessionsForEveryRole(t.db);

const api = <T = unknown>(method: string, path: string, token: string, body?: unknown) => fetchJson<T>(t.url, method, path, token, body);

/** An engine whose measurement point labels and bearing label are formulas. */
async function formulaEngine(): Promise<EngineDetail> {
  const body = engineBody(`Export engine ${randomUUID().slice(0, 6)}`);
  body.bearings[0].label = FORMULAS[3];
  body.measurementPoints = body.measurementPoints.map((p, i) => ({
    ...p,
    label: FORMULAS[i % FORMULAS.length],
    ...(p.bearingLabel ? { bearingLabel: FORMULAS[3] } : {}),
  }));
  return api<EngineDetail>('POST', '/api/engines', s.chief_engineer.token, body);
}

type Fixture = () => Promise<{ path: string; planted: string[] }>;

/** One fixture per CSV route ('GET /api/...csv' as the router has it). */
const FIXTURES: Record<string, Fixture> = {
  'GET /api/runs/:id/readings.csv': async () => {
    const engine = await formulaEngine();
    const op = s.operator.token;
    const run = await api<{ id: string }>('POST', '/api/runs', op, {
      engineId: engine.id,
      purpose: 'test',
      title: FORMULAS[0],
      notes: FORMULAS[1],
    });
    await api('POST', `/api/runs/${run.id}/transitions`, op, { to: 'preparing', note: FORMULAS[2] });
    const thr = engine.measurementPoints.find((p) => p.code === 'THR')!.id;
    const readings = [120, 121, 122, 123, 124].map((value) => ({
      clientId: randomUUID(),
      pointId: thr,
      value,
      takenAt: new Date().toISOString(),
    }));
    // A negative gauge reading: a number, which stays a number.
    readings.push({ clientId: randomUUID(), pointId: thr, value: -5, takenAt: new Date().toISOString() });
    await api('POST', `/api/runs/${run.id}/rounds`, op, { takenAt: new Date().toISOString(), readings, note: FORMULAS[3] });
    const stored = await api<ReadingDto[]>('GET', `/api/runs/${run.id}/readings`, op);
    for (const [i, r] of stored.filter((x) => x.value > 0).entries()) {
      await api('POST', `/api/readings/${r.id}/amendments`, op, { value: 130 + i, reason: FORMULAS[i % FORMULAS.length] });
    }
    return { path: `/api/runs/${run.id}/readings.csv`, planted: FORMULAS };
  },
  'GET /api/maintenance/bearings/:id/history.csv': async () => {
    const engine = await formulaEngine();
    const lead = s.maintenance_lead.token;
    const bearingId = engine.bearings[0].id!;
    await api('POST', '/api/maintenance/inspections', lead, {
      engineId: engine.id,
      bearingId,
      kind: INSPECTION_KINDS[0],
      title: FORMULAS[0],
      inspectedAt: new Date().toISOString(),
      findings: FORMULAS[1],
    });
    await api('POST', '/api/maintenance/work-records', lead, {
      engineId: engine.id,
      bearingId,
      title: FORMULAS[4],
      performedBy: FORMULAS[2],
    });
    return { path: `/api/maintenance/bearings/${bearingId}/history.csv`, planted: [FORMULAS[0], FORMULAS[4]] };
  },
};

const csvRoutes = routerRoutes(t.app).filter((r) => r.method === 'GET' && r.path.endsWith('.csv'));

afterAll(async () => {
  await t.close();
});

describe('CSV exports neutralise formula text', () => {
  it('the router serves CSV exports', () => {
    expect(csvRoutes.map((r) => r.key)).toContain('GET /api/runs/:id/readings.csv');
  });

  it.each(csvRoutes.map((r) => r.key))('%s', async (key) => {
    const fixture = FIXTURES[key];
    if (!fixture)
      throw new Error(
        `${key} serves a CSV but test/reliability/csv-exports.rel-spec.ts has no fixture for it: add one to FIXTURES ` +
          `that puts text beginning with =, +, - or @ into what it exports`,
      );
    const { path, planted } = await fixture();
    const res = await fetch(`${t.url}${concretePath(path)}`, { headers: authHeader(s.observer.token) });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    const text = await res.text();
    const cells = (Papa.parse<string[]>(text, { skipEmptyLines: true }).data as string[][]).flat();
    // Every planted formula is in the file, neutralised (prefixed with an apostrophe), never as it was.
    for (const f of planted) {
      expect(cells).toContain(`'${f}`);
      expect(cells).not.toContain(f);
    }
    // And no cell of the file, whatever put it there, begins like a formula unless it is a plain number.
    const live = cells.filter((c) => DANGEROUS_START.test(c) && !NUMBER.test(c));
    expect(live).toEqual([]);
  });
});
