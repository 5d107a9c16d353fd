import { buildEngine } from '../../../test-utils/builders';
import { fromEngine, toWriteRequest, validateEngine } from './engine-form';

const engine = buildEngine({
  type: 'tandem_compound',
  runningHours: 10,
  revolutions: 45000,
  cylinders: [{ id: 'c1', label: 'HP', role: 'high', boreIn: 24, strokeIn: 48, pistonRodIn: 5.5, tailRodIn: 0, clearancePercent: 8 }],
  lubricationPoints: [{ id: 'l1', label: 'MB1 line', kind: 'pressure_line', oilGrade: 'VG 150' }],
  bearings: [
    {
      id: 'b1',
      label: 'MB1',
      kind: 'main',
      journalDiameterIn: 16,
      journalLengthIn: 26,
      loadSharePercent: 50,
      radialClearanceIn: null,
      lubricationPointId: 'l1',
    },
  ],
  measurementPoints: [
    {
      id: 'p1',
      code: 'MB1-T',
      label: 'Main bearing 1',
      kind: 'bearing_temperature',
      unit: 'degF',
      sequence: 2,
      highLimit: 130,
      highHighLimit: 145,
      bearingId: 'b1',
    },
    { id: 'p2', code: 'THR-P', label: 'Throttle', kind: 'throttle_pressure', unit: 'psig', sequence: 1, cylinderId: 'c1' },
  ],
});

describe('engine form ↔ EngineWriteRequest', () => {
  it('keeps part ids, refers to parts by label and leaves empty limits as null', () => {
    const req = toWriteRequest(fromEngine(engine));
    expect(req.cylinders[0]).toMatchObject({ id: 'c1', label: 'HP', boreIn: 24 });
    expect(req.bearings[0]).toMatchObject({ id: 'b1', lubricationPointLabel: 'MB1 line', radialClearanceIn: null });
    const [first, second] = req.measurementPoints;
    expect(first).toMatchObject({ id: 'p2', code: 'THR-P', cylinderLabel: 'HP', bearingLabel: null, highLimit: null });
    expect(second).toMatchObject({ id: 'p1', bearingLabel: 'MB1', highLimit: 130, highHighLimit: 145, lowLimit: null });
  });

  it('leaves a retired point out of the request', () => {
    const v = fromEngine(engine);
    v.measurementPoints[1]!.retire = true;
    expect(toWriteRequest(v).measurementPoints.map((p) => p.id)).toEqual(['p2']);
  });

  it('flags a high-high limit below the high limit, a repeated code, and an overspeed not above rated speed', () => {
    const v = fromEngine(engine);
    v.measurementPoints[1]!.highHighLimit = 120;
    v.measurementPoints[0]!.code = 'mb1-t';
    v.overspeedRpm = 75;
    const errors = validateEngine(v);
    expect(errors['measurementPoints.1.highHighLimit']).toBe('Below the high limit');
    expect(errors['measurementPoints.0.code']).toBe('Used twice');
    expect(errors.overspeedRpm).toBe('Must be above the rated speed');
  });

  it('finds nothing to flag in a complete engine', () => {
    expect(validateEngine(fromEngine(engine))).toEqual({});
  });
});
