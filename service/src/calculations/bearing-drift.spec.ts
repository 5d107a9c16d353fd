import { create, all } from 'mathjs';
import {
  fitBand,
  bandAt,
  isDrift,
  driftCheck,
  driftHistory,
  driftRuleText,
  studentTTwoSided,
  DRIFT_RULE_TEXT,
  MIN_RUNS_TO_JUDGE,
  type DriftPoint,
} from './bearing-drift.js';

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

  it(
    'Anscombe set I residual sum of squares 13.75 on 9 degrees of freedom (Anscombe 1973, printed to two decimals ' +
      'and shared by all four sets; from memory)',
    () => {
      const band = fitBand(anscombe);
      expect(band.residualSdF ** 2 * 9).toBeCloseTo(13.75, 1);
    },
  );

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

describe('the Student t quantile (from @stdlib/stats-base-dists-t-quantile)', () => {
  // NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2 "Critical Values of the Student's t Distribution",
  // upper critical values for α = 0.025 (two-sided 95 %), printed to three decimals.
  it.each([
    [1, 12.706],
    [2, 4.303],
    [5, 2.571],
    [10, 2.228],
    [30, 2.042],
  ])('ν = %d: t(0.975) = %f as printed', (dof, printed) => {
    expect(Math.abs(studentTTwoSided(0.95, dof) - printed)).toBeLessThan(0.0005);
  });
  it('ν = 10 at 90 % two-sided: 1.812 (same table, α = 0.05)', () => {
    expect(Math.abs(studentTTwoSided(0.9, 10) - 1.812)).toBeLessThan(0.0005);
  });
  it('refuses a coverage outside (0, 1) and no degrees of freedom', () => {
    expect(() => studentTTwoSided(1, 5)).toThrow(RangeError);
    expect(() => studentTTwoSided(0.95, 0)).toThrow(RangeError);
  });
});

describe('the band is a prediction interval for one more run', () => {
  // D. C. Montgomery, G. C. Runger, "Applied Statistics and Probability for Engineers", Wiley (3rd ed. or later),
  // ch. 11: the oxygen purity (y, %) against hydrocarbon level (x, %) data of Table 11-1; the fitted line
  // ŷ = 74.283 + 14.947 x, σ̂² = 1.18, and the 95 % prediction interval for a new observation at x0 = 1.00 %:
  // 86.83 ≤ Y0 ≤ 91.63 (data and figures from memory; the section on prediction of new observations).
  const x = [0.99, 1.02, 1.15, 1.29, 1.46, 1.36, 0.87, 1.23, 1.55, 1.4, 1.19, 1.15, 0.98, 1.01, 1.11, 1.2, 1.26, 1.32, 1.43, 0.95];
  const y = [
    90.01, 89.05, 91.43, 93.74, 96.73, 94.45, 87.59, 91.77, 99.42, 93.65, 93.54, 92.52, 90.56, 89.54, 89.85, 90.39, 93.25, 93.41, 94.98,
    87.33,
  ];
  const band = fitBand(
    x.map((v, i) => ({ load: v, temperatureRiseF: y[i] })),
    { confidence: 0.95 },
  );

  it('fits the printed line and variance on 18 degrees of freedom', () => {
    expect(band.interceptF).toBeCloseTo(74.283, 3);
    expect(band.slopeFPerLoad).toBeCloseTo(14.947, 3);
    expect(band.residualSdF ** 2).toBeCloseTo(1.18, 2);
    expect(band.degreesOfFreedom).toBe(18);
    expect(band.tQuantile).toBeCloseTo(2.101, 3);
  });

  it('gives the printed prediction interval at x0 = 1.00: 86.83 to 91.63', () => {
    const at = bandAt(band, 1.0);
    expect(at.lowerF).toBeCloseTo(86.83, 2);
    expect(at.upperF).toBeCloseTo(91.63, 2);
  });

  it('widens away from the mean load (x̄ = 1.196)', () => {
    expect(bandAt(band, 1.196).halfWidthF).toBeLessThan(bandAt(band, 1.0).halfWidthF);
    expect(bandAt(band, 1.6).halfWidthF).toBeGreaterThan(bandAt(band, 1.4).halfWidthF);
  });

  it('about the mean (all runs at one load): mean ± t(n − 1) · s · √(1 + 1/n), checked with mathjs', () => {
    const rises = [20, 22, 24, 23];
    const b = fitBand(rises.map((r) => ({ load: 500, temperatureRiseF: r })));
    expect(b.kind).toBe('mean');
    expect(b.degreesOfFreedom).toBe(3);
    // t(0.975, 3) = 3.182 (NIST/SEMATECH e-Handbook §1.3.6.7.2).
    expect(b.tQuantile).toBeCloseTo(3.182, 3);
    const s = Number(math.std(rises));
    expect(bandAt(b, 500).upperF).toBeCloseTo(Number(math.mean(rises)) + b.tQuantile * s * Math.sqrt(1 + 1 / 4), 12);
  });
});

describe('too few runs to judge', () => {
  it(`fewer than ${MIN_RUNS_TO_JUDGE} earlier runs fit no band`, () => {
    expect(MIN_RUNS_TO_JUDGE).toBe(3);
    expect(() =>
      fitBand([
        { load: 400, temperatureRiseF: 20 },
        { load: 600, temperatureRiseF: 24 },
      ]),
    ).toThrow(/too few runs to judge/);
    expect(() => fitBand([])).toThrow(RangeError);
  });

  it('with no spread in load the band is about the mean', () => {
    const band = fitBand([
      { load: 500, temperatureRiseF: 20 },
      { load: 500, temperatureRiseF: 22 },
      { load: 500, temperatureRiseF: 24 },
    ]);
    expect(band.kind).toBe('mean');
    expect(band.residualSdF).toBeCloseTo(2, 12);
  });

  it('the first runs of a bearing get no verdict, the fourth is judged against three', () => {
    const v = driftHistory(
      [20, 21, 22, 40].map((r, i) => ({ id: String(i), load: 75, temperatureRiseF: r })),
      { minLoadSpread: 5 },
    );
    expect(v.map((x) => x.check === null)).toEqual([true, true, true, false]);
    expect(v.map((x) => x.historyRuns)).toEqual([0, 1, 2, 3]);
    expect(v[3].check!.drift).toBe(true);
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

  it('the rule text for the UI states the band, its degrees of freedom, the minimum and the margin', () => {
    expect(DRIFT_RULE_TEXT).toMatch(/least squares/);
    expect(DRIFT_RULE_TEXT).toMatch(/95 % prediction interval/);
    expect(DRIFT_RULE_TEXT).toMatch(/degrees of freedom/);
    expect(DRIFT_RULE_TEXT).toMatch(/fewer than 3 earlier runs there are too few runs to judge/);
    expect(DRIFT_RULE_TEXT).toMatch(/5 °F/);
  });
});

describe('comparable load (minLoadSpread)', () => {
  // Rule of the product (common practice, no source): loads that span less than the set spread are treated
  // as the same load, so the band is about the mean rather than a slope fitted to noise.
  const nearlySame: DriftPoint[] = [
    { load: 74.2, temperatureRiseF: 40.1 },
    { load: 74.6, temperatureRiseF: 41.3 },
    { load: 75.1, temperatureRiseF: 40.6 },
  ];
  it('falls back to the mean band (mean and sample SD checked with mathjs) when the loads span less than the setting', () => {
    const band = fitBand(nearlySame, { minLoadSpread: 5 });
    expect(band.kind).toBe('mean');
    expect(band.interceptF).toBeCloseTo(Number(math.mean([40.1, 41.3, 40.6])), 12);
    expect(band.residualSdF).toBeCloseTo(Number(math.std([40.1, 41.3, 40.6])), 12);
  });
  it('fits the sloping line when the loads span at least the setting', () => {
    expect(fitBand(nearlySame, { minLoadSpread: 0.5 }).kind).toBe('regression');
    expect(fitBand(nearlySame).kind).toBe('regression');
  });
  it('refuses a negative spread', () => {
    expect(() => fitBand(nearlySame, { minLoadSpread: -1 })).toThrow(RangeError);
  });
  it('states the settings actually used', () => {
    const text = driftRuleText({ confidence: 0.9, marginF: 5, minLoadSpread: 5, loadName: 'mean speed', loadUnit: 'rpm' });
    expect(text).toMatch(/90 % prediction interval/);
    expect(text).toMatch(/more than 5 \u00b0F above the top of the band/);
    expect(text).toMatch(/spans less than 5 rpm \(comparable mean speed\)/);
    expect(driftRuleText({ marginF: 3 })).toMatch(/more than 3 \u00b0F/);
  });
});

describe('a season judged run by run (driftHistory)', () => {
  // Synthetic season at one speed: rises of about 41 °F, one run at 80 °F (the warm bearing).
  const season = [
    { id: 'may', load: 74.4, temperatureRiseF: 40.8 },
    { id: 'jun', load: 74.6, temperatureRiseF: 41.6 },
    { id: 'jul', load: 74.5, temperatureRiseF: 40.2 },
    { id: 'aug', load: 74.7, temperatureRiseF: 80.3 },
    { id: 'sep', load: 74.5, temperatureRiseF: 41.9 },
    { id: 'oct', load: 74.3, temperatureRiseF: 40.5 },
  ];
  const verdicts = driftHistory(season, { minLoadSpread: 5 });

  it('flags the run above the band and no other', () => {
    expect(verdicts.filter((v) => v.check?.drift).map((v) => v.id)).toEqual(['aug']);
    expect(verdicts[0].check).toBeNull();
  });

  it('leaves the flagged run out of the later bands', () => {
    const sep = verdicts.find((v) => v.id === 'sep')!;
    expect(sep.historyRuns).toBe(3);
    expect(sep.band!.interceptF).toBeCloseTo(Number(math.mean([40.8, 41.6, 40.2])), 12);
  });

  it('would have hidden a second hot run if the first were kept in the band (why it is left out)', () => {
    const band = fitBand(season.slice(0, 4), { minLoadSpread: 5 });
    expect(isDrift({ load: 74.5, temperatureRiseF: 60 }, band)).toBe(false);
    expect(verdicts.length).toBe(6);
    const withoutAug = fitBand(season.slice(0, 3), { minLoadSpread: 5 });
    expect(isDrift({ load: 74.5, temperatureRiseF: 60 }, withoutAug)).toBe(true);
  });
});
