import { create, all } from 'mathjs';
import {
  WATTS_PER_HP,
  KPA_PER_PSI,
  psigToPsia,
  hpToKw,
  fahrenheitToCelsius,
  unitConversionTable,
  psigFromScale,
  psigOnScale,
} from './units.js';

const math = create(all);

describe('unit constants', () => {
  it('horsepower in watts agrees with mathjs (registry reference library) to 1e-9', () => {
    const mathjsW = math.unit(1, 'hp').toNumber('W');
    expect(Math.abs(WATTS_PER_HP - mathjsW) / mathjsW).toBeLessThan(1e-9);
  });
  it('psi in kPa agrees with mathjs', () => {
    expect(KPA_PER_PSI).toBeCloseTo(math.unit(1, 'psi').toNumber('kPa'), 9);
  });
  it('0 psig is one standard atmosphere absolute, 14.696 psia (common practice, no source)', () => {
    expect(psigToPsia(0)).toBeCloseTo(14.696, 3);
  });
  it('1 hp = 0.7457 kW; water boils at 212 °F = 100 °C (common practice, no source)', () => {
    expect(hpToKw(1)).toBeCloseTo(0.7457, 4);
    expect(fahrenheitToCelsius(212)).toBeCloseTo(100, 10);
  });
});

const show = (system: 'imperial' | 'metric', unit: string, v: number) => {
  const c = unitConversionTable()[system][unit];
  return { value: v * c.factor + c.offset, unit: c.to };
};

describe('display conversions (factors from mathjs)', () => {
  it('212 °F shows as 100 °C and 0 °C as 32 °F (common practice, no source)', () => {
    expect(show('metric', 'degF', 212).value).toBeCloseTo(100, 9);
    expect(show('imperial', 'degC', 0).value).toBeCloseTo(32, 9);
  });
  it('150 psig shows as 10.342 bar (1 psi = 6.894757 kPa; NIST SP 811, 2008, appendix B.8)', () => {
    const r = show('metric', 'psig', 150);
    expect(r.unit).toBe('bar');
    expect(r.value).toBeCloseTo(10.3421, 4);
  });
  it('1 inHg shows as 3.3864 kPa (inch of mercury, conventional: 3.386389 kPa; NIST SP 811, 2008, appendix B.8)', () => {
    expect(show('metric', 'inHg', 1).value).toBeCloseTo(3.386389, 4);
  });
  it('leaves imperial units as they are for imperial users', () => {
    expect(show('imperial', 'psig', 132)).toEqual({ value: 132, unit: 'psig' });
  });
});

describe('a pressure reading as gauge psi (the inverse of psigOnScale)', () => {
  it('10 bar gauge is 145.04 psig (1 psi = 6.894757 kPa; NIST SP 811, 2008, appendix B.8)', () => {
    expect(psigFromScale(10, 'bar_gauge')).toBeCloseTo(145.038, 3);
  });
  it('round-trips every gauge and absolute scale, and gives null for vacuum', () => {
    for (const scale of ['psig', 'psia', 'kPa_gauge', 'kPa_abs', 'bar_gauge'] as const)
      expect(psigFromScale(psigOnScale(120, scale)!, scale)).toBeCloseTo(120, 9);
    expect(psigFromScale(25, 'inHg_vacuum')).toBeNull();
  });
});
