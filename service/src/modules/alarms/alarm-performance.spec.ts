/**
 * Alarm-system figures against hand counts; chattering per ISA-18.2 TR5's "three or more in one minute" (from
 * memory) as the default; the deadband suggestion is the product's rule (common practice, no source).
 */
import { alarmFigureRows, alarmFigures, detectChattering, suggestDeadband, type Annunciation } from './alarm-performance.js';

const T0 = Date.parse('2026-06-13T10:00:00Z');
const at = (min: number) => new Date(T0 + min * 60_000);
/** n alarms spread inside the 10-minute period starting at `startMin`. */
const burst = (startMin: number, n: number, key = 'MB2 · High'): Annunciation[] =>
  Array.from({ length: n }, (_, i) => ({ at: at(startMin + (i * 9) / Math.max(1, n)), key }));

describe('alarm figures', () => {
  // A constructed 60-minute run: 3, 12, 11, 1, 1, 1 alarms in the six 10-minute periods.
  const ann = [
    ...burst(0, 3, 'A'),
    ...burst(10, 12, 'B'),
    ...burst(20, 11, 'C'),
    ...burst(30, 1, 'A'),
    ...burst(40, 1, 'A'),
    ...burst(50, 1, 'D'),
  ];
  const f = alarmFigures(
    { from: at(0), to: at(60) },
    ann,
    [
      { key: 'B', raisedAt: at(-20), endedAt: null },
      { key: 'C', raisedAt: at(20), endedAt: at(30) },
    ],
    [],
    2,
  );

  it('matches the hand counts: 29 alarms, 4.83 per 10 min, peak 12, two floods, 20 of 60 minutes in flood', () => {
    expect(f.total).toBe(29);
    expect(f.averagePerTenMinutes).toBeCloseTo(290 / 60, 9);
    expect(f.peakPerTenMinutes).toBe(12);
    expect(f.floods).toBe(2);
    expect(f.floodSharePercent).toBeCloseTo((100 * 20) / 60, 9);
    expect(f.topTen.map((x) => [x.key, x.count])).toEqual([
      ['B', 12],
      ['C', 11],
      ['A', 5],
      ['D', 1],
    ]);
    // Active over 60 min (the default): B from 20 min before the start to the end, 80 min.
    expect(f.stale).toEqual([{ key: 'B', minutes: 80 }]);
    expect(f.standingAtStart).toBe(2);
  });

  it('exactly 10 in a period is not a flood; a short last period counts only its own minutes', () => {
    const g = alarmFigures(
      { from: at(0), to: at(15) },
      [...burst(0, 10), ...Array.from({ length: 11 }, (_, i) => ({ at: at(10 + i * 0.4), key: 'X' }))],
      [],
      [],
      0,
    );
    expect(g.floods).toBe(1);
    expect(g.floodSharePercent).toBeCloseTo((100 * 5) / 15, 9);
  });

  it('the log sheet rows say which targets are met', () => {
    const rows = alarmFigureRows(f);
    expect(rows.find((r) => r.label.startsWith('Floods'))).toMatchObject({ value: '2', met: false });
    expect(rows.find((r) => r.label === 'Alarms per 10 min, peak')).toMatchObject({ value: '12', target: '≤ 10', met: false });
    expect(rows.find((r) => r.label === 'Standing alarms at start')).toMatchObject({ value: '2', met: false });
  });
});

describe('chattering', () => {
  it('three activations inside one minute is chattering; two is not; the window is a setting', () => {
    expect(detectChattering([at(0), at(0.4), at(0.9)])).toEqual({ chattering: true, worst: 3 });
    expect(detectChattering([at(0), at(0.9), at(2)])).toEqual({ chattering: false, worst: 2 });
    expect(detectChattering([at(0), at(4), at(8), at(12)], { maxActivations: 3, windowMinutes: 15 })).toEqual({
      chattering: true,
      worst: 4,
    });
  });

  it('suggests the deadband that would have held the alarm in: deepest clearing dip 130 − 127.2 = 2.8 → 3.0', () => {
    expect(suggestDeadband([129.5, 127.2, 128.9], 130, 'high')).toBe(3);
    expect(suggestDeadband([8.4, 9.1], 8, 'low')).toBe(1.5);
    expect(suggestDeadband([], 130, 'high')).toBeNull();
  });
});

describe('season figures', () => {
  it('add the runs: two 30-minute runs with 12 and 2 alarms → 14 in 60 min, one flood, 10 of 60 min in flood', () => {
    const runs = [
      { from: at(0), to: at(30) },
      { from: at(600), to: at(630) },
    ];
    const ann = [...burst(0, 12), ...burst(600, 2)];
    const f = alarmFigures(runs, ann, [], [], 0);
    expect(f.total).toBe(14);
    expect(f.minutes).toBe(60);
    expect(f.averagePerTenMinutes).toBeCloseTo(14 / 6, 9);
    expect(f.floods).toBe(1);
    expect(f.floodSharePercent).toBeCloseTo((100 * 10) / 60, 9);
  });
});
