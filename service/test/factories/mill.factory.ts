import { randomUUID } from 'node:crypto';
import type { EngineDetail, MillDto, MillWriteRequest, RunDetail, ScheduleWriteRequest } from '@crankjournal/shared-types';
import { type TestApp } from '../utils/test-app.js';
import { signedIn } from '../utils/signed-in.js';
import { createEngine, createRun, engineBody } from './engine.factory.js';

/** A test engine with a flywheel (the demo engine's invented figures: 156,800 lb at k = 9.9 ft, 75 rpm). */
export function millEngine(t: TestApp, chiefToken: string): Promise<EngineDetail> {
  return createEngine(t, chiefToken, {
    ...engineBody(`Mill test engine ${randomUUID().slice(0, 8)}`),
    flywheelMassLb: 156800,
    flywheelRadiusOfGyrationFt: 9.9,
  });
}

/** A three-stand 16 in mill with round-number quote rates. Test data, not demo data. */
export function millBody(engineId: string, name = `Test mill ${randomUUID().slice(0, 8)}`): MillWriteRequest {
  return {
    name,
    engineId,
    notes: 'test',
    stands: [
      { position: 1, name: 'Stand 1', rollDiameterMm: 406.4, barrelLengthMm: 762, rollSpeedRatio: 1, maxSeparatingForceKn: 1200 },
      { position: 2, name: 'Stand 2', rollDiameterMm: 406.4, barrelLengthMm: 762, rollSpeedRatio: 1, maxSeparatingForceKn: 1100 },
      { position: 3, name: 'Stand 3', rollDiameterMm: 393.7, barrelLengthMm: 711, rollSpeedRatio: 1, maxSeparatingForceKn: 1000 },
    ],
    settings: { minSpeedFraction: 0.9, mechanicalEfficiency: 0.88, baseLoadHp: 60, defaultIndicatedHp: 650, frictionFactor: 1.2 },
    quoteRates: {
      currency: 'GBP',
      stockRatePerTonne: 900,
      yieldLossPct: 10,
      engineRatePerHour: 250,
      crewRatePerPersonHour: 22.5,
      crewSize: 5,
      fixedCosts: [
        { label: 'Reheat furnace firing', amount: 1200 },
        { label: 'Inspection and paperwork', amount: 150 },
      ],
      contingencyPct: 10,
      marginPct: 15,
    },
  };
}

export async function createMill(t: TestApp, token: string, engineId: string): Promise<MillDto> {
  const res = await signedIn(t, token).post('/api/mill/mills').send(millBody(engineId));
  if (res.status !== 201) throw new Error(`mill not created: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as MillDto;
}

/** 3 in square to 2 in square in three box passes. */
export function scheduleBody(millId: string, isTemplate = true): ScheduleWriteRequest {
  const rect = (heightMm: number, widthMm: number) => ({ shape: 'rectangle' as const, heightMm, widthMm });
  return {
    millId,
    name: `Square test ${randomUUID().slice(0, 6)}`,
    isTemplate,
    productShape: 'square',
    productHeightMm: 50.8,
    productWidthMm: 50.8,
    steelGrade: 'Mild steel, 0.20 % C',
    carbonPct: 0.2,
    stock: rect(76.2, 76.2),
    stockLengthMm: 1500,
    passes: [
      { standPosition: 1, entry: rect(76.2, 76.2), exit: rect(62, 80), expectedTemperatureC: 1150 },
      { standPosition: 2, entry: rect(80, 62), exit: rect(60, 66), expectedTemperatureC: 1110 },
      { standPosition: 3, entry: rect(66, 60), exit: rect(50.8, 50.8), expectedTemperatureC: 1060 },
    ],
  };
}

/** A planned production run of the engine. */
export function createMillRun(t: TestApp, token: string, engineId: string): Promise<RunDetail> {
  return createRun(t, token, engineId, { purpose: 'production_lot', title: `Mill run ${randomUUID().slice(0, 6)}` });
}

/**
 * Test-only: puts a run straight into a state in the database. The start gate (checklists, qualifications,
 * alarms) has its own tests; these tests are about the mill's rule of when passes may be logged.
 */
export async function forceRunState(
  t: TestApp,
  runId: string,
  state: 'running' | 'stopped' | 'closed',
  startedMinutesAgo = 60,
): Promise<void> {
  await t.db.query(
    `UPDATE runs SET state = $2::varchar, started_at = now() - make_interval(mins => $3::int),
            stopped_at = CASE WHEN $2::varchar IN ('stopped', 'closed') THEN now() ELSE NULL END,
            closed_at = CASE WHEN $2::varchar = 'closed' THEN now() ELSE NULL END WHERE id = $1`,
    [runId, state, startedMinutesAgo],
  );
}
