import { create, all } from 'mathjs';
import { fitBand, bandAt, isDrift, driftCheck, DRIFT_RULE_TEXT, type DriftPoint } from './bearing-drift.js';

const math = create(all);

// F. J. Anscombe, "Graphs in Statistical Analysis", The American Statistician 27(1), 1973, 17–21: data set I.
const anscombeX = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
const anscombeY = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
const anscombe: DriftPoint[] = anscombeX.map((x, i) => ({ load: x, temperatureRiseF: anscombeY[i] }));

describe('least-squares fit', () => {
  it('Anscombe 1973 set I: y = 3.00 + 0.500 x (Anscombe, The American Statistician 27(1))', () => {
    const band = fitBand(anscombe);
    expect(band.kind).toBe('regression');
    expect(band.slopeFPerLoad).toBeCloseTo(0.5, 3);
    expect(band.interceptF).toBeCloseTo(3.0, 2);
  });

  it('Anscombe set I residual sum of squares 13.75 on 9 degrees of freedom (Anscombe 1973, printed to two decimals and shared by all four sets; from memory)', () => {
    const band = fitBand(anscombe);
    expect(band.residualSdF ** 2 * 9).toBeCloseTo(13.75, 1);
  });

  it('slope, intercept and residual SD agree with the normal equations solved by mathjs', () => {
    const X = math.matrix(anscombeX.map((x) => [1, x]));
    const y = math.matrix(anscombeY.map((v) => [v]));
    const Xt = math.transpose(X);
    const beta = math.lusolve(math.multiply(Xt, X), math.multiply(Xt, y)) as math.Matrix;
    const [b0, b1] = (beta.toArray() as number[][]).map((r) => r[0]);
    const band = fitBand(anscombe);
    expect(band.interceptF).toBeCloseTo(b0, 9);
    expect(band.slopeFPerLoad).toBeCloseTo(b1, 9);
    const residuals = anscombeX.map((x, i) => anscombeY[i] - (b0 + b1 * x));
    const sse = math.sum(residuals.map((r) => r * r)) as number;
    expect(band.residualSdF).toBeCloseTo(Math.sqrt(sse / (anscombeX.length - 2)), 9);
  });
});

describe('fallback band', () => {
  it('with fewer than 3 runs the band is mean ± k·s (sample SD)', () => {
    const band = fitBand([
      { load: 400, temperatureRiseF: 20 },
      { load: 600, temperatureRiseF: 24 },
    ]);
    expect(band.kind).toBe('mean');
    expect(band.interceptF).toBe(22);
    expect(band.slopeFPerLoad).toBe(0);
    expect(band.residualSdF).toBeCloseTo(Number(math.std([20, 24])), 12);
    const at = bandAt(band, 500);
    expect(at.upperF).toBeCloseTo(22 + 2 * Number(math.std([20, 24])), 12);
  });

  it('with no spread in load it also falls back to the mean', () => {
    const band = fitBand([
      { load: 500, temperatureRiseF: 20 },
      { load: 500, temperatureRiseF: 22 },
      { load: 500, temperatureRiseF: 24 },
    ]);
    expect(band.kind).toBe('mean');
    expect(band.residualSdF).toBeCloseTo(2, 12);
  });

  it('a single run gives a zero-width band, so only the margin applies', () => {
    const band = fitBand([{ load: 500, temperatureRiseF: 20 }]);
    expect(isDrift({ load: 500, temperatureRiseF: 24.9 }, band)).toBe(false);
    expect(isDrift({ load: 500, temperatureRiseF: 25.1 }, band)).toBe(true);
  });

  it('no history is an error', () => {
    expect(() => fitBand([])).toThrow(RangeError);
  });
});

describe('drift flag (rule: above upper band + 5 °F)', () => {
  // Synthetic history: rise ≈ 10 + 0.03·IHP with scatter of about ±1 °F.
  const history: DriftPoint[] = [
    { load: 300, temperatureRiseF: 19.2 },
    { load: 350, temperatureRiseF: 20.9 },
    { load: 400, temperatureRiseF: 21.7 },
    { load: 450, temperatureRiseF: 23.8 },
    { load: 500, temperatureRiseF: 24.6 },
    { load: 550, temperatureRiseF: 26.1 },
    { load: 600, temperatureRiseF: 27.4 },
  ];
  const band = fitBand(history);

  it('the earlier runs themselves are not flagged', () => {
    for (const p of history) expect(isDrift(p, band)).toBe(false);
  });

  it('a warm run well above the band at its load is flagged; one just inside the margin is not', () => {
    const limit = bandAt(band, 480).upperF + 5;
    expect(isDrift({ load: 480, temperatureRiseF: limit + 0.1 }, band)).toBe(true);
    expect(isDrift({ load: 480, temperatureRiseF: limit - 0.1 }, band)).toBe(false);
    expect(isDrift({ load: 480, temperatureRiseF: 38 }, band)).toBe(true);
  });

  it('the same rise is normal at high load and drift at low load, because the band follows load', () => {
    const rise = bandAt(band, 600).expectedRiseF + 2;
    expect(isDrift({ load: 600, temperatureRiseF: rise }, band)).toBe(false);
    expect(isDrift({ load: 250, temperatureRiseF: rise }, band)).toBe(true);
  });

  it('driftCheck reports limit, excess and extrapolation; the margin is a setting', () => {
    const c = driftCheck({ load: 700, temperatureRiseF: 40 }, band, { marginF: 3 });
    expect(c.limitF).toBeCloseTo(bandAt(band, 700).upperF + 3, 12);
    expect(c.excessF).toBeCloseTo(40 - c.limitF, 12);
    expect(c.extrapolated).toBe(true);
  });

  it('the rule text for the UI states the band and the margin', () => {
    expect(DRIFT_RULE_TEXT).toMatch(/least squares/);
    expect(DRIFT_RULE_TEXT).toMatch(/5 °F/);
  });
});
