import { toleranceStatus, webDeflectionPairs, webDeflectionSpread } from './tolerance.js';

// The acceptance rule is the product's own (a limit is the last acceptable figure; common practice, no source).
describe('measurement against tolerance', () => {
  it('a lead-wire clearance of 0.026 in against 0.012–0.020 in is above by 0.006 in', () => {
    const r = toleranceStatus(0.026, 0.012, 0.02);
    expect(r.status).toBe('above');
    expect(r.outOfTolerance).toBe(true);
    expect(r.excess).toBeCloseTo(0.006, 12);
  });
  it('below the minimum is out too; on a limit is within', () => {
    expect(toleranceStatus(0.01, 0.012, 0.02)).toMatchObject({ status: 'below', outOfTolerance: true });
    expect(toleranceStatus(0.012, 0.012, 0.02)).toMatchObject({ status: 'within', outOfTolerance: false, excess: 0 });
    expect(toleranceStatus(0.02, 0.012, 0.02).outOfTolerance).toBe(false);
  });
  it('open-ended ranges and no range', () => {
    expect(toleranceStatus(0.003, null, 0.002).status).toBe('above');
    expect(toleranceStatus(-5, -4, undefined).status).toBe('below');
    expect(toleranceStatus(1, null, null)).toMatchObject({ status: 'no_tolerance', outOfTolerance: false });
  });
  it('refuses a range upside down and a value that is not a number', () => {
    expect(() => toleranceStatus(1, 2, 1)).toThrow(RangeError);
    expect(() => toleranceStatus(Number.NaN, 0, 1)).toThrow(RangeError);
  });
});

describe('crank web deflection spread', () => {
  it('is the largest minus the smallest reading of one unit', () => {
    const s = webDeflectionSpread([
      { kind: 'web_deflection', value: 0, unit: 'in' },
      { kind: 'web_deflection', value: 0.0005, unit: 'in' },
      { kind: 'web_deflection', value: -0.001, unit: 'in' },
      { kind: 'web_deflection', value: 0.02, unit: 'mm' },
      { kind: 'shaft_level', value: 0.5, unit: 'in' },
    ]);
    expect(s!.spread).toBeCloseTo(0.0015, 12);
    expect(s!.unit).toBe('in');
    expect(s!.readings).toBe(3);
  });
  it('needs two readings', () => {
    expect(webDeflectionSpread([{ kind: 'web_deflection', value: 0, unit: 'in' }])).toBeNull();
  });
});

describe('crank web deflection judged pair by pair (common practice, no source)', () => {
  it('vertical and horizontal pairs each against their own limit: a spread over one limit is not a fault of the other pair', () => {
    const pairs = webDeflectionPairs([
      { crankAngleDeg: 0, value: 0, toleranceMax: 0.004 },
      { crankAngleDeg: 90, value: 0.0015, toleranceMax: 0.002 },
      { crankAngleDeg: 165, value: 0.003, toleranceMax: 0.004 },
      { crankAngleDeg: 195, value: 0.0035, toleranceMax: 0.004 },
      { crankAngleDeg: 270, value: -0.001, toleranceMax: 0.002 },
    ]);
    // vertical: |0.0015 − (−0.001)| = 0.0025 > 0.002; horizontal: |0 − (0.003 + 0.0035)/2| = 0.00325 ≤ 0.004
    expect(pairs).toEqual([
      { pair: 'vertical', deflection: expect.closeTo(0.0025, 12), limit: 0.002, status: 'above' },
      { pair: 'horizontal', deflection: expect.closeTo(0.00325, 12), limit: 0.004, status: 'within' },
    ]);
  });

  it('a pair without both readings is left out; no limit given says so', () => {
    expect(
      webDeflectionPairs([
        { crankAngleDeg: 90, value: 0.001 },
        { crankAngleDeg: 270, value: 0 },
        { crankAngleDeg: 0, value: 0 },
      ]),
    ).toEqual([{ pair: 'vertical', deflection: 0.001, limit: null, status: 'no_tolerance' }]);
  });
});
