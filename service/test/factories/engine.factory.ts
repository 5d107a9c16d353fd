import { randomUUID } from 'node:crypto';
import type { EngineDetail, EngineWriteRequest, RunDetail } from '@crankjournal/shared-types';
import { type TestApp } from '../utils/test-app.js';
import { signedIn, type Who } from '../utils/signed-in.js';

/** A small engine with one of each kind of point the alarm rules care about. Test data, not demo data. */
export function engineBody(name = `Test engine ${randomUUID().slice(0, 8)}`): EngineWriteRequest {
  return {
    name,
    builder: 'test',
    yearBuilt: '1900',
    type: 'simple',
    ratedSpeedRpm: 75,
    overspeedRpm: 82,
    mawpPsig: 150,
    preLubeFreshnessMinutes: 30,
    cylinders: [{ label: 'C1', role: 'single', boreIn: 20, strokeIn: 36, pistonRodIn: 4, tailRodIn: 0, clearancePercent: 6 }],
    lubricationPoints: [{ label: 'Main line', kind: 'pressure_line', oilGrade: 'ISO VG 150' }],
    bearings: [
      {
        label: 'Main',
        kind: 'main',
        journalDiameterIn: 12,
        journalLengthIn: 18,
        loadSharePercent: 100,
        lubricationPointLabel: 'Main line',
      },
    ],
    measurementPoints: [
      {
        code: 'THR',
        label: 'Throttle',
        kind: 'throttle_pressure',
        unit: 'psig',
        sequence: 1,
        normalLow: 100,
        normalHigh: 140,
        highLimit: 145,
        highHighLimit: 148,
        deadband: 2,
      },
      { code: 'SPD', label: 'Speed', kind: 'speed', unit: 'rpm', sequence: 2, normalLow: 70, normalHigh: 76, highLimit: 78, deadband: 0.5 },
      {
        code: 'MB',
        label: 'Main bearing',
        kind: 'bearing_temperature',
        unit: 'degF',
        sequence: 3,
        normalLow: 60,
        normalHigh: 115,
        highLimit: 130,
        highHighLimit: 145,
        maxRiseRatePerMin: 2,
        maxRiseAboveAmbient: 60,
        deadband: 2,
        bearingLabel: 'Main',
      },
      { code: 'AMB', label: 'Ambient', kind: 'ambient_temperature', unit: 'degF', sequence: 4 },
    ],
  };
}

/** Creates an engine through the API as `chief` (a chief engineer's session or token). */
export async function createEngine(t: TestApp, chief: Who, body: EngineWriteRequest = engineBody()): Promise<EngineDetail> {
  const res = await signedIn(t, chief).post('/api/engines').send(body);
  if (res.status !== 201) throw new Error(`engine not created: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as EngineDetail;
}

export interface RunOptions {
  purpose?: string;
  title?: string;
}

/** A planned run of the engine, created through the API as `who`. */
export async function createRun(t: TestApp, who: Who, engineId: string, opts: RunOptions = {}): Promise<RunDetail> {
  const res = await signedIn(t, who)
    .post('/api/runs')
    .send({ engineId, purpose: opts.purpose ?? 'test', title: opts.title ?? `Run ${randomUUID().slice(0, 6)}` });
  if (res.status !== 201) throw new Error(`run not created: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as RunDetail;
}

/** A run in `preparing` (readings are taken from preparation on). */
export async function createPreparingRun(t: TestApp, who: Who, engineId: string, opts: RunOptions = {}): Promise<RunDetail> {
  const run = await createRun(t, who, engineId, opts);
  const prep = await signedIn(t, who).post(`/api/runs/${run.id}/transitions`).send({ to: 'preparing' });
  if (prep.status !== 200) throw new Error(`run not preparing: ${prep.status} ${JSON.stringify(prep.body)}`);
  return prep.body as RunDetail;
}

export const reading = (pointId: string, value: number, takenAt = new Date()) => ({
  clientId: randomUUID(),
  pointId,
  value,
  takenAt: takenAt.toISOString(),
});
