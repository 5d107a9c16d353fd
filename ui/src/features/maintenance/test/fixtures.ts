import type { BearingHistory, InspectionDto, InspectionPlanDto, PlanDue } from '@crankjournal/shared-types';

const due = (status: PlanDue['status'], remaining: number, dueDate: string): PlanDue => ({
  status,
  governing: 'calendar_days',
  dueDate,
  criteria: [{ criterion: 'calendar_days', interval: 365, used: 365 - remaining, remaining, fractionRemaining: remaining / 365, estimatedDueDate: dueDate, status }],
});

export function plan(id: string, title: string, status: PlanDue['status'], remaining: number): InspectionPlanDto {
  return {
    id,
    engineId: 'e1',
    engineName: 'No. 2 engine',
    componentKind: 'bearing',
    bearingId: 'b1',
    bearingLabel: 'Main bearing 1',
    componentLabel: 'Main bearing 1',
    title,
    inspectionKind: 'bearing_clearance',
    intervalRunHours: 500,
    intervalRevolutions: null,
    intervalDays: 365,
    lastDoneAt: '2025-10-18T10:00:00.000Z',
    lastDoneRunHours: 41250,
    lastDoneRevolutions: 185_600_000,
    lastResetByWorkRecordId: null,
    lastResetByInspectionId: null,
    hazards: ['lockout'],
    notes: '',
    active: true,
    due: due(status, remaining, '2026-10-18T10:00:00.000Z'),
  };
}

/** A history of three runs, the last above its band. Figures invented for the test. */
export const HISTORY: BearingHistory = {
  bearing: { id: 'b2', label: 'Main bearing 2 (flywheel side)', kind: 'main', engineId: 'e1', engineName: 'No. 2 engine', journalDiameterIn: 16, journalLengthIn: 26, radialClearanceIn: 0.008, loadSharePercent: 50, points: [{ id: 'p2', code: 'MB2-T', unit: 'degF' }] },
  loadMeasure: 'speed_rpm',
  loadMeasureNote: 'Load is the run’s mean speed.',
  ruleText: 'A run is flagged as drift when its rise above ambient is more than 5 °F above the top of the band at its mean speed.',
  settings: { bandK: 2, marginF: 5, minLoadSpread: 5 },
  runs: [
    { runId: 'r1', title: 'Spring opening', startedAt: '2026-05-16T10:30:00.000Z', state: 'closed', runningHours: 3, pointCode: 'MB2-T', unit: 'degF', peakTemperature: 99.7, meanTemperature: 90.5, readings: 13, ambientMean: 60, riseAtPeakF: 39.7, meanSpeedRpm: 74.5, indicatedHp: null, load: 74.5, alarms: [], drift: null, driftNote: 'First run of this bearing: nothing earlier to compare with.' },
    { runId: 'r2', title: 'Summer open day', startedAt: '2026-06-13T10:00:00.000Z', state: 'closed', runningHours: 4, pointCode: 'MB2-T', unit: 'degF', peakTemperature: 112.8, meanTemperature: 105, readings: 17, ambientMean: 72.1, riseAtPeakF: 40.7, meanSpeedRpm: 74.6, indicatedHp: null, load: 74.6, alarms: [], drift: { flagged: false, limitF: 44.7, expectedRiseF: 39.7, excessF: -4, extrapolated: false, historyRuns: 1, bandKind: 'mean' }, driftNote: null },
    {
      runId: 'r3',
      title: 'August demonstration',
      startedAt: '2026-08-08T10:30:00.000Z',
      state: 'closed',
      runningHours: 3.25,
      pointCode: 'MB2-T',
      unit: 'degF',
      peakTemperature: 159.3,
      meanTemperature: 131.4,
      readings: 24,
      ambientMean: 81.4,
      riseAtPeakF: 77.9,
      meanSpeedRpm: 74.5,
      indicatedHp: null,
      load: 74.5,
      alarms: [{ id: 'a1', kind: 'high_high', priority: 'high_high', raisedAt: '2026-08-08T13:00:00.000Z', message: 'MB2 high-high', value: 146 }],
      drift: { flagged: true, limitF: 46.4, expectedRiseF: 40.2, excessF: 31.5, extrapolated: false, historyRuns: 2, bandKind: 'mean' },
      driftNote: null,
    },
  ],
  band: { kind: 'mean', interceptF: 40.2, slopeFPerLoad: 0, residualSdF: 0.5, k: 2, marginF: 5, pointCount: 2, loadMin: 74.5, loadMax: 74.6, line: [{ load: 74, expectedF: 40.2, lowerF: 39.2, upperF: 41.2, limitF: 46.2 }, { load: 75, expectedF: 40.2, lowerF: 39.2, upperF: 41.2, limitF: 46.2 }] },
  inspections: [{ id: 'i1', engineId: 'e1', bearingId: 'b2', bearingLabel: 'Main bearing 2 (flywheel side)', planId: null, kind: 'bearing_clearance', title: 'Main bearing 2 after the August hot run', inspectedAt: '2026-08-20T09:00:00.000Z', measurementCount: 5, outOfToleranceCount: 3, attachmentCount: 1, findings: 'Scored.' }],
  workRecords: [],
  timeline: [
    { at: '2026-08-08T10:30:00.000Z', type: 'run', id: 'r3', title: 'August demonstration', detail: 'Peak 159 °F, rise 78 °F — drift', attention: true },
    { at: '2026-08-20T09:00:00.000Z', type: 'inspection', id: 'i1', title: 'Main bearing 2 after the August hot run', detail: '3 of 5 measurements out of tolerance', attention: true },
  ],
};

export const INSPECTION: InspectionDto = {
  ...HISTORY.inspections[0],
  engineName: 'No. 2 engine',
  planTitle: null,
  completesPlan: false,
  inspectorName: 'A. Tester',
  recordedByName: 'A. Tester',
  runHoursAt: 41265.3,
  revolutionsAt: 1,
  followUpActions: [{ text: 'Scrape the top half', workRecordId: null }],
  measurements: [
    { id: 'm1', kind: 'clearance_lead_wire', label: 'Top, centre', crankAngleDeg: null, value: 0.027, unit: 'in', nominal: 0.016, toleranceMin: 0.012, toleranceMax: 0.02, note: '', status: 'above', outOfTolerance: true, excess: 0.007 },
    { id: 'm2', kind: 'clearance_feeler', label: 'Side', crankAngleDeg: null, value: 0.009, unit: 'in', nominal: null, toleranceMin: 0.004, toleranceMax: 0.012, note: '', status: 'within', outOfTolerance: false, excess: 0 },
  ],
  webDeflection: null,
  attachments: [],
  promptedByAlarmId: null,
  promptedByRunId: 'r3',
  promptedByRunTitle: 'August demonstration',
  workRecords: [],
  createdAt: '2026-08-20T10:00:00.000Z',
};
