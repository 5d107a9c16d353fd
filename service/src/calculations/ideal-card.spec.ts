import { create, all } from 'mathjs';
import { diagramFactor, idealCardPoints, idealMeanEffectivePressurePsi } from './ideal-card.js';
import { shoelaceArea } from './indicator-card.js';

const math = create(all);
const barToPsi = (bar: number) => math.unit(bar, 'bar').toNumber('psi');
const psiToBar = (psi: number) => math.unit(psi, 'psi').toNumber('bar');

/** Composite Simpson's rule, written here independently of the module under test. */
function simpson(f: (x: number) => number, a: number, b: number, intervals = 2000): number {
  const h = (b - a) / intervals;
  let sum = f(a) + f(b);
  for (let i = 1; i < intervals; i++) sum += f(a + i * h) * (i % 2 === 1 ? 4 : 2);
  return (sum * h) / 3;
}

/** Ideal card MEP by numerical integration of p(x) over the stroke, less the back pressure. */
function numericalIdealMep(p1: number, k: number, pb: number, c: number): number {
  const admission = p1 * k;
  const expansion = simpson((x) => (p1 * (k + c)) / (x + c), k, 1);
  return admission + expansion - pb;
}

describe('ideal hyperbolic card, mean effective pressure', () => {
  // The worked examples below: B. Agrawal & C. M. Agrawal, Basic Mechanical Engineering (Wiley India),
  // ch. 13 "Steam Engines" (seen in a worked-solutions reproduction, a Python textbook-companion notebook).
  // The book works in bar; we convert with mathjs and back, since the module works in psia.
  it('10 bar admission, cut-off 35 %, back pressure 1.5 bar → 5.67 bar (Agrawal & Agrawal, ch. 13, Ex. 1, p. 281)', () => {
    const mep = idealMeanEffectivePressurePsi({
      admissionPressurePsia: barToPsi(10),
      cutoffFraction: 0.35,
      backPressurePsia: barToPsi(1.5),
    });
    expect(psiToBar(mep)).toBeCloseTo(5.67, 2);
  });

  it('with 5 % clearance: 12 bar, cut-off 1/3, 1.1 bar → 7.54 bar (Agrawal & Agrawal, ch. 13, Ex. 2, p. 283)', () => {
    const mep = idealMeanEffectivePressurePsi({
      admissionPressurePsia: barToPsi(12),
      cutoffFraction: 1 / 3,
      backPressurePsia: barToPsi(1.1),
      clearanceFraction: 0.05,
    });
    expect(psiToBar(mep)).toBeCloseTo(7.54, 2);
  });

  it('14 bar, cut-off 20 %, 0.15 bar → 7.156 bar; diagram factor 0.72 gives 5.15 bar (Agrawal & Agrawal, ch. 13, Ex. 6, p. 287)', () => {
    const ideal = idealMeanEffectivePressurePsi({
      admissionPressurePsia: barToPsi(14),
      cutoffFraction: 0.2,
      backPressurePsia: barToPsi(0.15),
    });
    expect(psiToBar(ideal)).toBeCloseTo(7.156, 3);
    const factor = diagramFactor({ actualMeanEffectivePressurePsi: barToPsi(5.15), idealMeanEffectivePressurePsi: ideal });
    expect(factor).toBeCloseTo(0.72, 2);
  });

  it(
    '10 bar, expansion ratio 3, 1 bar → 6.0 bar; card 12.1/7.5 × 3 = 4.84 bar → diagram factor 0.807 (Agrawal & ' +
      'Agrawal, ch. 13, Ex. 8, p. 288)',
    () => {
      const ideal = idealMeanEffectivePressurePsi({
        admissionPressurePsia: barToPsi(10),
        cutoffFraction: 1 / 3,
        backPressurePsia: barToPsi(1),
      });
      expect(psiToBar(ideal)).toBeCloseTo(6.0, 2);
      const actual = barToPsi((12.1 / 7.5) * 3);
      expect(diagramFactor({ actualMeanEffectivePressurePsi: actual, idealMeanEffectivePressurePsi: ideal })).toBeCloseTo(0.807, 3);
    },
  );

  it.each([
    [150, 0.25, 3, 0],
    [150, 0.25, 3, 0.08],
    [120, 0.6, 17, 0.04],
    [90, 1, 17, 0.05],
  ])('closed form agrees with Simpson integration of p·V = const (p1 %p psia, cut-off %p, pb %p, clearance %p)', (p1, k, pb, c) => {
    const closedForm = idealMeanEffectivePressurePsi({
      admissionPressurePsia: p1,
      cutoffFraction: k,
      backPressurePsia: pb,
      clearanceFraction: c,
    });
    expect(closedForm).toBeCloseTo(numericalIdealMep(p1, k, pb, c), 8);
  });

  it('refuses a cut-off outside (0, 1], a non-positive admission pressure or negative clearance', () => {
    const base = { admissionPressurePsia: 100, cutoffFraction: 0.3, backPressurePsia: 3 };
    expect(() => idealMeanEffectivePressurePsi({ ...base, cutoffFraction: 0 })).toThrow(RangeError);
    expect(() => idealMeanEffectivePressurePsi({ ...base, cutoffFraction: 1.2 })).toThrow(RangeError);
    expect(() => idealMeanEffectivePressurePsi({ ...base, admissionPressurePsia: 0 })).toThrow(RangeError);
    expect(() => idealMeanEffectivePressurePsi({ ...base, clearanceFraction: -0.1 })).toThrow(RangeError);
    expect(() => diagramFactor({ actualMeanEffectivePressurePsi: 30, idealMeanEffectivePressurePsi: 0 })).toThrow(RangeError);
  });
});

describe('ideal card polyline for plotting', () => {
  const input = { admissionPressurePsia: 150, cutoffFraction: 0.25, backPressurePsia: 3, clearanceFraction: 0.06 };

  it('encloses an area equal to the ideal MEP × the stroke (polygon area vs closed form, 400 chords)', () => {
    const points = idealCardPoints({ ...input, expansionSegments: 400 });
    const area = shoelaceArea(points.map((p) => ({ x: p.strokeFraction, y: p.pressurePsia })));
    expect(area / idealMeanEffectivePressurePsi(input)).toBeCloseTo(1, 5);
  });

  it('starts and ends at admission, follows p·V = const on the expansion line and drops to back pressure', () => {
    const points = idealCardPoints(input);
    expect(points[0]).toEqual({ strokeFraction: 0, volumeFraction: 0.06, pressurePsia: 150 });
    expect(points[points.length - 1]).toEqual(points[0]);
    const expansion = points.filter((p) => p.strokeFraction >= input.cutoffFraction && p.pressurePsia > 3);
    for (const p of expansion) {
      expect(p.pressurePsia * p.volumeFraction).toBeCloseTo(150 * (0.25 + 0.06), 9);
    }
    expect(points.some((p) => p.strokeFraction === 1 && p.pressurePsia === 3)).toBe(true);
    expect(points.some((p) => p.strokeFraction === 0 && p.pressurePsia === 3)).toBe(true);
  });

  it('with cut-off at the end of the stroke the card is a rectangle (p1 − pb) × 1', () => {
    const points = idealCardPoints({ admissionPressurePsia: 100, cutoffFraction: 1, backPressurePsia: 20 });
    expect(points).toHaveLength(5);
    expect(shoelaceArea(points.map((p) => ({ x: p.strokeFraction, y: p.pressurePsia })))).toBeCloseTo(80, 10);
  });
});
