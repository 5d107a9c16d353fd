import { STANDARD_CRANK_ANGLES } from '@crankjournal/shared-types';
import { PRESETS, toInspectionRequest } from './NewInspection.page';

describe('recording an inspection', () => {
  it('the web-deflection set has a reading at each standard crank angle', () => {
    const rows = PRESETS.find((p) => p.key === 'web')!.rows();
    expect(rows.map((r) => r.crankAngleDeg)).toEqual(STANDARD_CRANK_ANGLES.map((a) => a.deg));
    expect(rows.every((r) => r.kind === 'web_deflection')).toBe(true);
  });

  it('sends the figures as typed, empty ends of a range as null, blank follow-ups left out, and no plan completion without a plan', () => {
    const req = toInspectionRequest({
      engineId: 'e1',
      bearingId: '',
      planId: '',
      completesPlan: true,
      kind: 'bearing_clearance',
      title: 'Check',
      inspectedAt: '2026-08-20T09:00',
      inspectorName: 'A',
      findings: 'F',
      followUps: ['Scrape', ' '],
      rows: [
        {
          kind: 'clearance_lead_wire',
          label: 'Top',
          crankAngleDeg: '',
          value: 0.027,
          unit: 'in',
          nominal: 0.016,
          toleranceMin: 0.012,
          toleranceMax: '',
        },
      ],
    });
    expect(req.bearingId).toBeNull();
    expect(req.planId).toBeNull();
    expect(req.completesPlan).toBe(false);
    expect(req.followUpActions).toEqual([{ text: 'Scrape' }]);
    expect(req.measurements).toEqual([
      {
        kind: 'clearance_lead_wire',
        label: 'Top',
        crankAngleDeg: null,
        value: 0.027,
        unit: 'in',
        nominal: 0.016,
        toleranceMin: 0.012,
        toleranceMax: null,
      },
    ]);
    expect(new Date(req.inspectedAt).getTime()).toBe(new Date('2026-08-20T09:00').getTime());
  });
});
