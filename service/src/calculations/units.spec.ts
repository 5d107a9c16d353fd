import { create, all } from 'mathjs';
import { WATTS_PER_HP, KPA_PER_PSI, psigToPsia, hpToKw, fahrenheitToCelsius } from './units.js';

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
