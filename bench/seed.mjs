// Minimal data for the benchmarks: four people (straight into the database, with the service's own
// password hashing), then through the API: one engine per benchmark, a run taking readings on each of
// the first three, and a logger key. Writes .data/bench/context.json for the benchmark scripts.
import { writeFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import pg from 'pg';
import { ROOT, WORK, DB_URL, PASSWORD, api, login, log } from './lib.mjs';

const { hashPassword } = await import(pathToFileURL(join(ROOT, 'service/dist/common/util/password.util.js')).href);

const people = [
  { key: 'admin', email: 'admin@bench.crankjournal.test', name: 'Bench administrator', role: 'administrator' },
  { key: 'chief', email: 'chief@bench.crankjournal.test', name: 'Bench chief engineer', role: 'chief_engineer' },
  { key: 'operator', email: 'operator@bench.crankjournal.test', name: 'Bench operator', role: 'operator' },
  { key: 'observer', email: 'observer@bench.crankjournal.test', name: 'Bench observer', role: 'observer' },
];

const db = new pg.Client({ connectionString: DB_URL });
await db.connect();
const hash = await hashPassword(PASSWORD);
for (const p of people) {
  await db.query(
    `INSERT INTO users (email, display_name, role, active, password_hash) VALUES ($1, $2, $3, true, $4)
     ON CONFLICT (email) DO UPDATE SET password_hash = EXCLUDED.password_hash, role = EXCLUDED.role, active = true`,
    [p.email, p.name, p.role, hash],
  );
}
await db.end();

const tokens = {};
for (const p of people) tokens[p.key] = await login(p.email);

const base = (name) => ({
  name,
  builder: 'bench',
  yearBuilt: '1905',
  type: 'cross_compound',
  ratedSpeedRpm: 75,
  overspeedRpm: 82,
  mawpPsig: 150,
  preLubeFreshnessMinutes: 30,
  cylinders: [
    { label: 'HP', role: 'high', boreIn: 20, strokeIn: 48, pistonRodIn: 4, tailRodIn: 0, clearancePercent: 6 },
    { label: 'LP', role: 'low', boreIn: 36, strokeIn: 48, pistonRodIn: 4, tailRodIn: 0, clearancePercent: 6 },
  ],
  lubricationPoints: [{ label: 'Main oil line', kind: 'pressure_line', oilGrade: 'ISO VG 220' }],
  bearings: [],
  measurementPoints: [],
});

/** A bearing temperature point in °F with a high limit only (no high-high, so no alarm e-mail). */
const alarmPoint = (i) => ({
  code: `L${i}`,
  label: `Latency bearing ${i}`,
  kind: 'bearing_temperature',
  unit: 'degF',
  sequence: i,
  normalLow: 60,
  normalHigh: 115,
  highLimit: 130,
  deadband: 2,
});

/** A logger's view of an engine: eight bearing temperatures with every bearing rule, ambient, speed, steam. */
function loggerEngine(name) {
  const b = base(name);
  for (let i = 1; i <= 8; i++) {
    b.bearings.push({
      label: `Bearing ${i}`,
      kind: i <= 2 ? 'main' : i <= 4 ? 'crankpin' : 'crosshead',
      journalDiameterIn: 10,
      journalLengthIn: 14,
      loadSharePercent: 12.5,
      lubricationPointLabel: 'Main oil line',
    });
    b.measurementPoints.push({
      code: `T${i}`,
      label: `Bearing ${i} temperature`,
      kind: 'bearing_temperature',
      unit: 'degF',
      sequence: i,
      normalLow: 60,
      normalHigh: 140,
      highLimit: 160,
      highHighLimit: 200,
      maxRiseRatePerMin: 5,
      maxRiseAboveAmbient: 100,
      deadband: 2,
      bearingLabel: `Bearing ${i}`,
    });
  }
  b.measurementPoints.push({ code: 'AMB', label: 'Engine house', kind: 'ambient_temperature', unit: 'degF', sequence: 20 });
  b.measurementPoints.push({
    code: 'SPD',
    label: 'Speed',
    kind: 'speed',
    unit: 'rpm',
    sequence: 21,
    normalLow: 70,
    normalHigh: 76,
    highLimit: 78,
    deadband: 0.5,
  });
  b.measurementPoints.push({
    code: 'THR',
    label: 'Throttle',
    kind: 'throttle_pressure',
    unit: 'psig',
    sequence: 22,
    normalLow: 100,
    normalHigh: 135,
    highLimit: 142,
    highHighLimit: 148,
    lowLimit: 80,
    deadband: 2,
  });
  return b;
}

async function engine(body) {
  const e = await api('/api/engines', { method: 'POST', token: tokens.chief, body });
  return {
    id: e.id,
    name: e.name,
    points: Object.fromEntries(
      e.measurementPoints.map((p) => [p.code, { id: p.id, unit: p.unit, kind: p.kind, bearingId: p.bearingId ?? null }]),
    ),
    bearings: Object.fromEntries(e.bearings.map((x) => [x.label, x.id])),
  };
}

async function preparingRun(engineId, title) {
  const r = await api('/api/runs', { method: 'POST', token: tokens.operator, body: { engineId, purpose: 'test', title } });
  await api(`/api/runs/${r.id}/transitions`, { method: 'POST', token: tokens.operator, body: { to: 'preparing' } });
  return r.id;
}

const stamp = new Date().toISOString().slice(0, 16);
const A = base(`Bench A, alarm latency ${stamp}`);
for (let i = 1; i <= 5; i++) A.measurementPoints.push(alarmPoint(i));
const engines = {
  latency: await engine(A),
  ingest: await engine(loggerEngine(`Bench B, logger ingestion ${stamp}`)),
  copy: await engine(loggerEngine(`Bench B2, COPY baseline ${stamp}`)),
  csv: await engine(loggerEngine(`Bench C, CSV import ${stamp}`)),
  history: await engine(loggerEngine(`Bench D, bearing history ${stamp}`)),
};
const runs = {
  latency: await preparingRun(engines.latency.id, 'Bench: reading to alarm'),
  ingest: await preparingRun(engines.ingest.id, 'Bench: logger ingestion'),
  copy: await preparingRun(engines.copy.id, 'Bench: COPY baseline'),
  csv: await preparingRun(engines.csv.id, 'Bench: CSV import'),
};
// A run as the crew keeps it by hand, for the live run page: eight rounds of every point, fifteen minutes apart.
engines.ui = await engine(loggerEngine(`Bench E, live run page ${stamp}`));
runs.ui = await preparingRun(engines.ui.id, 'Bench: live run page');
const roundValues = { T1: 104, T2: 107, T3: 110, T4: 112, T5: 114, T6: 116, T7: 118, T8: 121, AMB: 68, SPD: 74, THR: 126 };
for (let k = 0; k < 8; k++) {
  const takenAt = new Date(Date.now() - (8 - k) * 15 * 60_000).toISOString();
  const readings = Object.entries(roundValues).map(([code, v]) => ({
    clientId: randomUUID(),
    pointId: engines.ui.points[code].id,
    value: v + k * 0.5,
    takenAt,
  }));
  await api(`/api/runs/${runs.ui}/rounds`, { method: 'POST', token: tokens.operator, body: { takenAt, readings } });
}
const logger = await api('/api/loggers', {
  method: 'POST',
  token: tokens.admin,
  body: { engineId: engines.ingest.id, name: 'Bench logger' },
});

writeFileSync(
  join(WORK, 'context.json'),
  JSON.stringify(
    { people: Object.fromEntries(people.map((p) => [p.key, p.email])), tokens, engines, runs, loggerKey: logger.key, loggerId: logger.id },
    null,
    2,
  ),
);
log(`seeded: 4 people, 6 engines, 5 runs (one with eight rounds of readings), 1 logger key`);
