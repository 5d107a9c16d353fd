import { create, all } from 'mathjs';
import { KPA_PER_INCH_OF_MERCURY, PSI_PER_INCH_OF_MERCURY, vacuumInHgToPsia } from './vacuum.js';
import { STANDARD_ATMOSPHERE_PSI } from './units.js';

const math = create(all);

describe('vacuum in inches of mercury → absolute pressure', () => {
  it('1 inHg is 3.386389 kPa (NIST SP 811, 2008, appendix B.8) and 25.4 mmHg as mathjs knows it (registry reference library)', () => {
    // mathjs's mmHg is 133.322 Pa, truncated from 133.322387 Pa: compare at a relative 1e-5.
    const viaMathjs = math.unit(25.4, 'mmHg').toNumber('kPa');
    expect(Math.abs(KPA_PER_INCH_OF_MERCURY - viaMathjs) / viaMathjs).toBeLessThan(1e-5);
    const psiViaMathjs = math.unit(25.4, 'mmHg').toNumber('psi');
    expect(Math.abs(PSI_PER_INCH_OF_MERCURY - psiViaMathjs) / psiViaMathjs).toBeLessThan(1e-5);
  });

  it('no vacuum is the atmosphere; 24.5 inHg leaves 14.696 − 24.5 × 0.49115 psi (conversion by mathjs)', () => {
    expect(vacuumInHgToPsia(0)).toBeCloseTo(STANDARD_ATMOSPHERE_PSI, 12);
    const expected = math.unit(1, 'atm').toNumber('psi') - math.unit(24.5 * 25.4, 'mmHg').toNumber('psi');
    expect(vacuumInHgToPsia(24.5)).toBeCloseTo(expected, 4); // mathjs's truncated mmHg: 4e-5 psi
  });

  it('a perfect vacuum reads about 29.92 inHg under a standard atmosphere (common practice, no source)', () => {
    expect(vacuumInHgToPsia(29.9)).toBeLessThan(0.02);
    expect(() => vacuumInHgToPsia(30)).toThrow(RangeError);
  });

  it('uses the local atmosphere where one is given', () => {
    expect(vacuumInHgToPsia(10, 14)).toBeCloseTo(14 - 10 * PSI_PER_INCH_OF_MERCURY, 12);
  });

  it('refuses a negative or missing reading', () => {
    expect(() => vacuumInHgToPsia(-1)).toThrow(RangeError);
    expect(() => vacuumInHgToPsia(Number.NaN)).toThrow(RangeError);
  });
});

describe('vacuum against the local barometer', () => {
  // A vacuum gauge reads the depression below the local atmosphere, so absolute = barometer − vacuum (common practice, no source):
  // 28.9 inHg − 24 inHg = 4.9 inHg × 0.491154 psi/inHg (NIST SP 811, 2008, appendix B.8) = 2.41 psia.
  it('24 inHg of vacuum under a 28.9 inHg barometer is 2.41 psia, not the 2.91 psia of the standard atmosphere', () => {
    const psia = vacuumInHgToPsia(24, 28.9 * PSI_PER_INCH_OF_MERCURY);
    expect(psia).toBeCloseTo(2.41, 2);
    expect(vacuumInHgToPsia(24)).toBeCloseTo(2.91, 2);
  });
});
