import { create, all } from 'mathjs';
import {
  CalculationInputError,
  IndicatedPowerInput,
  brakeHorsepower,
  brakeTorqueLbfFt,
  computeIndicatedPower,
  effectiveAreaSqIn,
  endIndicatedHorsepower,
  mechanicalEfficiency,
  pistonAreaSqIn,
  receiverDropPsi,
  ropeBrakeEffectiveRadiusFt,
  workShareByCylinder,
} from './indicated-power.js';
import { idealMeanEffectivePressurePsi } from './ideal-card.js';
import { hpToKw } from './units.js';

const math = create(all);
const inches = (value: number, unit: string) => math.unit(value, unit).toNumber('inch');
const feet = (value: number, unit: string) => math.unit(value, unit).toNumber('ft');
const psi = (value: number, unit: string) => math.unit(value, unit).toNumber('psi');
const lbf = (value: number, unit: string) => math.unit(value, unit).toNumber('lbf');
/** Bore (in) whose full piston area is the given area (in²). */
const boreForAreaIn = (areaSqIn: number) => Math.sqrt((4 * areaSqIn) / Math.PI);

/** A single cylinder with the same MEP on both ends and no rods. */
function plainEngine(opts: { rpm: number; strokeIn: number; boreIn: number; mepPsi: number }): IndicatedPowerInput {
  return {
    rpm: opts.rpm,
    strokeIn: opts.strokeIn,
    cylinders: [
      {
        label: 'cylinder',
        boreIn: opts.boreIn,
        pistonRodIn: 0,
        tailRodIn: 0,
        cards: [
          { end: 'head', meanEffectivePressurePsi: opts.mepPsi },
          { end: 'crank', meanEffectivePressurePsi: opts.mepPsi },
        ],
      },
    ],
  };
}

describe('indicated horsepower, published examples', () => {
  it(
    '39.81 psi, 400 in² piston, 5½ ft stroke, 40 rpm → 212.32 IHP (C. P. Brooks, Cotton Manufacturing, section on ' +
      'engines, transcribed online)',
    () => {
      const result = computeIndicatedPower(plainEngine({ rpm: 40, strokeIn: 66, boreIn: boreForAreaIn(400), mepPsi: 39.81 }));
      expect(result.totalIndicatedHorsepower).toBeCloseTo(212.32, 2);
      expect(result.cylinders[0].ends[0].effectiveAreaSqIn).toBeCloseTo(400, 9);
      expect(endIndicatedHorsepower({ meanEffectivePressurePsi: 39.81, strokeIn: 66, effectiveAreaSqIn: 400, speedRpm: 40 })).toBeCloseTo(
        212.32 / 2,
        2,
      );
    },
  );

  it(
    'bore 300 mm, stroke 400 mm, 180 rpm, MEP 6.5 bar → 110.28 kW indicated (B. Agrawal & C. M. Agrawal, Basic ' +
      'Mechanical Engineering, Wiley India, ch. 13, Ex. 14, p. 294, seen in a worked-solutions reproduction)',
    () => {
      const result = computeIndicatedPower(
        plainEngine({ rpm: 180, strokeIn: inches(400, 'mm'), boreIn: inches(300, 'mm'), mepPsi: psi(6.5, 'bar') }),
      );
      // The worked reproduction takes π as 3.142; with exact π the figure is 110.27 kW, hence ±0.015.
      expect(Math.abs(result.totalIndicatedKilowatts - 110.28)).toBeLessThan(0.015);
    },
  );

  it(
    'same engine: brake drum 1.5 m effective diameter, net load 6.2 kN → 87.66 kW brake, mechanical efficiency 79.5 ' +
      '% (Agrawal & Agrawal, ch. 13, Ex. 14, p. 294)',
    () => {
      const indicated = computeIndicatedPower(
        plainEngine({ rpm: 180, strokeIn: inches(400, 'mm'), boreIn: inches(300, 'mm'), mepPsi: psi(6.5, 'bar') }),
      );
      const torqueLbfFt = brakeTorqueLbfFt({
        netBrakeLoadLbf: lbf(6.2, 'kN'),
        effectiveRadiusFt: ropeBrakeEffectiveRadiusFt({ drumDiameterFt: feet(1.5, 'm') }),
      });
      expect(math.unit(torqueLbfFt, 'lbf ft').toNumber('N m')).toBeCloseTo(4650, 6);
      const brakeHp = brakeHorsepower({ torqueLbfFt, speedRpm: 180 });
      expect(Math.abs(hpToKw(brakeHp) - 87.66)).toBeLessThan(0.015);
      const efficiency = mechanicalEfficiency({ brakeHorsepower: brakeHp, indicatedHorsepower: indicated.totalIndicatedHorsepower });
      expect(efficiency * 100).toBeCloseTo(79.5, 1);
    },
  );

  it(
    'bore 200 mm, stroke 300 mm, 200 rpm, 7 bar admission, cut-off 40 %, 0.38 bar exhaust, diagram factor 0.8 → ' +
      '25.06 kW (Agrawal & Agrawal, ch. 13, Ex. 9, p. 289)',
    () => {
      const ideal = idealMeanEffectivePressurePsi({
        admissionPressurePsia: psi(7, 'bar'),
        cutoffFraction: 0.4,
        backPressurePsia: psi(0.38, 'bar'),
      });
      const result = computeIndicatedPower(
        plainEngine({ rpm: 200, strokeIn: inches(300, 'mm'), boreIn: inches(200, 'mm'), mepPsi: 0.8 * ideal }),
      );
      expect(result.totalIndicatedKilowatts).toBeCloseTo(25.06, 2);
    },
  );

  it(
    'rope brake: drum 900 mm, rope 50 mm, 105 kg dead load, 7 kg spring balance, 240 rpm → 456.66 N·m, 11.48 kW ' +
      '(Agrawal & Agrawal, ch. 13, Ex. 13, p. 293)',
    () => {
      const torqueLbfFt = brakeTorqueLbfFt({
        netBrakeLoadLbf: lbf((105 - 7) * 9.81, 'N'),
        effectiveRadiusFt: ropeBrakeEffectiveRadiusFt({ drumDiameterFt: feet(900, 'mm'), ropeDiameterFt: feet(50, 'mm') }),
      });
      expect(math.unit(torqueLbfFt, 'lbf ft').toNumber('N m')).toBeCloseTo(456.66, 2);
      expect(hpToKw(brakeHorsepower({ torqueLbfFt, speedRpm: 240 }))).toBeCloseTo(11.48, 2);
    },
  );

  // "Indicated horse-power for each pound average pressure … for different diameters and speeds of
  // pistons", table in Bepler's Handy Manual of Knowledge, section "Mechanical Horse Power" (transcribed
  // online). Piston speed = 2 × stroke × rpm. The printed figures scatter by up to about 0.4 % about
  // P·A·S/33,000 (truncation and what look like slips, e.g. 20 in at 600 ft/min), so this is a coarse
  // check at 0.5 %; the precise checks are the worked examples above.
  it.each([
    [10, 300, 0.714],
    [16, 500, 3.045],
    [20, 300, 2.855],
    [8, 600, 0.912],
    [12, 400, 1.366],
    [20, 600, 5.731],
  ])(
    '%p in cylinder at %p ft/min piston speed: %p IHP per psi (Bepler, Handy Manual of Knowledge, horse-power table)',
    (boreIn, speedFtPerMin, hpPerPsi) => {
      const strokeIn = 24;
      const rpm = speedFtPerMin / (2 * (strokeIn / 12));
      const result = computeIndicatedPower(plainEngine({ rpm, strokeIn, boreIn, mepPsi: 1 }));
      expect(Math.abs(result.totalIndicatedHorsepower - hpPerPsi) / hpPerPsi).toBeLessThan(0.005);
    },
  );
});

describe('effective areas and the two ends', () => {
  it(
    'averaging the ends gives (2A − a)/2 for a rod on one side only (Machinery’s Reference Series No. 70, Steam ' +
      'Engines, section on indicated horsepower)',
    () => {
      const A = pistonAreaSqIn(24);
      const a = pistonAreaSqIn(5.5);
      const result = computeIndicatedPower({
        rpm: 75,
        strokeIn: 48,
        cylinders: [
          {
            label: 'HP',
            boreIn: 24,
            pistonRodIn: 5.5,
            tailRodIn: 0,
            cards: [
              { end: 'head', meanEffectivePressurePsi: 40 },
              { end: 'crank', meanEffectivePressurePsi: 40 },
            ],
          },
        ],
      });
      const [head, crank] = result.cylinders[0].ends;
      expect(head.effectiveAreaSqIn).toBeCloseTo(A, 9);
      expect(crank.effectiveAreaSqIn).toBeCloseTo(A - a, 9);
      // P · L · (2A − a)/2 · 2N / 33,000
      expect(result.totalIndicatedHorsepower).toBeCloseTo((40 * 4 * ((2 * A - a) / 2) * 150) / 33000, 9);
    },
  );

  it('a tail rod reduces the head-end area; the crank end loses the piston rod (common practice, no source)', () => {
    expect(effectiveAreaSqIn(44, 4)).toBeCloseTo((Math.PI / 4) * (44 * 44 - 4 * 4), 9);
    const result = computeIndicatedPower({
      rpm: 60,
      strokeIn: 48,
      cylinders: [
        {
          label: 'LP',
          boreIn: 44,
          pistonRodIn: 5.5,
          tailRodIn: 4,
          cards: [
            { end: 'crank', meanEffectivePressurePsi: 10 },
            { end: 'head', meanEffectivePressurePsi: 10 },
          ],
        },
      ],
    });
    const byEnd = Object.fromEntries(result.cylinders[0].ends.map((e) => [e.end, e.effectiveAreaSqIn]));
    expect(byEnd.head).toBeCloseTo((Math.PI / 4) * (44 ** 2 - 4 ** 2), 9);
    expect(byEnd.crank).toBeCloseTo((Math.PI / 4) * (44 ** 2 - 5.5 ** 2), 9);
  });

  it(
    'a card by planimeter, by ordinates and by MEP give the same power when they agree (Machinery’s 2.6 in² / 3.6 in ' + '/ 60-lb card)',
    () => {
      const base = { rpm: 70, strokeIn: 36 };
      const cylinder = { label: 'c', boreIn: 16, pistonRodIn: 3, tailRodIn: 0 };
      const byArea = computeIndicatedPower({
        ...base,
        cylinders: [{ ...cylinder, cards: [{ end: 'head', areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 }] }],
      });
      const byOrdinates = computeIndicatedPower({
        ...base,
        cylinders: [{ ...cylinder, cards: [{ end: 'head', ordinatesIn: [2.6 / 3.6, 2.6 / 3.6], springPsiPerIn: 60 }] }],
      });
      const byMep = computeIndicatedPower({
        ...base,
        cylinders: [{ ...cylinder, cards: [{ end: 'head', meanEffectivePressurePsi: (2.6 / 3.6) * 60 }] }],
      });
      expect(byArea.cylinders[0].ends[0].meanEffectivePressurePsi).toBeCloseTo(43.3, 1);
      expect(byArea.totalIndicatedHorsepower).toBeCloseTo(byMep.totalIndicatedHorsepower, 9);
      expect(byOrdinates.totalIndicatedHorsepower).toBeCloseTo(byMep.totalIndicatedHorsepower, 9);
    },
  );
});

describe('compound engine referred to the low-pressure cylinder', () => {
  // Invented tandem compound: HP 24 in, LP 44 in (4 in tail rod), 5.5 in rods, 48 in stroke, 75 rpm.
  const input: IndicatedPowerInput = {
    rpm: 75,
    strokeIn: 48,
    cylinders: [
      {
        label: 'HP',
        boreIn: 24,
        pistonRodIn: 5.5,
        tailRodIn: 0,
        cards: [
          { end: 'head', meanEffectivePressurePsi: 42 },
          { end: 'crank', meanEffectivePressurePsi: 42 },
        ],
      },
      {
        label: 'LP',
        boreIn: 44,
        pistonRodIn: 5.5,
        tailRodIn: 4,
        cards: [
          { end: 'head', meanEffectivePressurePsi: 11 },
          { end: 'crank', meanEffectivePressurePsi: 11 },
        ],
      },
    ],
  };

  it('p_ref = p_LP + p_HP · Ā_HP/Ā_LP with equal MEP at both ends and a common stroke (common practice, no source)', () => {
    const meanHp = (Math.PI / 4) * (24 ** 2 - 5.5 ** 2 / 2);
    const meanLp = (Math.PI / 4) * (44 ** 2 - (5.5 ** 2 + 4 ** 2) / 2);
    const result = computeIndicatedPower(input);
    expect(result.referredMeanEffectivePressurePsi).toBeCloseTo(11 + (42 * meanHp) / meanLp, 9);
  });

  it('IHP from the referred MEP on the LP cylinder equals the sum of the cylinders (definition in REFERENCES: compound engines)', () => {
    const result = computeIndicatedPower(input);
    const meanLp = (Math.PI / 4) * (44 ** 2 - (5.5 ** 2 + 4 ** 2) / 2);
    const fromReferred = (result.referredMeanEffectivePressurePsi! * (48 / 12) * meanLp * 2 * 75) / 33000;
    const sum = result.cylinders.reduce((s, c) => s + c.indicatedHorsepower, 0);
    expect(fromReferred).toBeCloseTo(sum, 9);
    expect(result.totalIndicatedHorsepower).toBeCloseTo(sum, 9);
    expect(result.totalIndicatedKilowatts).toBeCloseTo(math.unit(sum, 'hp').toNumber('kW'), 6);
  });

  it('shares of the work add to one and follow each cylinder’s IHP', () => {
    const result = computeIndicatedPower(input);
    const shares = workShareByCylinder(result.cylinders);
    expect(shares.reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 12);
    expect(shares[0].share).toBeCloseTo(result.cylinders[0].indicatedHorsepower / result.totalIndicatedHorsepower, 12);
  });

  it('receiver drop is receiver pressure less LP admission pressure', () => {
    expect(receiverDropPsi({ receiverPressurePsi: 24, lpAdmissionPressurePsi: 21.5 })).toBeCloseTo(2.5, 12);
  });
});

describe('input errors name the field', () => {
  const good = (): IndicatedPowerInput => ({
    rpm: 75,
    strokeIn: 48,
    cylinders: [
      {
        label: 'HP',
        boreIn: 24,
        pistonRodIn: 5.5,
        tailRodIn: 0,
        cards: [
          { end: 'head', meanEffectivePressurePsi: 42 },
          { end: 'crank', areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 },
        ],
      },
    ],
  });

  function fieldPathOf(mutate: (input: IndicatedPowerInput) => void): string {
    const input = good();
    mutate(input);
    try {
      computeIndicatedPower(input);
    } catch (error) {
      expect(error).toBeInstanceOf(CalculationInputError);
      return (error as CalculationInputError).fieldPath ?? '';
    }
    throw new Error('expected a CalculationInputError');
  }

  it('accepts the good input', () => {
    expect(() => computeIndicatedPower(good())).not.toThrow();
  });

  it('a card giving two ways', () => {
    expect(fieldPathOf((i) => (i.cylinders[0].cards[1].meanEffectivePressurePsi = 40))).toBe('cylinders[0].cards[1].areaSqIn');
  });

  it('a card giving none', () => {
    expect(fieldPathOf((i) => (i.cylinders[0].cards[0] = { end: 'head' }))).toBe('cylinders[0].cards[0]');
  });

  it('an area card without its spring', () => {
    expect(fieldPathOf((i) => delete i.cylinders[0].cards[1].springPsiPerIn)).toBe('cylinders[0].cards[1].springPsiPerIn');
  });

  it('ordinates without a spring, or only one ordinate', () => {
    expect(fieldPathOf((i) => (i.cylinders[0].cards[1] = { end: 'crank', ordinatesIn: [1, 1] }))).toBe(
      'cylinders[0].cards[1].springPsiPerIn',
    );
    expect(fieldPathOf((i) => (i.cylinders[0].cards[1] = { end: 'crank', ordinatesIn: [1], springPsiPerIn: 60 }))).toBe(
      'cylinders[0].cards[1].ordinatesIn',
    );
  });

  it('non-positive dimensions and speed', () => {
    expect(fieldPathOf((i) => (i.rpm = 0))).toBe('rpm');
    expect(fieldPathOf((i) => (i.strokeIn = -48))).toBe('strokeIn');
    expect(fieldPathOf((i) => (i.cylinders[0].boreIn = 0))).toBe('cylinders[0].boreIn');
    expect(fieldPathOf((i) => (i.cylinders[0].strokeIn = 0))).toBe('cylinders[0].strokeIn');
    expect(fieldPathOf((i) => (i.cylinders[0].cards[1].lengthIn = 0))).toBe('cylinders[0].cards[1].lengthIn');
    expect(fieldPathOf((i) => (i.cylinders[0].pistonRodIn = -1))).toBe('cylinders[0].pistonRodIn');
  });

  it('a rod not smaller than the bore', () => {
    expect(fieldPathOf((i) => (i.cylinders[0].pistonRodIn = 24))).toBe('cylinders[0].pistonRodIn');
    expect(fieldPathOf((i) => (i.cylinders[0].tailRodIn = 30))).toBe('cylinders[0].tailRodIn');
  });

  it('two cards for the same end', () => {
    expect(fieldPathOf((i) => (i.cylinders[0].cards[1].end = 'head'))).toBe('cylinders[0].cards[1].end');
  });

  it('a cylinder without a label', () => {
    expect(fieldPathOf((i) => delete (i.cylinders[0] as Partial<IndicatedPowerInput['cylinders'][0]>).label)).toBe('cylinders[0].label');
  });

  it('no cylinders, or a cylinder without cards', () => {
    expect(fieldPathOf((i) => (i.cylinders = []))).toBe('cylinders');
    expect(fieldPathOf((i) => (i.cylinders[0].cards = []))).toBe('cylinders[0].cards');
  });

  it('the error is also a RangeError and carries the path in its message', () => {
    const error = new CalculationInputError('cylinders[0].boreIn', 'must be greater than zero');
    expect(error).toBeInstanceOf(RangeError);
    expect(error.message).toBe('cylinders[0].boreIn: must be greater than zero');
    expect(error.name).toBe('CalculationInputError');
  });

  it('mechanical efficiency refuses a zero IHP', () => {
    expect(() => mechanicalEfficiency({ brakeHorsepower: 10, indicatedHorsepower: 0 })).toThrow(RangeError);
  });

  it('mechanical efficiency above 1 is an error in the inputs, never a figure (common practice, no source)', () => {
    expect(() => mechanicalEfficiency({ brakeHorsepower: 410, indicatedHorsepower: 400 })).toThrow(CalculationInputError);
    expect(() => mechanicalEfficiency({ brakeHorsepower: 410, indicatedHorsepower: 400 })).toThrow(/above 1 is an error in the inputs/);
    expect(mechanicalEfficiency({ brakeHorsepower: 400, indicatedHorsepower: 400 })).toBe(1);
  });
});

describe('an incomplete set says so', () => {
  const twoCylinders = (): IndicatedPowerInput => ({
    rpm: 75,
    strokeIn: 48,
    cylinders: [
      {
        label: 'HP',
        boreIn: 24,
        pistonRodIn: 5.5,
        tailRodIn: 0,
        cards: [
          { end: 'head', meanEffectivePressurePsi: 42 },
          { end: 'crank', meanEffectivePressurePsi: 42 },
        ],
      },
      { label: 'LP', boreIn: 44, pistonRodIn: 5.5, tailRodIn: 4, cards: [{ end: 'head', meanEffectivePressurePsi: 11 }] },
    ],
  });

  it('a missing low-pressure end: complete false, the end listed, no referred MEP, with the reason', () => {
    const r = computeIndicatedPower(twoCylinders());
    expect(r.complete).toBe(false);
    expect(r.missingEnds).toEqual([{ cylinderLabel: 'LP', end: 'crank' }]);
    expect(r.referredMeanEffectivePressurePsi).toBeNull();
    expect(r.referredMeanEffectivePressureMissing).toMatch(/missing: LP crank end/);
    // the total is still the sum of the cards present
    expect(r.totalIndicatedHorsepower).toBeCloseTo(r.cylinders[0].indicatedHorsepower + r.cylinders[1].indicatedHorsepower, 12);
  });

  it('a set with every end is complete and has its referred MEP', () => {
    const input = twoCylinders();
    input.cylinders[1].cards.push({ end: 'crank', meanEffectivePressurePsi: 11 });
    const r = computeIndicatedPower(input);
    expect(r.complete).toBe(true);
    expect(r.missingEnds).toEqual([]);
    expect(r.referredMeanEffectivePressurePsi).not.toBeNull();
    expect(r.referredMeanEffectivePressureMissing).toBeNull();
  });
});
