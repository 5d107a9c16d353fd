import type { EngineDetail, RunDetail, RunSummary } from '@crankjournal/shared-types';

/** A run as the list answers it (invented figures; override what a test is about). */
export function buildRunSummary(over: Partial<RunSummary> = {}): RunSummary {
  return {
    id: 'run-1',
    engineId: 'eng-1',
    engineName: 'No. 2 engine',
    purpose: 'demonstration',
    state: 'planned',
    title: 'Winter open day',
    plannedFor: null,
    startedAt: null,
    stoppedAt: null,
    closedAt: null,
    runningSeconds: 0,
    revolutions: 0,
    openAlarms: 0,
    ...over,
  };
}

/** A run as `GET /runs/:id` answers it. */
export function buildRun(over: Partial<RunDetail> = {}): RunDetail {
  return {
    ...buildRunSummary(),
    notes: '',
    crew: [],
    countersignedBy: null,
    countersignedByName: null,
    countersignedAt: null,
    abandonedReason: null,
    history: [],
    peaks: [],
    createdAt: '2026-12-01T08:00:00Z',
    ...over,
  };
}

/** An engine as `GET /engines/:id` answers it: no parts unless the test gives them. */
export function buildEngine(over: Partial<EngineDetail> = {}): EngineDetail {
  return {
    id: 'e1',
    name: 'No. 2 engine',
    builder: 'Demo builder',
    yearBuilt: '1911',
    type: 'simple',
    ratedSpeedRpm: 75,
    overspeedRpm: 82,
    mawpPsig: 150,
    preLubeFreshnessMinutes: 30,
    runningHours: 0,
    revolutions: 0,
    activeRunId: null,
    notes: '',
    escalateAfterMinutes: 5,
    callList: [],
    flywheelMassLb: null,
    flywheelRadiusOfGyrationFt: null,
    rotatingWeightLb: null,
    cylinders: [],
    lubricationPoints: [],
    bearings: [],
    measurementPoints: [],
    ...over,
  };
}
