import { create, all } from 'mathjs';
import type { CardSetCylinder } from '@crankjournal/shared-types';
import { CalculationInputError } from '../../calculations/indicated-power.js';
import { PSI_PER_INCH_OF_MERCURY } from '../../calculations/vacuum.js';
import { STANDARD_ATMOSPHERE_PSI, psiaToPsig } from '../../calculations/units.js';
import { calibrateCardTrace, computeCardSetResults, evaluateCard, type CardSetResultsInput, type ResultCard } from './card-set-results.js';

const math = create(all);
const psi = (value: number, unit: string) => math.unit(value, unit).toNumber('psi');
const inches = (value: number, unit: string) => math.unit(value, unit).toNumber('inch');
const boreForAreaIn = (areaSqIn: number) => Math.sqrt((4 * areaSqIn) / Math.PI);

const cylinder = (over: Partial<CardSetCylinder> = {}): CardSetCylinder => ({
  cylinderId: 'c1',
  label: 'Cyl',
  role: 'single',
  boreIn: 20,
  strokeIn: 48,
  pistonRodIn: 0,
  tailRodIn: 0,
  clearancePercent: 0,
  ...over,
});
const card = (over: Partial<ResultCard>): ResultCard => ({
  id: `${over.cylinderId ?? 'c1'}-${over.end ?? 'head'}`,
  cylinderId: 'c1',
  end: 'head',
  meanEffectivePressurePsi: 40,
  cutOffPercent: null,
  compressionPercent: null,
  admissionPressurePsig: null,
  outline: null,
  ...over,
});
const input = (over: Partial<CardSetResultsInput>): CardSetResultsInput => ({
  speedRpm: 75,
  cylinders: [cylinder()],
  cards: [],
  cutOffPercent: null,
  throttlePressurePsig: null,
  receiverPressurePsig: null,
  vacuumInHg: null,
  condensing: true,
  brake: null,
  computedAt: new Date('2026-06-13T11:00:00Z'),
  ...over,
});

describe('one card: which way, and what it comes to', () => {
  // Machinery’s Reference Series No. 70, Steam Engines, section on indicated horsepower.
  it('planimeter: 2.6 in², 3.6 in, 60-lb spring → 43.3 psi', () => {
    const e = evaluateCard({ areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 }, 'cards[0]');
    expect(e.method).toBe('planimeter');
    expect(e.meanEffectivePressurePsi).toBeCloseTo(43.3, 1);
    expect(e.meanHeightIn).toBeCloseTo(0.722, 3);
  });

  it('mid-ordinates: the mean of the ordinates times the spring (J. Rose, Modern Machine Shop Practice, section on the indicator)', () => {
    const ordinatesIn = [0.9, 0.85, 0.8, 0.74, 0.69, 0.63, 0.55, 0.46, 0.35, 0.2];
    const e = evaluateCard({ ordinatesIn, springPsiPerIn: 60 }, 'cards[1]');
    expect(e.method).toBe('ordinates');
    // Sum 6.17 in over ten ordinates = 0.617 in × 60 psi/in = 37.02 psi (arithmetic).
    expect(e.meanEffectivePressurePsi).toBeCloseTo(37.02, 9);
  });

  it('names the field for a card with two ways, with none, or a trace without its image', () => {
    const err = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e as CalculationInputError;
      }
      throw new Error('no error');
    };
    expect(err(() => evaluateCard({ meanEffectivePressurePsi: 20, ordinatesIn: [1, 1], springPsiPerIn: 20 }, 'cards[2]')).fieldPath).toBe(
      'cards[2].ordinatesIn',
    );
    expect(err(() => evaluateCard({}, 'cards[0]')).fieldPath).toBe('cards[0]');
    expect(err(() => evaluateCard({ areaSqIn: 2, springPsiPerIn: 60 }, 'card')).fieldPath).toBe('card.lengthIn');
    const trace = {
      atmosphericLine: [
        { x: 0, y: 100 },
        { x: 400, y: 100 },
      ] as [{ x: number; y: number }, { x: number; y: number }],
      admissionEndPx: { x: 20, y: 100 },
      releaseEndPx: { x: 380, y: 100 },
      pointsPx: [
        { x: 20, y: 20 },
        { x: 380, y: 80 },
        { x: 20, y: 90 },
      ],
    };
    expect(err(() => evaluateCard({ trace, springPsiPerIn: 60, lengthIn: 3.6 }, 'cards[3]')).fieldPath).toBe('cards[3].imageId');
  });

  // Machinery’s example as a drawn card.
  it('a trace is calibrated on the atmospheric line: a 3.6 × 0.722 in rectangle at 100 px/in on a 60-lb spring gives 43.3 psi', () => {
    // Atmospheric line at y = 500 px; card from x = 100 to 460 px (3.6 in); rectangle from 0.1 to 0.822 in high.
    const top = 500 - 82.2;
    const bottom = 500 - 10;
    const trace = {
      atmosphericLine: [
        { x: 80, y: 500 },
        { x: 480, y: 500 },
      ] as [{ x: number; y: number }, { x: number; y: number }],
      admissionEndPx: { x: 100, y: 500 },
      releaseEndPx: { x: 460, y: 500 },
      pointsPx: [
        { x: 100, y: top },
        { x: 460, y: top },
        { x: 460, y: bottom },
        { x: 100, y: bottom },
      ],
    };
    const r = calibrateCardTrace(trace, 60, 3.6);
    expect(r.areaSqIn).toBeCloseTo(3.6 * 0.722, 9);
    expect(r.meanEffectivePressurePsi).toBeCloseTo(43.3, 1);
    // The top of the card is 0.822 in above the line: 49.32 psig.
    expect(r.admissionPressurePsig).toBeCloseTo(0.822 * 60, 9);
    const e = evaluateCard({ trace, imageId: 'img', springPsiPerIn: 60, lengthIn: 3.6 }, 'cards[0]');
    expect(e.method).toBe('trace');
    expect(e.outline).toHaveLength(4);
  });

  it('turns the calc module’s trace messages into the names the sender used', () => {
    const trace = {
      atmosphericLine: [
        { x: 0, y: 100 },
        { x: 400, y: 100 },
      ] as [{ x: number; y: number }, { x: number; y: number }],
      admissionEndPx: { x: 20, y: 100 },
      releaseEndPx: { x: 20, y: 100 },
      pointsPx: [
        { x: 20, y: 20 },
        { x: 380, y: 80 },
        { x: 20, y: 90 },
      ],
    };
    expect(() => calibrateCardTrace(trace, 60, 3.6, 'cards[0].trace')).toThrow(
      /cards\[0\]\.trace: admissionEndPx and releaseEndPx must differ/,
    );
  });
});

describe('a set’s results', () => {
  // C. P. Brooks, Cotton Manufacturing, section on engines, transcribed online.
  it('both ends at 39.81 psi on a 400 in² piston, 5½ ft stroke, 40 rpm → 212.32 IHP', () => {
    const r = computeCardSetResults(
      input({
        speedRpm: 40,
        cylinders: [cylinder({ boreIn: boreForAreaIn(400), strokeIn: 66 })],
        cards: [card({ end: 'head', meanEffectivePressurePsi: 39.81 }), card({ end: 'crank', meanEffectivePressurePsi: 39.81 })],
      }),
    );
    expect(r.totalIndicatedHorsepower).toBeCloseTo(212.32, 2);
    expect(r.complete).toBe(true);
    expect(r.missingEnds).toEqual([]);
    expect(r.cylinders[0].workShare).toBeCloseTo(1, 12);
  });

  // B. Agrawal & C. M. Agrawal, Basic Mechanical Engineering, Wiley India, ch. 13, Ex. 14, p. 294, seen in a worked-solutions reproduction.
  it('300 mm × 400 mm at 180 rpm and 6.5 bar → 110.28 kW; 87.66 kW brake → mechanical efficiency 79.5 %', () => {
    const brakeHorsepower = math.unit(87.66, 'kW').toNumber('hp');
    const r = computeCardSetResults(
      input({
        speedRpm: 180,
        cylinders: [cylinder({ boreIn: inches(300, 'mm'), strokeIn: inches(400, 'mm') })],
        cards: [
          card({ end: 'head', meanEffectivePressurePsi: psi(6.5, 'bar') }),
          card({ end: 'crank', meanEffectivePressurePsi: psi(6.5, 'bar') }),
        ],
        brake: { figureId: 'b1', measuredAt: '2026-06-13T11:05:00Z', brakeHorsepower },
      }),
    );
    // The reproduction takes π as 3.142; exact π gives 110.27 kW.
    expect(Math.abs(r.totalIndicatedKilowatts - 110.28)).toBeLessThan(0.015);
    expect(r.brake!.mechanicalEfficiency! * 100).toBeCloseTo(79.5, 1);
  });

  // Agrawal & Agrawal, ch. 13, Ex. 8, p. 288.
  it('ideal card and diagram factor: 10 bar admission, cut-off ⅓, 1 bar back → 6.0 bar ideal; a 4.84 bar card → 0.807', () => {
    const backPsia = psi(1, 'bar');
    const r = computeCardSetResults(
      input({
        cylinders: [cylinder()],
        cards: [card({ end: 'head', meanEffectivePressurePsi: psi(4.84, 'bar'), cutOffPercent: 100 / 3 })],
        throttlePressurePsig: psiaToPsig(psi(10, 'bar')),
        // The vacuum that leaves 1 bar absolute under a standard atmosphere.
        vacuumInHg: (STANDARD_ATMOSPHERE_PSI - backPsia) / PSI_PER_INCH_OF_MERCURY,
      }),
    );
    const end = r.cylinders[0].ends[0];
    expect(math.unit(end.ideal!.meanEffectivePressurePsi, 'psi').toNumber('bar')).toBeCloseTo(6.0, 2);
    expect(end.diagramFactor).toBeCloseTo(0.807, 3);
    expect(end.ideal!.backPressurePsia).toBeCloseTo(backPsia, 9);
    // The ideal card is drawn in psi gauge from the admission line down to the back pressure.
    const top = Math.max(...end.ideal!.outline.map((p) => p.pressurePsig));
    expect(top).toBeCloseTo(psiaToPsig(psi(10, 'bar')), 9);
    // The crank end has no card: the set is not complete and says so.
    expect(r.complete).toBe(false);
    expect(r.missingEnds).toEqual([{ cylinderId: 'c1', cylinderLabel: 'Cyl', end: 'crank' }]);
    expect(r.notes.join(' ')).toMatch(/Not yet taken: Cyl crank end/);
  });

  it('no ideal card without a cut-off, and the reason is given', () => {
    const r = computeCardSetResults(input({ cards: [card({})], throttlePressurePsig: 120, vacuumInHg: 24 }));
    expect(r.cylinders[0].ends[0].ideal).toBeNull();
    expect(r.cylinders[0].ends[0].idealMissing).toBe('no cut-off recorded');
  });

  describe('a tandem compound (invented No. 2 engine: HP 24 in, LP 44 in with a 4 in tail rod, 5.5 in rods, 48 in stroke)', () => {
    const hp = cylinder({ cylinderId: 'hp', label: 'HP', role: 'high', boreIn: 24, pistonRodIn: 5.5, clearancePercent: 8 });
    const lp = cylinder({ cylinderId: 'lp', label: 'LP', role: 'low', boreIn: 44, pistonRodIn: 5.5, tailRodIn: 4, clearancePercent: 6 });
    const cards = [
      card({ cylinderId: 'hp', end: 'head', meanEffectivePressurePsi: 55, cutOffPercent: 35 }),
      card({ cylinderId: 'hp', end: 'crank', meanEffectivePressurePsi: 53, cutOffPercent: 35 }),
      card({ cylinderId: 'lp', end: 'head', meanEffectivePressurePsi: 26, cutOffPercent: 42, admissionPressurePsig: 24.5 }),
      card({ cylinderId: 'lp', end: 'crank', meanEffectivePressurePsi: 25, cutOffPercent: 42, admissionPressurePsig: 23.5 }),
    ];
    const r = computeCardSetResults(
      input({ cylinders: [hp, lp], cards, throttlePressurePsig: 132, receiverPressurePsig: 27, vacuumInHg: 24.5 }),
    );

    it('receiver drop is the receiver pressure less the LP cards’ mean admission: 27 − 24 = 3 psi (common practice, no source)', () => {
      expect(r.lowPressureAdmissionPsig).toBeCloseTo(24, 12);
      expect(r.receiverDropPsi).toBeCloseTo(3, 12);
    });

    it('HP exhausts into the receiver and the LP takes steam from it', () => {
      const [h, l] = r.cylinders;
      expect(h.backPressurePsia).toBeCloseTo(l.admissionPressurePsia!, 12);
      expect(l.backPressurePsia).toBeLessThan(3); // 24.5 inHg of vacuum leaves under 3 psia
    });

    it('shares of the work add to one; the referred MEP is on the LP cylinder and gives the same total on its mean area', () => {
      expect(r.cylinders[0].workShare! + r.cylinders[1].workShare!).toBeCloseTo(1, 12);
      expect(r.referredToCylinderLabel).toBe('LP');
      // IHP = p_ref · L · Ā_LP · 2N / 33,000 with Ā_LP the mean of the two effective areas (REFERENCES: compound engines).
      const meanLp = (Math.PI / 4) * (44 ** 2 - (5.5 ** 2 + 4 ** 2) / 2);
      expect((r.referredMeanEffectivePressurePsi! * 4 * meanLp * 2 * 75) / 33000).toBeCloseTo(r.totalIndicatedHorsepower, 9);
    });

    it('steam accounted for uses the logged pressures for cards without an outline, and the card’s own admission where read off', () => {
      const hpHead = r.cylinders[0].ends[0];
      expect(hpHead.steam!.expansionPressureBasis).toBe('logged');
      // Expansion point at cut-off incl. 8 % clearance: A/144 · L/12 · (0.35 + 0.08) ft³.
      expect(hpHead.steam!.expansionVolumeFt3).toBeCloseTo((((Math.PI / 4) * 24 ** 2) / 144) * 4 * 0.43, 9);
      expect(r.cylinders[1].ends[0].steam!.expansionPressureBasis).toBe('card');
      // The set's figure is the first cylinder's steam per hour charged to the engine's whole indicated power.
      const hpSteamPerHourLb = r.cylinders[0].ends.reduce((sum, e) => sum + e.steam!.steamPerHourLb, 0);
      expect(r.steamAccountedForLbPerIhpHour).toBeCloseTo(hpSteamPerHourLb / r.totalIndicatedHorsepower, 9);
    });

    it('without the LP cards the set is incomplete: no referred MEP, no shares', () => {
      const partial = computeCardSetResults(
        input({ cylinders: [hp, lp], cards: cards.slice(0, 2), throttlePressurePsig: 132, receiverPressurePsig: 27, vacuumInHg: 24.5 }),
      );
      expect(partial.referredMeanEffectivePressurePsi).toBeNull();
      expect(partial.cylinders[0].workShare).toBeNull();
      expect(partial.cylinders[1].indicatedHorsepower).toBe(0);
      expect(partial.steamAccountedForLbPerIhpHour).toBeNull();
    });
  });
});

describe('figures that need every card (issue: numbers a chief engineer can sign)', () => {
  const hp = cylinder({ cylinderId: 'hp', label: 'HP', role: 'high', boreIn: 24, pistonRodIn: 5.5 });
  const lp = cylinder({ cylinderId: 'lp', label: 'LP', role: 'low', boreIn: 44, pistonRodIn: 5.5, tailRodIn: 4 });
  // Every cylinder has a card but the LP crank end is missing.
  const threeCards = [
    card({ cylinderId: 'hp', end: 'head', meanEffectivePressurePsi: 55 }),
    card({ cylinderId: 'hp', end: 'crank', meanEffectivePressurePsi: 53 }),
    card({ cylinderId: 'lp', end: 'head', meanEffectivePressurePsi: 26 }),
  ];
  const brake = { figureId: 'b1', measuredAt: '2026-06-13T11:05:00Z', brakeHorsepower: 300 };

  it('one end missing: no referred MEP, no work shares, no mechanical efficiency, each with the reason', () => {
    const r = computeCardSetResults(input({ cylinders: [hp, lp], cards: threeCards, brake }));
    expect(r.complete).toBe(false);
    expect(r.referredMeanEffectivePressurePsi).toBeNull();
    expect(r.referredToCylinderLabel).toBeNull();
    expect(r.referredMeanEffectivePressureMissing).toMatch(/missing: LP crank end/);
    expect(r.cylinders.map((c) => c.workShare)).toEqual([null, null]);
    expect(r.workSharesMissing).toMatch(/missing: LP crank end/);
    expect(r.brake!.mechanicalEfficiency).toBeNull();
    expect(r.brake!.mechanicalEfficiencyMissing).toMatch(/missing: LP crank end/);
    expect(r.notes.join(' ')).toMatch(/sum of the cards present/);
  });

  it('a brake figure above the indicated power: no efficiency, an input error said so', () => {
    const r = computeCardSetResults(
      input({
        cylinders: [cylinder()],
        cards: [card({ end: 'head', meanEffectivePressurePsi: 40 }), card({ end: 'crank', meanEffectivePressurePsi: 40 })],
        brake: { ...brake, brakeHorsepower: 5000 },
      }),
    );
    expect(r.complete).toBe(true);
    expect(r.brake!.mechanicalEfficiency).toBeNull();
    expect(r.brake!.mechanicalEfficiencyMissing).toMatch(/^input error: .*above 1 is an error in the inputs/);
    expect(r.notes.join(' ')).toMatch(/No mechanical efficiency: input error/);
  });

  it('steam accounted for that would come out negative is refused with a message, not returned', () => {
    // A traced outline whose expansion line at cut-off (5 psig at 50 %) lies below its compression line (60 psig at 40 %).
    const outline = [
      [0, 100],
      [0.42, 100],
      [0.48, 5],
      [1, 5],
      [1, 0],
      [0.48, 0],
      [0.42, 60],
      [0, 60],
    ].map(([strokeFraction, pressurePsig]) => ({ strokeFraction, pressurePsig }));
    const r = computeCardSetResults(
      input({
        cards: [
          card({ end: 'head', cutOffPercent: 50, compressionPercent: 40, outline }),
          card({ end: 'crank', cutOffPercent: 50, compressionPercent: 40, outline }),
        ],
      }),
    );
    expect(r.cylinders[0].ends[0].steam).toBeNull();
    expect(r.steamAccountedForLbPerIhpHour).toBeNull();
    expect(r.notes.join(' ')).toMatch(/no steam figure \(steam accounted for comes out negative/);
  });

  // Machinery's Reference Series No. 70, "Steam Engines" (Industrial Press), steam consumption from the indicator
  // diagram, Fig. 53 example: 201 in² piston, stroke 2.49 ft on the diagram's scale with 6 % clearance, point C on the
  // expansion line at 2.27 ft and point Q on the compression line at 0.30 ft from the clearance line, both at 48.6 psia;
  // 150 rpm, 217 IHP → 26.5 lb per IHP-hour (the book's steam table: 0.116 lb/ft³; IF97 lands within 2 %).
  it('steam accounted for of a whole set matches the published worked example within 2 %', () => {
    const strokeIn = 2.49 * 12;
    const clearance = 0.06;
    const cutOff = 2.27 / 2.49 - clearance;
    const compression = 0.3 / 2.49 - clearance;
    const pointPsig = psiaToPsig(48.6);
    // Upper line flat at 48.6 psia; lower line through 48.6 psia at the compression point.
    const outline = [
      { strokeFraction: 0, pressurePsig: pointPsig },
      { strokeFraction: 1, pressurePsig: pointPsig },
      { strokeFraction: 1, pressurePsig: -10 },
      { strokeFraction: 0, pressurePsig: -10 + (pointPsig + 10) / (1 - compression) },
    ];
    const meanEffectivePressurePsi = (217 * 33000) / (2 * (strokeIn / 12) * 201 * 150);
    const ends = (['head', 'crank'] as const).map((end) =>
      card({ end, meanEffectivePressurePsi, cutOffPercent: cutOff * 100, compressionPercent: compression * 100, outline }),
    );
    const r = computeCardSetResults(
      input({ speedRpm: 150, cylinders: [cylinder({ boreIn: boreForAreaIn(201), strokeIn, clearancePercent: 6 })], cards: ends }),
    );
    expect(r.totalIndicatedHorsepower).toBeCloseTo(217, 9);
    expect(r.cylinders[0].ends[0].steam!.expansionPressurePsia).toBeCloseTo(48.6, 9);
    expect(r.cylinders[0].ends[0].steam!.compressionPressurePsia).toBeCloseTo(48.6, 9);
    expect(Math.abs(r.steamAccountedForLbPerIhpHour! - 26.5) / 26.5).toBeLessThan(0.02);
  });
});

describe('pressures against the local barometer', () => {
  const cards = [card({ end: 'head' }), card({ end: 'crank' })];

  it('a 28.9 inHg barometer: 24 inHg of vacuum is 2.41 psia of back pressure, gauge pressures are added to 14.19 psia', () => {
    const r = computeCardSetResults(input({ cards, vacuumInHg: 24, barometerInHg: 28.9, throttlePressurePsig: 120 }));
    expect(r.atmosphereBasis).toBe('barometer');
    expect(r.atmosphericPressurePsia).toBeCloseTo(28.9 * PSI_PER_INCH_OF_MERCURY, 12);
    expect(r.cylinders[0].backPressurePsia).toBeCloseTo(2.41, 2);
    expect(r.cylinders[0].admissionPressurePsia).toBeCloseTo(120 + 28.9 * PSI_PER_INCH_OF_MERCURY, 9);
    expect(r.notes.join(' ')).not.toMatch(/standard atmosphere/);
  });

  it('no barometer: the standard atmosphere, with a visible note', () => {
    const r = computeCardSetResults(input({ cards, vacuumInHg: 24 }));
    expect(r.atmosphereBasis).toBe('standard');
    expect(r.cylinders[0].backPressurePsia).toBeCloseTo(2.91, 2);
    expect(r.notes.join(' ')).toMatch(/No barometer reading: .* standard atmosphere \(29\.92 inHg, 14\.696 psia\)/);
  });
});
