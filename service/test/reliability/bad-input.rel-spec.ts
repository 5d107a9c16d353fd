/**
 * Bad input corpus: every write route of the OpenAPI document (generic mutations of a valid-looking body,
 * see support/corpus.ts), hand-written cases for the run log (readings, loggers, CSV files, amendments,
 * runs, alarms) and every client-to-server socket event. Each case must be refused with a 4xx (an ack
 * ok:false with a 4xx status on the socket) carrying a message, never a 5xx, and a fingerprint of the
 * whole database before and after must be the same.
 */
import { randomUUID } from 'node:crypto';
import { request as httpRequest } from 'node:http';
import type { Socket } from 'socket.io-client';
import type { EngineDetail, ReadingDto } from '@crankjournal/shared-types';
import { startTestApp } from '../utils/test-app.js';
import { connected, socketAs } from '../utils/socket.js';
import { authHeader } from '../utils/signed-in.js';
import { createPreparingRun, engineBody } from '../factories/engine.factory.js';
import { ROUTE_ACCESS } from '../roles-matrix.table.js';
import { CORPUS_SNAPSHOT, diffSnapshots, snapshotter, type Query, type Snapshot } from './support/db-snapshot.js';
import {
  generateCases,
  HTML_IMG,
  HTML_INJECTION,
  HUGE_TEXT,
  OVERSIZED_JSON,
  SQL_INJECTION,
  SQL_TAUTOLOGY,
  type HttpCase,
  type OpenApiDoc,
} from './support/corpus.js';
import { sessionsForEveryRole } from './support/sessions.js';
import { gatewayEvents } from './support/routes.js';

interface Answer {
  status: number;
  message: unknown;
}
interface BadCase {
  name: string;
  run: () => Promise<Answer>;
  /** A refusal of the credentials themselves (401) is the expected answer (logger keys, sign-in). */
  credentialsCase?: boolean;
}

// ---------------------------------------------------------------------------------------------------
// The application, people and a small world to aim at: two engines, runs in different states, loggers.
// ---------------------------------------------------------------------------------------------------
/** A request left without an answer this long counts as a failure (a hung route). */
const ANSWER_WITHIN_MS = 15_000;
const t = await startTestApp();
const q: Query = (sql, params) => t.db.query(sql, params);
const s = await sessionsForEveryRole(t.db);
const operator = s.operator.token;
const chief = s.chief_engineer.token;
const admin = s.administrator.token;

async function http(
  method: string,
  path: string,
  o: { token?: string; json?: unknown; raw?: string | Buffer; contentType?: string; headers?: Record<string, string> } = {},
): Promise<Answer & { body: unknown }> {
  const headers: Record<string, string> = { ...(o.headers ?? {}), ...(o.token ? authHeader(o.token) : {}) };
  let body: string | Buffer | undefined;
  if (o.json !== undefined) {
    body = JSON.stringify(o.json);
    headers['content-type'] = o.contentType ?? 'application/json';
  } else if (o.raw !== undefined) {
    body = o.raw;
    if (o.contentType) headers['content-type'] = o.contentType;
  }
  let res: Response;
  try {
    res = await fetch(`${t.url}${path}`, { method, headers, body, signal: AbortSignal.timeout(ANSWER_WITHIN_MS) });
  } catch (e) {
    return { status: 0, message: `no answer within ${ANSWER_WITHIN_MS} ms (${(e as Error).name})`, body: null };
  }
  const text = await res.text();
  let parsed: unknown = text;
  try {
    parsed = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  const message = typeof parsed === 'object' && parsed !== null ? (parsed as { message?: unknown }).message : undefined;
  return { status: res.status, message, body: parsed };
}

const withExtraPoints = (name: string, extra: EngineDetail['measurementPoints'] | object[]) => {
  const b = engineBody(name);
  b.measurementPoints.push(...(extra as typeof b.measurementPoints));
  return b;
};
async function engine(body: object): Promise<EngineDetail> {
  const r = await http('POST', '/api/engines', { token: chief, json: body });
  if (r.status !== 201) throw new Error(`engine not created: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body as EngineDetail;
}
const engineA = await engine(
  withExtraPoints(`Corpus engine A ${randomUUID().slice(0, 6)}`, [
    { code: 'RCV', label: 'Receiver (absolute)', kind: 'receiver_pressure', unit: 'psia', sequence: 5 },
    { code: 'VAC', label: 'Condenser vacuum', kind: 'vacuum', unit: 'inHg', sequence: 6 },
  ]),
);
const engineB = await engine(
  withExtraPoints(`Corpus engine B ${randomUUID().slice(0, 6)}`, [
    { code: 'BX', label: 'Only on B', kind: 'other', unit: 'psig', sequence: 5 },
  ]),
);
const pointA = (code: string) => engineA.measurementPoints.find((p) => p.code === code)!.id;
const pointB = (code: string) => engineB.measurementPoints.find((p) => p.code === code)!.id;

// An abandoned run of A (part of the record, closed to changes), then the active run of A.
const runC = (
  await http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 'Abandoned corpus run' } })
).body as { id: string };
await http('POST', `/api/runs/${runC.id}/transitions`, { token: operator, json: { to: 'abandoned', note: 'Feed pump failed' } });
const runA = await createPreparingRun(t, operator, engineA.id);
const runB = await createPreparingRun(t, operator, engineB.id);
// The operator may answer alarms on B (the qualifications module asks for the start-and-run duty).
const today = new Date().toISOString().slice(0, 10);
const nextYear = new Date(Date.now() + 300 * 86_400_000).toISOString().slice(0, 10);
await http('POST', '/api/qualifications', {
  token: chief,
  json: { userId: s.operator.user.id, engineId: engineB.id, duty: 'start_and_run', grantedOn: today, expiresOn: nextYear },
});
const runP = (
  await http('POST', '/api/runs', { token: operator, json: { engineId: engineB.id, purpose: 'test', title: 'Planned corpus run' } })
).body as { id: string };

const loggerA = (await http('POST', '/api/loggers', { token: admin, json: { engineId: engineA.id, name: 'Corpus logger A' } })).body as {
  id: string;
  key: string;
};
const revoked = (await http('POST', '/api/loggers', { token: admin, json: { engineId: engineA.id, name: 'Corpus logger, revoked' } }))
  .body as { id: string; key: string };
await http('POST', `/api/loggers/${revoked.id}/revoke`, { token: admin });

const now = () => new Date().toISOString();
const good = (pointId: string, value: number) => ({ clientId: randomUUID(), pointId, value, takenAt: now() });
// A stored reading of A's absolute receiver pressure (to amend) and an alarm on B (to shelve).
const stored = good(pointA('RCV'), 10);
await http('POST', `/api/runs/${runA.id}/rounds`, { token: operator, json: { takenAt: stored.takenAt, readings: [stored] } });
const readingA = ((await http('GET', `/api/runs/${runA.id}/readings`, { token: operator })).body as ReadingDto[]).find(
  (r) => r.clientId === stored.clientId,
)!;
await http('POST', `/api/runs/${runB.id}/rounds`, { token: operator, json: { takenAt: now(), readings: [good(pointB('SPD'), 80)] } });
const alarmB = ((await http('GET', `/api/runs/${runB.id}/alarms`, { token: operator })).body as { id: string }[])[0];
if (!runA?.id || !runB?.id || !runC?.id || !runP?.id || !loggerA?.key || !readingA?.id || !alarmB?.id)
  throw new Error('the corpus world was not set up');

// ---------------------------------------------------------------------------------------------------
// Generic cases from the OpenAPI document.
// ---------------------------------------------------------------------------------------------------
const doc = (await http('GET', '/api/docs-json')).body as OpenApiDoc;
const genericCases = generateCases(doc);
const PREFERRED_ROLES = ['chief_engineer', 'operator', 'administrator', 'maintenance_lead', 'mill_lead', 'observer'] as const;

function credentialsFor(routeKey: string): { headers: Record<string, string>; isPublic: boolean } {
  const access = ROUTE_ACCESS[routeKey];
  if (access === 'public') return { headers: {}, isPublic: true };
  if (access === 'logger-key') return { headers: { 'x-logger-key': loggerA.key }, isPublic: false };
  const role = PREFERRED_ROLES.find((r) => !access || access.includes(r)) ?? 'chief_engineer';
  return { headers: authHeader(s[role].token), isPublic: false };
}

const fromGeneric = (c: HttpCase): BadCase => {
  const cred = credentialsFor(c.routeKey);
  return {
    name: c.name,
    credentialsCase: cred.isPublic,
    run: async () => {
      const r = await http(c.method, c.path, {
        raw: c.body,
        contentType: c.contentType,
        headers: { ...cred.headers, ...(c.headers ?? {}) },
      });
      return r;
    },
  };
};

// ---------------------------------------------------------------------------------------------------
// Hand-written cases: the run log.
// ---------------------------------------------------------------------------------------------------
const round = (readings: unknown, extra: object = {}) => ({ takenAt: now(), readings, ...extra });
const postRound =
  (body: unknown, runId = runA.id, token = operator) =>
  () =>
    http('POST', `/api/runs/${runId}/rounds`, { token, json: body });
const rawRound =
  (text: string, runId = runA.id) =>
  () =>
    http('POST', `/api/runs/${runId}/rounds`, { token: operator, raw: text, contentType: 'application/json' });
const oneReading = (r: object) => postRound(round([{ clientId: randomUUID(), pointId: pointA('THR'), value: 120, takenAt: now(), ...r }]));
const bareReading = (r: object) => postRound(round([r]));
/** JSON text of one round whose only reading's value is a literal JSON cannot make from a JS number. */
const literalValue = (literal: string) =>
  `{"takenAt":"${now()}","readings":[{"clientId":"${randomUUID()}","pointId":"${pointA('THR')}","value":${literal},"takenAt":"${now()}"}]}`;

const runLogCases: BadCase[] = [
  { name: 'round: value "NaN"', run: oneReading({ value: 'NaN' }) },
  { name: 'round: value "Infinity"', run: oneReading({ value: 'Infinity' }) },
  { name: 'round: value 1e400 (Infinity once parsed)', run: rawRound(literalValue('1e400')) },
  { name: 'round: value -1e400', run: rawRound(literalValue('-1e400')) },
  { name: 'round: value 1e308 (huge)', run: oneReading({ value: 1e308 }) },
  { name: 'round: value 12345678901 (beyond any gauge)', run: oneReading({ value: 12345678901 }) },
  { name: 'round: value null', run: oneReading({ value: null }) },
  { name: 'round: value true', run: oneReading({ value: true }) },
  { name: 'round: value as text "120"', run: oneReading({ value: '120' }) },
  { name: 'round: value as text "120 psig"', run: oneReading({ value: '120 psig' }) },
  { name: 'round: negative absolute pressure (−5 psia)', run: oneReading({ pointId: pointA('RCV'), value: -5 }) },
  { name: 'round: gauge pressure below a perfect vacuum (−20 psig)', run: oneReading({ pointId: pointA('THR'), value: -20 }) },
  { name: 'round: vacuum beyond the gauge (35 inHg)', run: oneReading({ pointId: pointA('VAC'), value: 35 }) },
  { name: 'round: negative vacuum (−1 inHg)', run: oneReading({ pointId: pointA('VAC'), value: -1 }) },
  { name: 'round: bearing at 900 °F', run: oneReading({ pointId: pointA('MB'), value: 900 }) },
  { name: 'round: bearing at −100 °F', run: oneReading({ pointId: pointA('MB'), value: -100 }) },
  { name: 'round: negative speed (−3 rpm)', run: oneReading({ pointId: pointA('SPD'), value: -3 }) },
  { name: 'round: speed 5000 rpm', run: oneReading({ pointId: pointA('SPD'), value: 5000 }) },
  { name: 'round: takenAt far in the future (2999)', run: oneReading({ takenAt: '2999-01-01T00:00:00Z' }) },
  { name: 'round: takenAt far in the past (1900)', run: oneReading({ takenAt: '1900-01-01T00:00:00Z' }) },
  { name: 'round: takenAt year 99999', run: oneReading({ takenAt: '99999-01-01T00:00:00Z' }) },
  { name: 'round: takenAt not a date', run: oneReading({ takenAt: '2026-13-45T99:00:00Z' }) },
  { name: 'round: takenAt "yesterday"', run: oneReading({ takenAt: 'yesterday' }) },
  { name: 'round: takenAt as epoch milliseconds', run: oneReading({ takenAt: Date.now() }) },
  { name: 'round: takenAt SQL injection', run: oneReading({ takenAt: SQL_TAUTOLOGY }) },
  { name: 'round: clientId missing', run: bareReading({ pointId: pointA('THR'), value: 120, takenAt: now() }) },
  { name: 'round: clientId not a UUID', run: oneReading({ clientId: '123' }) },
  { name: 'round: clientId SQL injection', run: oneReading({ clientId: SQL_INJECTION }) },
  { name: 'round: pointId of another engine', run: oneReading({ pointId: pointB('THR') }) },
  { name: 'round: pointId nobody has', run: oneReading({ pointId: randomUUID() }) },
  { name: 'round: pointId SQL injection', run: oneReading({ pointId: SQL_TAUTOLOGY }) },
  {
    name: 'round: pointCode of another engine only',
    run: bareReading({ clientId: randomUUID(), pointCode: 'BX', value: 1, takenAt: now() }),
  },
  { name: 'round: pointCode unknown', run: bareReading({ clientId: randomUUID(), pointCode: 'NOPE', value: 1, takenAt: now() }) },
  { name: 'round: pointCode HTML injection', run: bareReading({ clientId: randomUUID(), pointCode: HTML_IMG, value: 1, takenAt: now() }) },
  {
    name: 'round: pointCode SQL injection',
    run: bareReading({ clientId: randomUUID(), pointCode: "THR' OR 1=1--", value: 1, takenAt: now() }),
  },
  { name: 'round: pointCode huge string', run: bareReading({ clientId: randomUUID(), pointCode: HUGE_TEXT, value: 1, takenAt: now() }) },
  { name: 'round: neither pointId nor pointCode', run: bareReading({ clientId: randomUUID(), value: 1, takenAt: now() }) },
  { name: 'round: wrong unit (degC for a psig point)', run: oneReading({ unit: 'degC' }) },
  { name: 'round: wrong unit (bar for a psig point)', run: oneReading({ unit: 'bar' }) },
  { name: 'round: wrong unit (psig for a bearing temperature)', run: oneReading({ pointId: pointA('MB'), value: 100, unit: 'psig' }) },
  { name: 'round: unknown unit', run: oneReading({ unit: 'furlongs' }) },
  { name: 'round: unknown field in a reading', run: oneReading({ operatorMood: 'fine' }) },
  { name: 'round: unknown field in the round', run: postRound(round([good(pointA('THR'), 120)], { shift: 'night' })) },
  { name: 'round: no readings', run: postRound(round([])) },
  {
    name: 'round: 501 readings (over the round limit)',
    run: postRound(round(Array.from({ length: 501 }, () => good(pointA('THR'), 120)))),
  },
  { name: 'round: readings as text', run: postRound(round('THR=120')) },
  { name: 'round: readings as numbers', run: postRound(round([1, 2, 3])) },
  { name: 'round: a null reading', run: postRound(round([null])) },
  { name: 'round: takenAt of the round missing', run: postRound({ readings: [good(pointA('THR'), 120)] }) },
  { name: 'round: note too long', run: postRound(round([good(pointA('THR'), 120)], { note: 'n'.repeat(3000) })) },
  { name: 'round: run nobody has', run: postRound(round([good(pointA('THR'), 120)]), randomUUID()) },
  {
    name: 'round: run id SQL injection',
    run: () =>
      http('POST', `/api/runs/${encodeURIComponent(SQL_TAUTOLOGY)}/rounds`, { token: operator, json: round([good(pointA('THR'), 120)]) }),
  },
  { name: 'round: run of another engine (point of A posted to run B)', run: postRound(round([good(pointA('THR'), 120)]), runB.id) },
  { name: 'round: abandoned run', run: postRound(round([good(pointA('THR'), 120)]), runC.id) },
  { name: 'round: planned run (not taking readings yet)', run: postRound(round([good(pointB('THR'), 120)]), runP.id) },
  {
    name: 'round: oversized body (6 MB)',
    run: () => http('POST', `/api/runs/${runA.id}/rounds`, { token: operator, raw: OVERSIZED_JSON(), contentType: 'application/json' }),
  },
  { name: 'round: malformed JSON', run: rawRound('{"takenAt": "2026-06-14T10:00:00Z", "readings": [') },

  // Data logger pushes
  {
    name: 'logger: no key',
    credentialsCase: true,
    run: () => http('POST', '/api/logger/readings', { json: { readings: [good(pointA('THR'), 120)] } }),
  },
  {
    name: 'logger: unknown key',
    credentialsCase: true,
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': `cjl_${randomUUID()}` },
        json: { readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: revoked key',
    credentialsCase: true,
    run: () =>
      http('POST', '/api/logger/readings', { headers: { 'x-logger-key': revoked.key }, json: { readings: [good(pointA('THR'), 120)] } }),
  },
  {
    name: 'logger: key SQL injection',
    credentialsCase: true,
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': `cjl_${SQL_TAUTOLOGY}` },
        json: { readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: key 10 kB long',
    credentialsCase: true,
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': `cjl_${'k'.repeat(10_000)}` },
        json: { readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: a user token instead of a key',
    credentialsCase: true,
    run: () => http('POST', '/api/logger/readings', { token: chief, json: { readings: [good(pointA('THR'), 120)] } }),
  },
  {
    name: 'logger: runId of another engine',
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': loggerA.key },
        json: { runId: runB.id, readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: runId nobody has',
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': loggerA.key },
        json: { runId: randomUUID(), readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: runId of an abandoned run of its engine',
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': loggerA.key },
        json: { runId: runC.id, readings: [good(pointA('THR'), 120)] },
      }),
  },
  {
    name: 'logger: point of another engine',
    run: () =>
      http('POST', '/api/logger/readings', { headers: { 'x-logger-key': loggerA.key }, json: { readings: [good(pointB('THR'), 120)] } }),
  },
  {
    name: 'logger: value "NaN"',
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': loggerA.key },
        json: { readings: [{ ...good(pointA('THR'), 1), value: 'NaN' }] },
      }),
  },
  {
    name: 'logger: negative absolute pressure',
    run: () =>
      http('POST', '/api/logger/readings', { headers: { 'x-logger-key': loggerA.key }, json: { readings: [good(pointA('RCV'), -14)] } }),
  },
  {
    name: 'logger: 20,001 readings (over the batch limit)',
    run: () =>
      http('POST', '/api/logger/readings', {
        headers: { 'x-logger-key': loggerA.key },
        json: { readings: Array.from({ length: 20_001 }, () => good(pointA('THR'), 120)) },
      }),
  },
  {
    name: 'logger: readings missing',
    run: () => http('POST', '/api/logger/readings', { headers: { 'x-logger-key': loggerA.key }, json: { runId: runA.id } }),
  },

  // CSV imports
  ...csvCases(),

  // Amendments
  {
    name: 'amend: reading id not a number',
    run: () => http('POST', '/api/readings/abc/amendments', { token: operator, json: { value: 11, reason: 'Misread' } }),
  },
  {
    name: 'amend: reading id SQL injection',
    run: () =>
      http('POST', `/api/readings/${encodeURIComponent('1 OR 1=1')}/amendments`, {
        token: operator,
        json: { value: 11, reason: 'Misread' },
      }),
  },
  {
    name: 'amend: reading id 25 digits',
    run: () => http('POST', `/api/readings/${'9'.repeat(25)}/amendments`, { token: operator, json: { value: 11, reason: 'Misread' } }),
  },
  {
    name: 'amend: reading nobody has',
    run: () => http('POST', '/api/readings/987654321012/amendments', { token: operator, json: { value: 11, reason: 'Misread' } }),
  },
  {
    name: 'amend: value "NaN"',
    run: () => http('POST', `/api/readings/${readingA.id}/amendments`, { token: operator, json: { value: 'NaN', reason: 'Misread' } }),
  },
  {
    name: 'amend: value 1e400',
    run: () =>
      http('POST', `/api/readings/${readingA.id}/amendments`, {
        token: operator,
        raw: '{"value":1e400,"reason":"Misread"}',
        contentType: 'application/json',
      }),
  },
  {
    name: 'amend: negative absolute pressure',
    run: () => http('POST', `/api/readings/${readingA.id}/amendments`, { token: operator, json: { value: -3, reason: 'Misread' } }),
  },
  {
    name: 'amend: reason empty',
    run: () => http('POST', `/api/readings/${readingA.id}/amendments`, { token: operator, json: { value: 11, reason: '' } }),
  },
  {
    name: 'amend: reason missing',
    run: () => http('POST', `/api/readings/${readingA.id}/amendments`, { token: operator, json: { value: 11 } }),
  },
  {
    name: 'amend: reason huge',
    run: () => http('POST', `/api/readings/${readingA.id}/amendments`, { token: operator, json: { value: 11, reason: HUGE_TEXT } }),
  },
  {
    name: 'amend: unknown field',
    run: () =>
      http('POST', `/api/readings/${readingA.id}/amendments`, {
        token: operator,
        json: { value: 11, reason: 'Misread', originalValue: 99 },
      }),
  },

  // Runs
  {
    name: 'run: engine nobody has',
    run: () => http('POST', '/api/runs', { token: operator, json: { engineId: randomUUID(), purpose: 'test', title: 'x' } }),
  },
  {
    name: 'run: purpose not allowed',
    run: () => http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'party', title: 'x' } }),
  },
  {
    name: 'run: title empty',
    run: () => http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: '' } }),
  },
  {
    name: 'run: title 200 characters',
    run: () => http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 't'.repeat(200) } }),
  },
  {
    name: 'run: plannedFor 30 February',
    run: () =>
      http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 'x', plannedFor: '2026-02-30' } }),
  },
  {
    name: 'run: plannedFor year 99999',
    run: () =>
      http('POST', '/api/runs', {
        token: operator,
        json: { engineId: engineA.id, purpose: 'test', title: 'x', plannedFor: '99999-01-01' },
      }),
  },
  {
    name: 'run: crew id not a UUID',
    run: () =>
      http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 'x', crewIds: ['bob'] } }),
  },
  {
    name: 'run: crew member nobody has',
    run: () =>
      http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 'x', crewIds: [randomUUID()] } }),
  },
  {
    name: 'run: notes over 5000 characters',
    run: () =>
      http('POST', '/api/runs', { token: operator, json: { engineId: engineA.id, purpose: 'test', title: 'x', notes: 'n'.repeat(5001) } }),
  },
  {
    name: 'run: move to another engine',
    run: () => http('PATCH', `/api/runs/${runA.id}`, { token: operator, json: { engineId: engineB.id } }),
  },
  {
    name: 'run: change an abandoned run',
    run: () => http('PATCH', `/api/runs/${runC.id}`, { token: operator, json: { title: 'Rewritten history' } }),
  },
  {
    name: 'run: transition to a state that does not exist',
    run: () => http('POST', `/api/runs/${runA.id}/transitions`, { token: operator, json: { to: 'flying' } }),
  },
  {
    name: 'run: transition SQL injection',
    run: () => http('POST', `/api/runs/${runA.id}/transitions`, { token: operator, json: { to: "running'; --" } }),
  },
  {
    name: 'run: abandon without a reason',
    run: () => http('POST', `/api/runs/${runA.id}/transitions`, { token: operator, json: { to: 'abandoned' } }),
  },
  {
    name: 'run: planned straight to running',
    run: () => http('POST', `/api/runs/${runP.id}/transitions`, { token: operator, json: { to: 'running' } }),
  },
  {
    name: 'run: preparing straight to stopped',
    run: () => http('POST', `/api/runs/${runA.id}/transitions`, { token: operator, json: { to: 'stopped' } }),
  },
  {
    name: 'run: abandoned back to preparing',
    run: () => http('POST', `/api/runs/${runC.id}/transitions`, { token: operator, json: { to: 'preparing' } }),
  },

  // Engines
  {
    name: 'engine: negative bore',
    run: () =>
      http('POST', '/api/engines', { token: chief, json: { ...engineBody(), cylinders: [{ ...engineBody().cylinders[0], boreIn: -20 }] } }),
  },
  {
    name: 'engine: MAWP 1e400',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        raw: JSON.stringify(engineBody()).replace('"mawpPsig":150', '"mawpPsig":1e400'),
        contentType: 'application/json',
      }),
  },
  {
    name: 'engine: a point in furlongs',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        json: { ...engineBody(), measurementPoints: [{ ...engineBody().measurementPoints[0], unit: 'furlongs' }] },
      }),
  },
  {
    name: 'engine: a point of a kind that does not exist',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        json: { ...engineBody(), measurementPoints: [{ ...engineBody().measurementPoints[0], kind: 'warp_core' }] },
      }),
  },
  {
    name: 'engine: a high limit "NaN"',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        json: { ...engineBody(), measurementPoints: [{ ...engineBody().measurementPoints[0], highLimit: 'NaN' }] },
      }),
  },
  {
    name: 'engine: a point code with HTML',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        json: { ...engineBody(), measurementPoints: [{ ...engineBody().measurementPoints[0], code: HTML_INJECTION }] },
      }),
  },
  {
    name: 'engine: a bearing point naming a bearing it does not have',
    run: () =>
      http('POST', '/api/engines', {
        token: chief,
        json: { ...engineBody(), measurementPoints: [{ ...engineBody().measurementPoints[2], bearingLabel: 'Nowhere' }] },
      }),
  },
  {
    name: 'engine: the name of an engine that exists',
    run: () => http('POST', '/api/engines', { token: chief, json: engineBody(engineA.name) }),
  },
  {
    name: 'engine: update an engine nobody has',
    run: () => http('PUT', `/api/engines/${randomUUID()}`, { token: chief, json: engineBody() }),
  },
  {
    name: 'engine: update A with a bearing id of B',
    run: () =>
      http('PUT', `/api/engines/${engineA.id}`, {
        token: chief,
        json: { ...engineBody(engineA.name), bearings: [{ ...engineBody().bearings[0], id: engineB.bearings[0].id }] },
      }),
  },

  // Alarms
  {
    name: 'alarm: acknowledge an alarm nobody has',
    run: () => http('POST', `/api/alarms/${randomUUID()}/acknowledge`, { token: operator }),
  },
  {
    name: 'alarm: acknowledge id SQL injection',
    run: () => http('POST', `/api/alarms/${encodeURIComponent(SQL_TAUTOLOGY)}/acknowledge`, { token: operator }),
  },
  {
    name: 'alarm: shelve for 0 minutes',
    run: () => http('POST', `/api/alarms/${alarmB.id}/shelve`, { token: operator, json: { reason: 'Gauge swap', minutes: 0 } }),
  },
  {
    name: 'alarm: shelve for a week',
    run: () => http('POST', `/api/alarms/${alarmB.id}/shelve`, { token: operator, json: { reason: 'Gauge swap', minutes: 10080 } }),
  },
  {
    name: 'alarm: shelve for 1.5 minutes',
    run: () => http('POST', `/api/alarms/${alarmB.id}/shelve`, { token: operator, json: { reason: 'Gauge swap', minutes: 1.5 } }),
  },
  {
    name: 'alarm: shelve for "NaN" minutes',
    run: () => http('POST', `/api/alarms/${alarmB.id}/shelve`, { token: operator, json: { reason: 'Gauge swap', minutes: 'NaN' } }),
  },
  {
    name: 'alarm: shelve without a reason',
    run: () => http('POST', `/api/alarms/${alarmB.id}/shelve`, { token: operator, json: { reason: '', minutes: 30 } }),
  },
  {
    name: 'alarm: unshelve an alarm that is not shelved',
    run: () => http('POST', `/api/alarms/${alarmB.id}/unshelve`, { token: operator }),
  },

  // Loggers
  {
    name: 'logger key: engine nobody has',
    run: () => http('POST', '/api/loggers', { token: admin, json: { engineId: randomUUID(), name: 'Ghost' } }),
  },
  { name: 'logger key: name empty', run: () => http('POST', '/api/loggers', { token: admin, json: { engineId: engineA.id, name: '' } }) },
  {
    name: 'logger key: name huge',
    run: () => http('POST', '/api/loggers', { token: admin, json: { engineId: engineA.id, name: HUGE_TEXT } }),
  },
  { name: 'logger key: revoke a logger nobody has', run: () => http('POST', `/api/loggers/${randomUUID()}/revoke`, { token: admin }) },
];

function csvCases(): BadCase[] {
  const post =
    (body: string | Buffer, contentType = 'text/csv', runId = runA.id) =>
    () =>
      http('POST', `/api/runs/${runId}/imports`, { token: operator, raw: body, contentType });
  const at = '2026-06-14T10:00:00Z';
  const recent = new Date(Date.now() - 60_000).toISOString();
  return [
    {
      name: 'csv: formula cells in the value column',
      run: post(
        `taken_at,point,value\n${recent},THR,=1+2\n${recent},SPD,"=HYPERLINK(""http://x"",""y"")"\n${recent},MB,@SUM(A1)\n${recent},AMB,+cmd|' /C calc'!A0\n${recent},THR,-2+3\n`,
      ),
    },
    {
      name: 'csv: formula cells in the point column',
      run: post(`taken_at,point,value\n${recent},=cmd|' /C calc'!A0,12\n${recent},@SUM(1+1),12\n`),
    },
    { name: 'csv: formula cell in the unit column', run: post(`taken_at,point,value,unit\n${recent},THR,120,=1+1\n`) },
    { name: 'csv: broken quoting (unterminated quote)', run: post(`taken_at,point,value\n"${recent},THR,"120\n${recent},SPD,74\n`) },
    { name: 'csv: more cells than the header', run: post(`taken_at,point,value\n${recent},THR,120,extra,cells\n`) },
    { name: 'csv: header missing a column', run: post(`taken_at,value\n${recent},120\n`) },
    { name: 'csv: empty file', run: post('') },
    { name: 'csv: header only', run: post('taken_at,point,value\n') },
    {
      name: 'csv: values NaN, Infinity and 1e400',
      run: post(`taken_at,point,value\n${recent},THR,NaN\n${recent},THR,Infinity\n${recent},THR,1e400\n`),
    },
    {
      name: 'csv: taken_at far in the future and far in the past',
      run: post(`taken_at,point,value\n2999-01-01T00:00:00Z,THR,120\n1900-01-01T00:00:00Z,THR,120\n`),
    },
    { name: 'csv: negative absolute pressure', run: post(`taken_at,point,value\n${recent},RCV,-5\n`) },
    { name: 'csv: wrong unit', run: post(`taken_at,point,value,unit\n${recent},THR,120,degC\n`) },
    { name: 'csv: point of another engine', run: post(`taken_at,point,value\n${recent},BX,1\n`) },
    { name: 'csv: SQL injection in the point column', run: post(`taken_at,point,value\n${recent},THR'; DROP TABLE readings;--,1\n`) },
    { name: 'csv: HTML injection in the point column', run: post(`taken_at,point,value\n${recent},${HTML_IMG},1\n`) },
    { name: 'csv: client_id not a UUID', run: post(`taken_at,point,value,client_id\n${recent},THR,120,abc\n`) },
    { name: 'csv: the file is JSON', run: post(JSON.stringify({ readings: [good(pointA('THR'), 120)] })) },
    {
      name: 'csv: a PNG labelled text/csv',
      run: post(Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(256, 7)])),
    },
    { name: 'csv: UTF-16 text (a mislabelled encoding)', run: post(Buffer.from(`taken_at,point,value\n${recent},THR,120\n`, 'utf16le')) },
    { name: 'csv: labelled application/json', run: post(`taken_at,point,value\n${recent},THR,120\n`, 'application/json') },
    { name: 'csv: labelled image/png', run: post(`taken_at,point,value\n${recent},THR,120\n`, 'image/png') },
    {
      name: 'csv: no content type',
      run: () =>
        http('POST', `/api/runs/${runA.id}/imports`, { token: operator, raw: Buffer.from(`taken_at,point,value\n${recent},THR,120\n`) }),
    },
    { name: 'csv: import into an abandoned run', run: post(`taken_at,point,value\n${recent},THR,120\n`, 'text/csv', runC.id) },
    { name: 'csv: import into a run nobody has', run: post(`taken_at,point,value\n${at},THR,120\n`, 'text/csv', randomUUID()) },
    {
      name: 'csv: declared larger than 200 MB',
      run: () => declaredOversizedUpload(`/api/runs/${runA.id}/imports`, 'text/csv', 300 * 1024 * 1024),
    },
  ];
}

/** Sends only the start of a body whose Content-Length claims `declared` bytes; the answer must come without the rest. */
function declaredOversizedUpload(path: string, contentType: string, declared: number): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const u = new URL(`${t.url}${path}`);
    const req = httpRequest(
      {
        host: u.hostname,
        port: u.port,
        path: u.pathname,
        method: 'POST',
        headers: { ...authHeader(operator), 'content-type': contentType, 'content-length': String(declared) },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          req.destroy();
          let message: unknown;
          try {
            message = JSON.parse(Buffer.concat(chunks).toString()).message;
          } catch {
            message = undefined;
          }
          resolve({ status: res.statusCode ?? 0, message });
        });
      },
    );
    req.on('error', (e) => (/(ECONNRESET|EPIPE)/.test(String(e)) ? undefined : reject(e)));
    req.write('taken_at,point,value\n');
  });
}

// ---------------------------------------------------------------------------------------------------
// Socket events (ClientToServerEvents of shared-types/src/events/live-events.ts).
// ---------------------------------------------------------------------------------------------------
let socket: Socket;
async function emit(event: string, payload: unknown): Promise<Answer> {
  if (!socket?.connected) {
    socket = await connected(socketAs(t.url, operator));
  }
  const errors: { message: unknown; status?: number }[] = [];
  const onError = (e: { message: unknown; status?: number }) => errors.push(e);
  socket.on('live:error', onError);
  try {
    const ack = (await socket.timeout(10_000).emitWithAck(event, payload)) as { ok?: boolean; status?: number; error?: string };
    if (ack?.ok !== false) return { status: 200, message: 'accepted' };
    return { status: ack.status ?? 0, message: ack.error };
  } finally {
    socket.off('live:error', onError);
  }
}
const submit =
  (readings: unknown, runId: unknown = runA.id) =>
  () =>
    emit('readings:submit', { runId, readings });
const liveReading = (r: object) => submit([{ clientId: randomUUID(), pointId: pointA('THR'), value: 120, takenAt: now(), ...r }]);

const socketCases: BadCase[] = [
  { name: 'socket readings:submit: payload is text', run: () => emit('readings:submit', 'THR=120') },
  { name: 'socket readings:submit: payload null', run: () => emit('readings:submit', null) },
  { name: 'socket readings:submit: payload is a list', run: () => emit('readings:submit', [good(pointA('THR'), 120)]) },
  { name: 'socket readings:submit: empty payload', run: () => emit('readings:submit', {}) },
  { name: 'socket readings:submit: runId not a UUID', run: submit([good(pointA('THR'), 120)], 'abc') },
  { name: 'socket readings:submit: runId SQL injection', run: submit([good(pointA('THR'), 120)], SQL_TAUTOLOGY) },
  { name: 'socket readings:submit: run nobody has', run: submit([good(pointA('THR'), 120)], randomUUID()) },
  { name: 'socket readings:submit: abandoned run', run: submit([good(pointA('THR'), 120)], runC.id) },
  { name: 'socket readings:submit: no readings', run: submit([]) },
  { name: 'socket readings:submit: readings as text', run: submit('THR=120') },
  { name: 'socket readings:submit: readings as numbers', run: submit([1, 2]) },
  { name: 'socket readings:submit: 5001 readings', run: submit(Array.from({ length: 5001 }, () => good(pointA('THR'), 120))) },
  {
    name: 'socket readings:submit: unknown field',
    run: () => emit('readings:submit', { runId: runA.id, readings: [good(pointA('THR'), 120)], priority: 'urgent' }),
  },
  { name: 'socket readings:submit: value "NaN"', run: liveReading({ value: 'NaN' }) },
  { name: 'socket readings:submit: value "Infinity"', run: liveReading({ value: 'Infinity' }) },
  { name: 'socket readings:submit: value 1e308', run: liveReading({ value: 1e308 }) },
  { name: 'socket readings:submit: negative absolute pressure', run: liveReading({ pointId: pointA('RCV'), value: -5 }) },
  { name: 'socket readings:submit: speed −3 rpm', run: liveReading({ pointId: pointA('SPD'), value: -3 }) },
  { name: 'socket readings:submit: takenAt 2999', run: liveReading({ takenAt: '2999-01-01T00:00:00Z' }) },
  { name: 'socket readings:submit: takenAt 1900', run: liveReading({ takenAt: '1900-01-01T00:00:00Z' }) },
  { name: 'socket readings:submit: point of another engine', run: liveReading({ pointId: pointB('THR') }) },
  { name: 'socket readings:submit: wrong unit', run: liveReading({ unit: 'degC' }) },
  { name: 'socket readings:submit: unknown field in a reading', run: liveReading({ mood: 'fine' }) },
  { name: 'socket readings:submit: clientId HTML injection', run: liveReading({ clientId: HTML_INJECTION }) },
  { name: 'socket run:start: empty payload', run: () => emit('run:start', {}) },
  { name: 'socket run:start: runId not a UUID', run: () => emit('run:start', { runId: 'abc' }) },
  { name: 'socket run:start: runId SQL injection', run: () => emit('run:start', { runId: SQL_INJECTION }) },
  { name: 'socket run:start: run nobody has', run: () => emit('run:start', { runId: randomUUID() }) },
  { name: 'socket run:start: a planned run (not through preparation)', run: () => emit('run:start', { runId: runP.id }) },
  { name: 'socket run:start: an abandoned run', run: () => emit('run:start', { runId: runC.id }) },
  { name: 'socket run:start: unknown field', run: () => emit('run:start', { runId: runA.id, force: true }) },
  { name: 'socket run:start: payload is text', run: () => emit('run:start', 'go') },
  { name: 'socket room:join: empty payload', run: () => emit('room:join', {}) },
  { name: 'socket room:join: room is a number', run: () => emit('room:join', { room: 42 }) },
  { name: 'socket room:join: room 10,000 characters', run: () => emit('room:join', { room: 'r'.repeat(10_000) }) },
  { name: 'socket room:join: room SQL injection', run: () => emit('room:join', { room: `run:${SQL_TAUTOLOGY}` }) },
  { name: 'socket room:join: room HTML injection', run: () => emit('room:join', { room: HTML_INJECTION }) },
  { name: 'socket room:join: run room with an id that is not a UUID', run: () => emit('room:join', { room: 'run:not-a-uuid' }) },
  { name: 'socket room:join: unknown field', run: () => emit('room:join', { room: 'site', admin: true }) },
  { name: 'socket room:join: payload is text', run: () => emit('room:join', 'site') },
  {
    name: 'socket room:join: unknown field __proto__',
    run: () => emit('room:join', JSON.parse('{"__proto__": {"role": "administrator"}, "room": "site"}')),
  },
  {
    name: 'socket readings:submit: unknown field __proto__',
    run: () =>
      emit(
        'readings:submit',
        JSON.parse(
          `{"__proto__": {"x": 1}, "runId": "${runA.id}", "readings": [{"clientId": "${randomUUID()}", "pointId": ` +
            `"${pointA('THR')}", "value": 120, "takenAt": "${now()}"}]}`,
        ),
      ),
  },
  { name: 'socket room:leave: empty payload', run: () => emit('room:leave', {}) },
  { name: 'socket room:leave: room is a list', run: () => emit('room:leave', { room: ['site'] }) },
  { name: 'socket room:leave: room 10,000 characters', run: () => emit('room:leave', { room: 'r'.repeat(10_000) }) },
];

// Every event a gateway subscribes to (found at runtime, so a new event is covered too): three shapes no
// event accepts.
const gatewayEventNames = gatewayEvents(t.app);
for (const event of gatewayEventNames) {
  socketCases.push(
    { name: `socket ${event}: payload is a bare string`, run: () => emit(event, 'just text') },
    { name: `socket ${event}: payload is a number`, run: () => emit(event, 42) },
    { name: `socket ${event}: an unknown field only`, run: () => emit(event, { zzUnknownField: true }) },
  );
}

// ---------------------------------------------------------------------------------------------------
const allCases: BadCase[] = [...genericCases.map(fromGeneric), ...runLogCases, ...socketCases];
const snapshot = snapshotter(q, CORPUS_SNAPSHOT);
let last: Snapshot;

beforeAll(async () => {
  last = await snapshot();
});
afterAll(async () => {
  socket?.disconnect();
  // A hung route (a failure reported above) must not keep the test run from ending.
  (t.app.getHttpServer() as { closeAllConnections?: () => void }).closeAllConnections?.();
  await t.close();
}, 60_000);

const messageText = (m: unknown) => (Array.isArray(m) ? m.filter((x) => typeof x === 'string').join(' ') : typeof m === 'string' ? m : '');

describe('bad input corpus', () => {
  it('has at least 200 cases, across every write route of the API document and every socket event', () => {
    expect(allCases.length).toBeGreaterThanOrEqual(200);
    // A write that takes no input at all (no body, no path parameter, e.g. sign out everywhere) has nothing to get wrong.
    const takesInput = (p: string, op: unknown) => /\{[^}]+\}/.test(p) || Boolean((op as { requestBody?: unknown }).requestBody);
    const writeOps = Object.entries(doc.paths).flatMap(([p, ops]) =>
      Object.entries(ops as Record<string, unknown>)
        .filter(([m, op]) => ['post', 'put', 'patch', 'delete'].includes(m) && takesInput(p, op))
        .map(([m]) => `${m.toUpperCase()} ${p.replace(/\{([^}]+)\}/g, ':$1')}`),
    );
    const covered = new Set(genericCases.map((c) => c.routeKey));
    expect(writeOps.filter((k) => !covered.has(k))).toEqual([]);
    expect(gatewayEventNames).toEqual(expect.arrayContaining(['readings:submit', 'run:start', 'room:join', 'room:leave']));
    for (const event of gatewayEventNames)
      expect(socketCases.filter((c) => c.name.startsWith(`socket ${event}:`)).length).toBeGreaterThanOrEqual(3);
  });

  it.each(allCases.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    const answer = await c.run();
    const after = await snapshot();
    const changed = diffSnapshots(last, after);
    last = after;
    const problems: string[] = [];
    if (answer.status >= 500) problems.push(`a server error ${answer.status}`);
    else if (answer.status < 400 || answer.status > 499) problems.push(`not refused: ${answer.status}`);
    if (!c.credentialsCase && (answer.status === 401 || answer.status === 403))
      problems.push(`refused by the credentials check (${answer.status}) before its input was judged`);
    if (!messageText(answer.message).trim()) problems.push('no message saying what is wrong');
    if (changed.length) problems.push(`the database changed: ${changed.join('; ')}`);
    if (problems.length)
      throw new Error(`${problems.join('\n')}\nanswer: ${answer.status} ${JSON.stringify(answer.message)?.slice(0, 300)}`);
  });
});
