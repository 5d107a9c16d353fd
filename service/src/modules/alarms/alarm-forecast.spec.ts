/** The limit a trend heads for (product rule, common practice, no source); the fit is tested in trend-forecast.spec. */
import { forecastForPoint } from './alarm-forecast.js';

const now = new Date('2026-06-13T10:20:00Z');
const rising = (from: number, perMin: number) =>
  Array.from({ length: 21 }, (_, i) => ({ value: from + perMin * (i * 0.5), takenAt: new Date(now.getTime() - (10 - i * 0.5) * 60_000) }));
const bearing = { kind: 'bearing_temperature' as const, unit: 'degF', highLimit: 130, highHighLimit: 145, lowLimit: null };

describe('forecast for a point', () => {
  it('heads for high first: 110 → 120 °F over 10 min (1 °F/min), high 130 in 10 min, not under the 10-min pre-alarm setting', () => {
    const f = forecastForPoint(bearing, rising(110, 1), now, 10)!;
    expect(f.limitKind).toBe('high');
    expect(f.minutesToLimit).toBeCloseTo(10, 6);
    expect(f.preAlarm).toBe(false);
    expect(f.method).toMatch(/Theil–Sen.*last 10 minutes/);
  });

  it('past high, heads for high-high: 125 → 135 °F, 145 in 10 min; at 12 min setting it is a pre-alarm', () => {
    const f = forecastForPoint(bearing, rising(125, 1), now, 12)!;
    expect(f).toMatchObject({ limitKind: 'high_high', limit: 145, preAlarm: true });
    expect(f.minutesToLimit).toBeCloseTo(10, 6);
  });

  it('none for speed points or a steady reading', () => {
    expect(forecastForPoint({ ...bearing, kind: 'speed' as never }, rising(110, 1), now, 10)).toBeNull();
    expect(forecastForPoint(bearing, rising(110, 0), now, 10)).toBeNull();
  });
});
