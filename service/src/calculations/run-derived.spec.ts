import { revolutionsFromSpeedRecord, runningSeconds } from './run-derived.js';

const t0 = Date.UTC(2026, 5, 1, 10, 0, 0);
const min = 60_000;

describe('revolutions from the speed record', () => {
  it('a steady 75 rpm for two hours is 9,000 revolutions (rpm × minutes; common practice, no source)', () => {
    const samples = Array.from({ length: 9 }, (_, i) => ({ takenAtMs: t0 + i * 15 * min, speedRpm: 75 }));
    expect(revolutionsFromSpeedRecord(samples, t0, t0 + 120 * min)).toBeCloseTo(9000, 6);
  });
  it('a linear run-up from 0 to 60 rpm over 10 minutes turns 300 revolutions (area of a triangle)', () => {
    const samples = [
      { takenAtMs: t0, speedRpm: 0 },
      { takenAtMs: t0 + 10 * min, speedRpm: 60 },
    ];
    expect(revolutionsFromSpeedRecord(samples, t0, t0 + 10 * min)).toBeCloseTo(300, 6);
  });
  it('clips to the run window and holds the nearest speed outside the samples', () => {
    const samples = [{ takenAtMs: t0 + 5 * min, speedRpm: 70 }];
    expect(revolutionsFromSpeedRecord(samples, t0, t0 + 10 * min)).toBeCloseTo(700, 6);
    expect(revolutionsFromSpeedRecord(samples, t0, t0)).toBe(0);
  });
  it('ignores impossible negative speeds', () => {
    const samples = [
      { takenAtMs: t0, speedRpm: 60 },
      { takenAtMs: t0 + 5 * min, speedRpm: -5 },
      { takenAtMs: t0 + 10 * min, speedRpm: 60 },
    ];
    expect(revolutionsFromSpeedRecord(samples, t0, t0 + 10 * min)).toBeCloseTo(600, 6);
  });
});

describe('running time', () => {
  it('counts from start to stop, or to now while running', () => {
    const start = new Date(t0);
    expect(runningSeconds(start, new Date(t0 + 90 * min))).toBe(5400);
    expect(runningSeconds(start, null, new Date(t0 + 60_000))).toBe(60);
    expect(runningSeconds(null, null)).toBe(0);
  });
});
