import { amountToMinorUnits, minorDigits, minorUnitsToAmount, shareOfMinorUnits } from './money.js';
import { CalculationInputError } from './errors.js';

describe('money in minor units', () => {
  it('knows the minor-unit digits of a currency', () => {
    // ISO 4217:2015, Codes for the representation of currencies, table A.1: GBP and USD 2 digits, JPY 0.
    expect(minorDigits('GBP')).toBe(2);
    expect(minorDigits('USD')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
    expect(() => minorDigits('POUNDS')).toThrow(CalculationInputError);
  });

  it('turns a quote total into pence and back (common practice, no source)', () => {
    expect(amountToMinorUnits(1234.56, 'GBP')).toBe(123456);
    expect(amountToMinorUnits(0.29, 'GBP')).toBe(29); // 0.29 × 100 = 28.999999999999996 in binary floating point
    expect(amountToMinorUnits(1500, 'JPY')).toBe(1500);
    expect(minorUnitsToAmount(123456, 'GBP')).toBe(1234.56);
  });

  it('takes a share, rounded to a whole penny (common practice, no source)', () => {
    expect(shareOfMinorUnits(123456, 30)).toBe(37037); // 37036.8
    expect(shareOfMinorUnits(100001, 50)).toBe(50001); // 50000.5 rounds up
    expect(shareOfMinorUnits(5000, 0)).toBe(0);
    expect(() => shareOfMinorUnits(5000, 101)).toThrow(CalculationInputError);
    expect(() => shareOfMinorUnits(50.5, 10)).toThrow(CalculationInputError);
  });
});
