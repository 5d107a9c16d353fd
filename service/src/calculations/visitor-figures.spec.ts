import { horsesFromHorsepower, smallCarEnginesFromHorsepower, smoothedLatestValue, SMALL_CAR_ENGINE_KW } from './visitor-figures.js';

describe('everyday equivalents of the engine power', () => {
  it('one horsepower is one horse by definition (common practice, no source)', () => {
    expect(horsesFromHorsepower(250)).toBe(250);
  });
  it('a small car engine is taken as 75 kW (common practice, no source); 250 hp = 186.4 kW = about 2.5 of them', () => {
    expect(SMALL_CAR_ENGINE_KW).toBe(75);
    // 250 hp × 745.7 W/hp = 186.42 kW (1 hp = 745.69987 W, NIST SP 811, 2008 edition, appendix B.8); / 75 kW = 2.4856
    expect(smallCarEnginesFromHorsepower(250)).toBeCloseTo(2.4856, 3);
    expect(smallCarEnginesFromHorsepower(0)).toBe(0);
  });
});

describe('smoothing the latest readings for the visitors (moving average; common practice, no source)', () => {
  const t0 = Date.UTC(2026, 11, 5, 10, 0, 0);
  it('averages the samples within the window before the newest one and leaves older ones out', () => {
    const samples = [
      { takenAtMs: t0, value: 10 },
      { takenAtMs: t0 + 50_000, value: 70 },
      { takenAtMs: t0 + 55_000, value: 72 },
      { takenAtMs: t0 + 60_000, value: 74 },
    ];
    expect(smoothedLatestValue(samples, 15_000)).toBeCloseTo(72, 9);
    expect(smoothedLatestValue(samples, 120_000)).toBeCloseTo(56.5, 9);
  });
  it('gives the one value when there is one, and null when there is none', () => {
    expect(smoothedLatestValue([{ takenAtMs: t0, value: 5 }], 10_000)).toBe(5);
    expect(smoothedLatestValue([], 10_000)).toBeNull();
    expect(smoothedLatestValue([{ takenAtMs: t0, value: Number.NaN }], 10_000)).toBeNull();
  });
});
