import { unitConversionTable } from './unit-conversions.js';

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
