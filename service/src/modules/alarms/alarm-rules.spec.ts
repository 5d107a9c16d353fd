/**
 * Limits here are per-point settings chosen for the test (not from a source). What is checked is the
 * product's stated threshold rule (strictly above raises, strictly below limit − deadband clears),
 * arithmetic done by hand beside each case, and unit conversions against mathjs (npm reference library).
 */
import { create, all } from 'mathjs';
import { mawpInPointUnit } from '../../calculations/units.js';
import {
  ALARM_CAUTION,
  ALARM_CONDITION_KINDS,
  type AlarmConditionKind,
  type ConditionDecision,
  type EngineLimits,
  type EvaluateReadingContext,
  type MeasurementPointSettings,
  type PointReading,
  decideHighSide,
  decideLowSide,
  evaluateReading,
  priorityOf,
  riseRatePerMinute,
  validateReadingValue,
} from './alarm-rules.js';

const math = create(all);
/** mathjs's psi factor is truncated, so compare with a relative tolerance. */
const expectRelClose = (actual: number | null, expected: number, rel = 1e-9) => {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected) / Math.abs(expected)).toBeLessThan(rel);
};

const T0 = Date.parse('2024-06-01T10:00:00Z');
const at = (minutes: number) => new Date(T0 + minutes * 60_000);

const ENGINE: EngineLimits = { maximumAllowableWorkingPressurePsig: 150, overspeedRpm: 85 };

const BEARING: MeasurementPointSettings = {
  id: 'brg-1',
  name: 'Main bearing, crank side',
  kind: 'bearing_temperature',
  unit: '°F',
  highLimit: 140,
  highHighLimit: 160,
};

function reading(pointId: string, value: number, minutes = 0): PointReading {
  return { pointId, value, takenAt: at(minutes) };
}

function evaluate(
  point: MeasurementPointSettings,
  value: number,
  extra: Partial<Omit<EvaluateReadingContext, 'point' | 'reading'>> & { minutes?: number } = {},
): ConditionDecision[] {
  const { minutes = 0, ...rest } = extra;
  return evaluateReading({
    point,
    engine: ENGINE,
    reading: reading(point.id, value, minutes),
    recentHistory: [],
    activeConditions: [],
    ...rest,
  });
}

function decision(list: ConditionDecision[], kind: AlarmConditionKind): ConditionDecision {
  const d = list.find((x) => x.kind === kind);
  if (!d) throw new Error(`no decision for ${kind}: ${JSON.stringify(list.map((x) => x.kind))}`);
  return d;
}

describe('priorityOf', () => {
  it('high-high, above MAWP and overspeed are high-high priority; the rest high (product rule)', () => {
    const expected: Record<AlarmConditionKind, string> = {
      high: 'high',
      high_high: 'high_high',
      low: 'high',
      rate_of_rise: 'high',
      above_ambient: 'high',
      above_mawp: 'high_high',
      overspeed: 'high_high',
    };
    for (const kind of ALARM_CONDITION_KINDS) expect(priorityOf(kind)).toBe(expected[kind]);
    expect(ALARM_CONDITION_KINDS).toHaveLength(7);
  });
});

describe('threshold rule (product rule: a limit is the last acceptable value)', () => {
  it('high side: raise strictly above, clear strictly below limit − deadband, else hold', () => {
    expect(decideHighSide(false, 140, 140, 2)).toBe('hold');
    expect(decideHighSide(false, 140.01, 140, 2)).toBe('raise');
    expect(decideHighSide(true, 138, 140, 2)).toBe('hold'); // exactly at 140 − 2
    expect(decideHighSide(true, 137.99, 140, 2)).toBe('clear');
    expect(decideHighSide(true, 150, 140, 2)).toBe('hold'); // already active: never raised twice
    expect(decideHighSide(false, 100, 140, 2)).toBe('hold'); // not active: never cleared
  });
  it('low side mirrors it', () => {
    expect(decideLowSide(false, 5, 5, 1)).toBe('hold');
    expect(decideLowSide(false, 4.99, 5, 1)).toBe('raise');
    expect(decideLowSide(true, 6, 5, 1)).toBe('hold');
    expect(decideLowSide(true, 6.01, 5, 1)).toBe('clear');
  });
});

describe('high limit', () => {
  it('just below, at and just above 140 °F', () => {
    expect(decision(evaluate(BEARING, 139.9), 'high').action).toBe('hold');
    expect(decision(evaluate(BEARING, 140), 'high').action).toBe('hold');
    const above = decision(evaluate(BEARING, 140.1), 'high');
    expect(above.action).toBe('raise');
    expect(above.priority).toBe('high');
    expect(above.limit).toBe(140);
    expect(above.value).toBe(140.1);
  });
  it('writes a plain message', () => {
    expect(decision(evaluate(BEARING, 148), 'high').message).toBe('Main bearing, crank side 148 °F is above its high limit 140 °F.');
  });
  it('does not raise again while active, and clears below the limit when there is no deadband', () => {
    expect(decision(evaluate(BEARING, 150, { activeConditions: ['high'] }), 'high').action).toBe('hold');
    expect(decision(evaluate(BEARING, 140, { activeConditions: ['high'] }), 'high').action).toBe('hold');
    expect(decision(evaluate(BEARING, 139.9, { activeConditions: ['high'] }), 'high').action).toBe('clear');
  });
  it('accepts the active set as a Set too', () => {
    expect(decision(evaluate(BEARING, 150, { activeConditions: new Set(['high'] as const) }), 'high').action).toBe('hold');
  });
});

describe('deadband', () => {
  const point: MeasurementPointSettings = { ...BEARING, highHighLimit: null, deadband: 2 };

  it('an active high alarm holds down to 140 − 2 = 138 °F and clears below it', () => {
    expect(decision(evaluate(point, 138.5, { activeConditions: ['high'] }), 'high').action).toBe('hold');
    expect(decision(evaluate(point, 138, { activeConditions: ['high'] }), 'high').action).toBe('hold');
    const cleared = decision(evaluate(point, 137.9, { activeConditions: ['high'] }), 'high');
    expect(cleared.action).toBe('clear');
    expect(cleared.message).toContain('138 °F');
  });

  it('a value oscillating between limit − deadband/2 and limit + deadband/2 raises once and never clears', () => {
    const active = new Set<AlarmConditionKind>();
    const actions: string[] = [];
    for (let i = 0; i < 20; i++) {
      const value = i % 2 === 0 ? 141 : 139; // 140 ± 2/2
      const d = decision(evaluate(point, value, { activeConditions: active, minutes: i }), 'high');
      actions.push(d.action);
      if (d.action === 'raise') active.add('high');
      if (d.action === 'clear') active.delete('high');
    }
    expect(actions.filter((a) => a === 'raise')).toHaveLength(1);
    expect(actions.filter((a) => a === 'clear')).toHaveLength(0);
    expect(active.has('high')).toBe(true);
  });

  it('without a deadband the same oscillation chatters (shows what the deadband prevents)', () => {
    const noDeadband: MeasurementPointSettings = { ...point, deadband: 0 };
    const active = new Set<AlarmConditionKind>();
    let raises = 0;
    for (let i = 0; i < 20; i++) {
      const d = decision(evaluate(noDeadband, i % 2 === 0 ? 141 : 139, { activeConditions: active }), 'high');
      if (d.action === 'raise') {
        raises++;
        active.add('high');
      }
      if (d.action === 'clear') active.delete('high');
    }
    expect(raises).toBe(10);
  });
});

describe('high-high limit', () => {
  it('just below, at and just above 160 °F; high-high priority', () => {
    expect(decision(evaluate(BEARING, 159.9), 'high_high').action).toBe('hold');
    expect(decision(evaluate(BEARING, 160), 'high_high').action).toBe('hold');
    const list = evaluate(BEARING, 160.1);
    expect(decision(list, 'high_high').action).toBe('raise');
    expect(decision(list, 'high_high').priority).toBe('high_high');
    expect(decision(list, 'high').action).toBe('raise'); // both limits are exceeded
    expect(decision(list, 'high_high').message).toBe('Main bearing, crank side 160.1 °F is above its high-high limit 160 °F.');
  });
});

describe('low limit', () => {
  const oil: MeasurementPointSettings = {
    id: 'oil-1',
    name: 'Oil header pressure',
    kind: 'oil_pressure',
    unit: 'psig',
    lowLimit: 5,
    deadband: 1,
  };
  it('just above, at and just below 5 psig', () => {
    expect(decision(evaluate(oil, 5.1), 'low').action).toBe('hold');
    expect(decision(evaluate(oil, 5), 'low').action).toBe('hold');
    const d = decision(evaluate(oil, 4.9), 'low');
    expect(d.action).toBe('raise');
    expect(d.message).toBe('Oil header pressure 4.9 psig is below its low limit 5 psig.');
  });
  it('clears only above 5 + 1 = 6 psig', () => {
    expect(decision(evaluate(oil, 6, { activeConditions: ['low'] }), 'low').action).toBe('hold');
    expect(decision(evaluate(oil, 6.1, { activeConditions: ['low'] }), 'low').action).toBe('clear');
  });
  it('works for vacuum in inHg', () => {
    const vac: MeasurementPointSettings = { id: 'v', name: 'Condenser vacuum', kind: 'vacuum', unit: 'inHg', lowLimit: 22 };
    expect(decision(evaluate(vac, 22), 'low').action).toBe('hold');
    expect(decision(evaluate(vac, 21.9), 'low').action).toBe('raise');
  });
});

describe('rate of rise', () => {
  const point: MeasurementPointSettings = { ...BEARING, highLimit: null, highHighLimit: null, maxRiseRatePerMin: 2 };
  const history = (...pairs: Array<[number, number]>) => pairs.map(([min, v]) => reading(point.id, v, min));

  it('over a 5-min window: (130 − 120)/5 = 2 °F/min is at the limit; 2.1 raises; 1.9 holds (arithmetic by hand)', () => {
    const at2 = decision(evaluate(point, 130, { minutes: 5, recentHistory: history([0, 120]) }), 'rate_of_rise');
    expect(at2.evaluated).toBe(true);
    expect(at2.value).toBeCloseTo(2, 12);
    expect(at2.action).toBe('hold');
    const above = decision(evaluate(point, 130.5, { minutes: 5, recentHistory: history([0, 120]) }), 'rate_of_rise');
    expect(above.value).toBeCloseTo(2.1, 12);
    expect(above.action).toBe('raise');
    expect(above.unit).toBe('°F/min');
    expect(above.message).toBe(
      'Main bearing, crank side is rising at 2.1 °F/min over the last 5 min (120 °F to 130.5 °F), above its limit 2 °F/min.',
    );
    const below = decision(evaluate(point, 129.5, { minutes: 5, recentHistory: history([0, 120]) }), 'rate_of_rise');
    expect(below.value).toBeCloseTo(1.9, 12);
    expect(below.action).toBe('hold');
  });

  it('uses the oldest reading inside the window, ignoring older ones and other points', () => {
    // 100 °F at −1 min is outside a 5-min window ending at +5; oldest inside is 120 °F at 0.
    const hist = [...history([-1, 100], [3, 125], [0, 120]), reading('other-point', 0, 1)];
    const r = riseRatePerMinute(reading(point.id, 126, 5), hist, 5, 1);
    expect(r).not.toBeNull();
    expect(r!.fromValue).toBe(120);
    expect(r!.spanMinutes).toBeCloseTo(5, 12);
    expect(r!.ratePerMin).toBeCloseTo(1.2, 12); // (126 − 120)/5
  });

  it('is not evaluated with fewer than 2 points or a span under 1 min', () => {
    const alone = decision(evaluate(point, 150, { minutes: 5 }), 'rate_of_rise');
    expect(alone.evaluated).toBe(false);
    expect(alone.action).toBe('hold');
    // 30 s apart: a 10 °F jump would be 20 °F/min, but the span is too short to judge.
    const short = decision(evaluate(point, 130, { minutes: 5, recentHistory: history([4.5, 120]) }), 'rate_of_rise');
    expect(short.evaluated).toBe(false);
    expect(short.action).toBe('hold');
    // Exactly 1 min apart is enough: (123 − 120)/1 = 3 °F/min.
    const oneMin = decision(evaluate(point, 123, { minutes: 5, recentHistory: history([4, 120]) }), 'rate_of_rise');
    expect(oneMin.evaluated).toBe(true);
    expect(oneMin.value).toBeCloseTo(3, 12);
    expect(oneMin.action).toBe('raise');
  });

  it('a data gap does not clear an active rate alarm', () => {
    const d = decision(evaluate(point, 120, { minutes: 5, activeConditions: ['rate_of_rise'] }), 'rate_of_rise');
    expect(d.action).toBe('hold');
  });

  it('clears when the rate falls below the limit', () => {
    const d = decision(
      evaluate(point, 124, { minutes: 5, recentHistory: history([0, 120]), activeConditions: ['rate_of_rise'] }),
      'rate_of_rise',
    );
    expect(d.value).toBeCloseTo(0.8, 12); // (124 − 120)/5
    expect(d.action).toBe('clear');
  });

  it('a wider window serves hand readings taken every 10–15 min', () => {
    // (150 − 120)/12 = 2.5 °F/min; out of reach of the default 5-min window.
    const hist = history([0, 120]);
    expect(decision(evaluate(point, 150, { minutes: 12, recentHistory: hist }), 'rate_of_rise').evaluated).toBe(false);
    const wide = decision(evaluate(point, 150, { minutes: 12, recentHistory: hist, rateWindowMinutes: 15 }), 'rate_of_rise');
    expect(wide.value).toBeCloseTo(2.5, 12);
    expect(wide.action).toBe('raise');
  });
});

describe('rise above ambient (bearing temperatures)', () => {
  const point: MeasurementPointSettings = {
    ...BEARING,
    highLimit: null,
    highHighLimit: null,
    maxRiseAboveAmbient: 50,
    deadband: 2,
  };
  it('ambient 70 °F, allowed 50 °F: 119.9 and 120 hold, 120.1 raises (arithmetic by hand)', () => {
    expect(decision(evaluate(point, 119.9, { ambientTemperature: 70 }), 'above_ambient').action).toBe('hold');
    const at = decision(evaluate(point, 120, { ambientTemperature: 70 }), 'above_ambient');
    expect(at.value).toBeCloseTo(50, 12);
    expect(at.action).toBe('hold');
    const above = decision(evaluate(point, 120.1, { ambientTemperature: 70 }), 'above_ambient');
    expect(above.action).toBe('raise');
    expect(above.value).toBeCloseTo(50.1, 12);
    expect(above.message).toBe('Main bearing, crank side 120.1 °F is 50.1 °F above ambient 70 °F, more than the allowed 50 °F.');
  });
  it('clears only when the rise is below 50 − 2 = 48 °F', () => {
    const active: AlarmConditionKind[] = ['above_ambient'];
    expect(decision(evaluate(point, 118.5, { ambientTemperature: 70, activeConditions: active }), 'above_ambient').action).toBe('hold');
    expect(decision(evaluate(point, 117.9, { ambientTemperature: 70, activeConditions: active }), 'above_ambient').action).toBe('clear');
  });
  it('is not evaluated without an ambient reading', () => {
    const d = decision(evaluate(point, 200), 'above_ambient');
    expect(d.evaluated).toBe(false);
    expect(d.action).toBe('hold');
  });
  it('does not apply to other kinds of point', () => {
    const amb = { ...point, kind: 'oil_feed_rate' as const };
    expect(evaluate(amb, 200, { ambientTemperature: 70 }).some((d) => d.kind === 'above_ambient')).toBe(false);
  });
});

describe('above maximum allowable working pressure', () => {
  const throttle: MeasurementPointSettings = { id: 'thr', name: 'Throttle pressure', kind: 'throttle_pressure', unit: 'psig' };

  it('MAWP 150 psig: 149.9 and 150 hold, 150.1 raises at high-high priority', () => {
    expect(decision(evaluate(throttle, 149.9), 'above_mawp').action).toBe('hold');
    expect(decision(evaluate(throttle, 150), 'above_mawp').action).toBe('hold');
    const d = decision(evaluate(throttle, 150.1), 'above_mawp');
    expect(d.action).toBe('raise');
    expect(d.priority).toBe('high_high');
    expect(d.message).toBe('Throttle pressure 150.1 psig is above the maximum allowable working pressure 150 psig.');
  });

  it('applies to the receiver too, and not to other points', () => {
    const receiver = { ...throttle, id: 'rcv', kind: 'receiver_pressure' as const };
    expect(decision(evaluate(receiver, 151), 'above_mawp').action).toBe('raise');
    expect(evaluate({ ...throttle, kind: 'oil_pressure' }, 500).some((d) => d.kind === 'above_mawp')).toBe(false);
  });

  it('converts the limit for a psia gauge: 150 psig + 1 atm in psi (mathjs)', () => {
    const limitPsia = 150 + math.unit(1, 'atm').toNumber('psi');
    expectRelClose(mawpInPointUnit(150, 'psia'), limitPsia);
    const psia = { ...throttle, unit: 'psia' };
    expect(decision(evaluate(psia, limitPsia - 0.05), 'above_mawp').action).toBe('hold');
    expect(decision(evaluate(psia, limitPsia + 0.05), 'above_mawp').action).toBe('raise');
  });

  it('converts the limit for a kPa gauge: 150 psi in kPa (mathjs)', () => {
    const limitKpa = math.unit(150, 'psi').toNumber('kPa');
    expectRelClose(mawpInPointUnit(150, 'kPa'), limitKpa);
    const kpa = { ...throttle, unit: 'kPa' };
    expect(decision(evaluate(kpa, limitKpa - 0.1), 'above_mawp').action).toBe('hold');
    expect(decision(evaluate(kpa, limitKpa + 0.1), 'above_mawp').action).toBe('raise');
    const abs = math.unit(150, 'psi').toNumber('kPa') + math.unit(1, 'atm').toNumber('kPa');
    expectRelClose(mawpInPointUnit(150, 'kPa abs'), abs);
  });

  it('checks a point measured in bar (gauge): 150 psi in bar (mathjs) is its MAWP limit', () => {
    // Before the unit rules were merged, 'bar' was no pressure unit to the alarm rules: no MAWP check at all.
    const limitBar = math.unit(150, 'psi').toNumber('bar');
    expectRelClose(mawpInPointUnit(150, 'bar'), limitBar);
    const bar = { ...throttle, unit: 'bar' };
    const below = decision(evaluate(bar, limitBar - 0.01), 'above_mawp');
    expect(below.evaluated).toBe(true);
    expect(below.action).toBe('hold');
    expect(decision(evaluate(bar, limitBar + 0.01), 'above_mawp').action).toBe('raise');
  });

  it('says so instead of guessing when the unit cannot be compared', () => {
    const d = decision(evaluate({ ...throttle, unit: 'furlongs' }, 999), 'above_mawp');
    expect(d.evaluated).toBe(false);
    expect(d.action).toBe('hold');
    expect(d.message).toContain('cannot be compared');
  });

  it('clears below MAWP less the deadband', () => {
    const p = { ...throttle, deadband: 3 };
    expect(decision(evaluate(p, 147, { activeConditions: ['above_mawp'] }), 'above_mawp').action).toBe('hold');
    expect(decision(evaluate(p, 146.9, { activeConditions: ['above_mawp'] }), 'above_mawp').action).toBe('clear');
  });

  it('exports a caution that defers to law and licensed practice', () => {
    expect(ALARM_CAUTION).toMatch(/qualified crew/);
    expect(ALARM_CAUTION).toMatch(/licensed practice/);
  });
});

describe('overspeed', () => {
  const speed: MeasurementPointSettings = { id: 'spd', name: 'Engine speed', kind: 'speed', unit: 'rpm', deadband: 2 };
  it('overspeed 85 rpm: 84.9 and 85 hold, 85.1 raises at high-high priority', () => {
    expect(decision(evaluate(speed, 84.9), 'overspeed').action).toBe('hold');
    expect(decision(evaluate(speed, 85), 'overspeed').action).toBe('hold');
    const d = decision(evaluate(speed, 85.1), 'overspeed');
    expect(d.action).toBe('raise');
    expect(d.priority).toBe('high_high');
    expect(d.message).toBe('Engine speed 85.1 rpm is above the overspeed limit 85 rpm.');
  });
  it('clears below 85 − 2 = 83 rpm', () => {
    expect(decision(evaluate(speed, 83, { activeConditions: ['overspeed'] }), 'overspeed').action).toBe('hold');
    expect(decision(evaluate(speed, 82.9, { activeConditions: ['overspeed'] }), 'overspeed').action).toBe('clear');
  });
});

describe('conditions without a limit', () => {
  it('a point with no limits yields no decisions', () => {
    const p: MeasurementPointSettings = { id: 'x', name: 'Oil feed', kind: 'oil_feed_rate', unit: 'drops/min' };
    expect(evaluate(p, 60)).toEqual([]);
  });
  it('an active condition whose limit was removed is cleared', () => {
    const d = decision(evaluate({ ...BEARING, highLimit: null }, 150, { activeConditions: ['high'] }), 'high');
    expect(d.action).toBe('clear');
    expect(d.limit).toBeNull();
  });
});

describe('validateReadingValue', () => {
  const p = (unit: string, kind: MeasurementPointSettings['kind'] = 'other'): MeasurementPointSettings => ({
    id: 'p',
    name: 'Gauge',
    kind,
    unit,
  });

  it('refuses non-finite values', () => {
    expect(validateReadingValue(p('psig'), Number.NaN)).not.toBeNull();
    expect(validateReadingValue(p('psig'), Number.POSITIVE_INFINITY)).not.toBeNull();
  });

  it('absolute pressure cannot be negative (psia, kPa abs)', () => {
    expect(validateReadingValue(p('psia'), 0)).toBeNull();
    expect(validateReadingValue(p('psia'), -0.1)).toMatch(/negative/);
    expect(validateReadingValue(p('kPa abs'), -0.1)).toMatch(/negative/);
  });

  it('a gauge pressure cannot be below a perfect vacuum, one atmosphere below zero (mathjs atm → psi, kPa)', () => {
    const atmPsi = math.unit(1, 'atm').toNumber('psi');
    expect(validateReadingValue(p('psig'), -atmPsi + 0.01)).toBeNull();
    expect(validateReadingValue(p('psig'), -atmPsi - 0.01)).toMatch(/vacuum/);
    const atmKpa = math.unit(1, 'atm').toNumber('kPa');
    expect(validateReadingValue(p('kPa'), -atmKpa + 0.01)).toBeNull();
    expect(validateReadingValue(p('kPa'), -atmKpa - 0.01)).toMatch(/vacuum/);
  });

  it('a point in bar gets the same check: one atmosphere is 1.01325 bar (mathjs atm → bar)', () => {
    const atmBar = math.unit(1, 'atm').toNumber('bar');
    expect(validateReadingValue(p('bar'), -atmBar + 0.001)).toBeNull();
    expect(validateReadingValue(p('bar'), -atmBar - 0.001)).toMatch(/vacuum/);
  });

  it('vacuum in inHg must be 0..30; a standard atmosphere is just under 30 inHg (mathjs atm → mmHg ÷ 25.4)', () => {
    const atmInHg = math.unit(1, 'atm').toNumber('mmHg') / 25.4;
    expect(atmInHg).toBeLessThan(30);
    expect(validateReadingValue(p('inHg', 'vacuum'), 0)).toBeNull();
    expect(validateReadingValue(p('inHg', 'vacuum'), 30)).toBeNull();
    expect(validateReadingValue(p('inHg', 'vacuum'), 30.1)).not.toBeNull();
    expect(validateReadingValue(p('inHg', 'vacuum'), -0.1)).not.toBeNull();
  });

  it('temperature sensor range −40..600 °F', () => {
    expect(validateReadingValue(p('°F'), -40)).toBeNull();
    expect(validateReadingValue(p('°F'), 600)).toBeNull();
    expect(validateReadingValue(p('°F'), -40.1)).not.toBeNull();
    expect(validateReadingValue(p('°F'), 600.1)).not.toBeNull();
  });

  it('the same band in °C: −40 °C = −40 °F, 600 °F = 315.56 °C (mathjs degF → degC)', () => {
    const maxC = math.unit(600, 'degF').toNumber('degC');
    expect(math.unit(-40, 'degC').toNumber('degF')).toBeCloseTo(-40, 9);
    expect(validateReadingValue(p('°C'), -40)).toBeNull();
    expect(validateReadingValue(p('°C'), -40.1)).not.toBeNull();
    expect(validateReadingValue(p('°C'), maxC - 0.01)).toBeNull();
    expect(validateReadingValue(p('°C'), maxC + 0.01)).not.toBeNull();
  });

  it('speed 0..1000 rpm', () => {
    expect(validateReadingValue(p('rpm', 'speed'), 0)).toBeNull();
    expect(validateReadingValue(p('rpm', 'speed'), 1000)).toBeNull();
    expect(validateReadingValue(p('rpm', 'speed'), -1)).not.toBeNull();
    expect(validateReadingValue(p('rpm', 'speed'), 1000.1)).not.toBeNull();
  });

  it('leaves other units alone', () => {
    expect(validateReadingValue(p('drops/min', 'oil_feed_rate'), 12)).toBeNull();
  });
});
