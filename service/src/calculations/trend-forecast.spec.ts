/**
 * Constructed series with known crossing times (worked by hand beside each case). The 10 % tolerance is the
 * product's acceptance figure; Theil–Sen and Kendall's tau after Theil (1950) and Sen (JASA 63, 1968).
 */
import { FORECAST_DEFAULTS, forecastTimeToLimit, kendallTau, theilSen, thinEvenly, type TimedValue } from './trend-forecast.js';

/** Readings every 30 s from t0 to t1 (minutes). */
function series(t0: number, t1: number, f: (t: number) => number): TimedValue[] {
  const out: TimedValue[] = [];
  for (let t = t0; t <= t1 + 1e-9; t += 0.5) out.push({ tMin: t, value: f(t) });
  return out;
}
const within10 = (got: number | undefined, truth: number) => {
  expect(got).toBeDefined();
  expect(Math.abs((got as number) - truth) / truth).toBeLessThan(0.1);
};

describe('Theil–Sen and Kendall tau', () => {
  it('recover a straight line exactly and ignore one wild reading', () => {
    const pts = series(0, 5, (t) => 100 + 2 * t);
    pts[4] = { ...pts[4], value: 400 };
    const fit = theilSen(pts)!;
    expect(fit.slopePerMin).toBeCloseTo(2, 9);
    expect(fit.intercept).toBeCloseTo(100, 9);
    expect(kendallTau(series(0, 5, (t) => t))).toBe(1);
  });
});

describe('time to the limit', () => {
  it('linear rise: 100 + 2t °F, high-high 145, now t = 10 → (145 − 120) / 2 = 12.5 min', () => {
    const f = forecastTimeToLimit(
      series(0, 10, (t) => 100 + 2 * t),
      10,
      145,
      'high',
    );
    within10(f?.minutesToLimit, 12.5);
    expect(f?.ratePerMin).toBeCloseTo(2, 6);
  });

  it('exponential approach: 200 − 130·e^(−t/30), limit 145, crossing at 30·ln(130/55) = 25.81 min; now 18 → 7.81 min', () => {
    const truth = 30 * Math.log(130 / 55) - 18;
    const f = forecastTimeToLimit(
      series(0, 18, (t) => 200 - 130 * Math.exp(-t / 30)),
      18,
      145,
      'high',
    );
    within10(f?.minutesToLimit, truth);
  });

  it('exponential run-away: 60 + 10·e^(t/10), limit 145, crossing at 10·ln 8.5 = 21.40 min; now 15 → 6.40 min', () => {
    const truth = 10 * Math.log(8.5) - 15;
    const f = forecastTimeToLimit(
      series(0, 15, (t) => 60 + 10 * Math.exp(t / 10)),
      15,
      145,
      'high',
    );
    within10(f?.minutesToLimit, truth);
  });

  it('falling pressure toward a low limit: 30 − 1.5t psig, low 8, now 10 → (15 − 8) / 1.5 = 4.67 min', () => {
    within10(
      forecastTimeToLimit(
        series(0, 10, (t) => 30 - 1.5 * t),
        10,
        8,
        'low',
      )?.minutesToLimit,
      7 / 1.5,
    );
  });

  it('no forecast on noise around a steady value', () => {
    // Deterministic pseudo-random noise ±3 °F about 120 °F (a linear congruential generator, common practice).
    let s = 12345;
    const rnd = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * 6 - 3;
    expect(
      forecastTimeToLimit(
        series(0, 10, () => 120 + rnd()),
        10,
        130,
        'high',
      ),
    ).toBeNull();
  });

  it('no forecast when the approach levels off below the limit, moves away, or has too few readings', () => {
    expect(
      forecastTimeToLimit(
        series(0, 18, (t) => 140 - 70 * Math.exp(-t / 5)),
        18,
        145,
        'high',
      ),
    ).toBeNull();
    expect(
      forecastTimeToLimit(
        series(0, 10, (t) => 130 - t),
        10,
        145,
        'high',
      ),
    ).toBeNull();
    expect(
      forecastTimeToLimit(
        series(8, 10, (t) => 100 + 2 * t),
        10,
        145,
        'high',
      ),
    ).toBeNull();
  });
});

describe('dense windows are thinned evenly before the pairwise fits', () => {
  it('keeps the first and the last and spaces the rest evenly; leaves short lists alone', () => {
    const xs = Array.from({ length: 601 }, (_, i) => i);
    const thin = thinEvenly(xs, 121);
    expect(thin).toHaveLength(121);
    expect(thin[0]).toBe(0);
    expect(thin[120]).toBe(600);
    expect(thin[1]).toBe(5);
    expect(thinEvenly([1, 2, 3], 121)).toEqual([1, 2, 3]);
  });

  it('a one-second logger (601 readings in the window) forecasts the same crossing from at most 120 of them', () => {
    // The same linear rise as above, 100 + 2t °F towards 145, now t = 10: (145 − 120) / 2 = 12.5 min.
    const dense: TimedValue[] = Array.from({ length: 601 }, (_, i) => ({ tMin: i / 60, value: 100 + 2 * (i / 60) }));
    const f = forecastTimeToLimit(dense, 10, 145, 'high');
    within10(f?.minutesToLimit, 12.5);
    expect(f?.readingsUsed).toBe(FORECAST_DEFAULTS.maxReadings);
  });

  it('a wild reading among thousands moves nothing, and only 120 of them are fitted', () => {
    const dense: TimedValue[] = Array.from({ length: 24_000 }, (_, i) => ({ tMin: i / 2400, value: 100 + 2 * (i / 2400) }));
    dense[12_000] = { ...dense[12_000], value: 900 };
    const f = forecastTimeToLimit(dense, 10, 145, 'high');
    within10(f?.minutesToLimit, 12.5);
    expect(f?.readingsUsed).toBe(120); // all 24,000 pairwise would be 288 million slopes
  });
});
