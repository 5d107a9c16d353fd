/**
 * Alarm limit evaluation for one measurement point. Pure functions: no clock, no database.
 *
 * Threshold semantics (a product choice, applied the same way to every limit):
 * - A limit is the last acceptable value. A reading exactly AT a high limit is not an alarm; the
 *   condition is raised only when the value is strictly ABOVE it (strictly BELOW for a low limit).
 *   "High limit 140 °F" therefore reads in plain words: 140 is allowed, 140.1 is not.
 * - An active condition returns to normal only when the value is strictly below limit − deadband
 *   (strictly above limit + deadband for a low limit). Between the two the decision is 'hold', so a
 *   value wandering around the limit raises once instead of chattering. The deadband is in the
 *   point's unit, so it applies to the level limits and to the rise above ambient; the rate of rise
 *   (unit per minute, already averaged over its window) clears as soon as it is below its limit.
 * - A condition that is not active never gets 'clear', and an active one never gets 'raise':
 *   'hold' means "leave it as it is".
 * - Where a check cannot be made (too little history for the rate of rise, no ambient reading, a
 *   unit that cannot be compared with the engine's limit) the decision is 'hold' with
 *   `evaluated: false` and a message saying why; a data gap never clears an alarm.
 *
 * All limits are per-point (or per-engine) settings chosen by the chief engineer; none of them
 * comes from a published source.
 */
import type { MeasurementKind } from '@crankjournal/shared-types';
import {
  absoluteKpaOf,
  celsiusToFahrenheit,
  isRpm,
  mawpInPointUnit,
  pressureScaleOf,
  temperatureScaleOf,
  unitLabel,
} from '../../calculations/units.js';

/** Shown beside pressure, speed and bearing alarms. */
export const ALARM_CAUTION =
  'Alarms aid a qualified crew; they do not replace watching the gauges, the safety valves and the ' +
  "bearings, nor local boiler and pressure-vessel law, the insurer's inspections or licensed practice. " +
  'Treat a pressure, overspeed or hot-bearing alarm as real until the crew has checked it.';

/** The kinds of measurement point (one list, in shared-types). */
export type { MeasurementKind };

export type AlarmConditionKind = 'high' | 'high_high' | 'low' | 'rate_of_rise' | 'above_ambient' | 'above_mawp' | 'overspeed';

/** Every condition kind, in the order decisions are returned. */
export const ALARM_CONDITION_KINDS: readonly AlarmConditionKind[] = [
  'high_high',
  'above_mawp',
  'overspeed',
  'high',
  'low',
  'rate_of_rise',
  'above_ambient',
];

export const ALARM_CONDITION_LABELS: Readonly<Record<AlarmConditionKind, string>> = {
  high: 'High',
  high_high: 'High-high',
  low: 'Low',
  rate_of_rise: 'Rising too fast',
  above_ambient: 'Too far above ambient',
  above_mawp: 'Above maximum allowable working pressure',
  overspeed: 'Overspeed',
};

export type AlarmPriority = 'high' | 'high_high';

export const ALARM_PRIORITY_LABELS: Readonly<Record<AlarmPriority, string>> = {
  high: 'High',
  high_high: 'High-high (critical)',
};

export type ConditionAction = 'raise' | 'clear' | 'hold';

/** A measurement point's alarm settings. Limits are in the point's own unit; unset = null/undefined. */
export interface MeasurementPointSettings {
  id: string;
  /** Plain name used in messages, e.g. "Main bearing, crank side". */
  name: string;
  kind: MeasurementKind;
  /** e.g. 'psig', 'psia', 'kPa', 'kPa abs', 'inHg', '°F', '°C', 'rpm'. */
  unit: string;
  normalLow?: number | null;
  normalHigh?: number | null;
  highLimit?: number | null;
  highHighLimit?: number | null;
  /** Low limit, for oil pressure, vacuum and the like. */
  lowLimit?: number | null;
  /** Allowed rate of rise, in the point's unit per minute. */
  maxRiseRatePerMin?: number | null;
  /** Allowed rise above the ambient temperature, in the point's unit (bearing temperatures). */
  maxRiseAboveAmbient?: number | null;
  /** Absolute deadband in the point's unit; default 0. Applies to every level comparison. */
  deadband?: number | null;
}

export interface EngineLimits {
  /** Maximum allowable working pressure of the steam supply, gauge. */
  maximumAllowableWorkingPressurePsig: number;
  overspeedRpm: number;
}

export interface PointReading {
  pointId: string;
  value: number;
  takenAt: Date;
}

export interface EvaluateReadingContext {
  point: MeasurementPointSettings;
  engine: EngineLimits;
  reading: PointReading;
  /** Recent readings of this point (e.g. the last 5 minutes). May include `reading` itself. */
  recentHistory: readonly PointReading[];
  /** Latest ambient temperature, already in the point's unit; null/undefined when none. */
  ambientTemperature?: number | null;
  /** Conditions of this point that are currently in alarm. */
  activeConditions: ReadonlySet<AlarmConditionKind> | readonly AlarmConditionKind[];
  /** Rate-of-rise window in minutes; default 5. */
  rateWindowMinutes?: number;
  /** Shortest span the rate of rise is computed over, in minutes; default 1. */
  minimumRateSpanMinutes?: number;
}

export interface ConditionDecision {
  kind: AlarmConditionKind;
  priority: AlarmPriority;
  action: ConditionAction;
  /** False when the check could not be made; the action is then always 'hold'. */
  evaluated: boolean;
  /**
   * The quantity compared with the limit: the reading itself for level limits, the rate for
   * 'rate_of_rise' (unit per minute), the rise over ambient for 'above_ambient'. Null when not evaluated.
   */
  value: number | null;
  /** The limit in `unit`; null when it is no longer set. */
  limit: number | null;
  /** Unit of `value` and `limit`, e.g. '°F' or '°F/min'. */
  unit: string;
  message: string;
}

export const DEFAULT_RATE_WINDOW_MINUTES = 5;
export const DEFAULT_MINIMUM_RATE_SPAN_MINUTES = 1;

/** Plausibility band for temperature sensors, in °F (product setting, not from a source). */
export const TEMPERATURE_SENSOR_RANGE_F = { min: -40, max: 600 } as const;
/** Vacuum gauges in inches of mercury read 0..30 (a standard atmosphere is about 29.92 inHg). */
export const VACUUM_RANGE_INHG = { min: 0, max: 30 } as const;
/** Plausibility band for engine speed (product setting, not from a source). */
export const SPEED_RANGE_RPM = { min: 0, max: 1000 } as const;

const MS_PER_MINUTE = 60_000;

/** 'high_high' for high-high, above-MAWP and overspeed; 'high' for the rest. */
export function priorityOf(kind: AlarmConditionKind): AlarmPriority {
  switch (kind) {
    case 'high_high':
    case 'above_mawp':
    case 'overspeed':
      return 'high_high';
    case 'high':
    case 'low':
    case 'rate_of_rise':
    case 'above_ambient':
      return 'high';
  }
}

// ---------------------------------------------------------------------------------------------
// Reading plausibility
// ---------------------------------------------------------------------------------------------

function fmt(n: number): string {
  const rounded = Math.round(n * 100) / 100;
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

function withUnit(n: number, unit: string): string {
  const label = unitLabel(unit);
  return label ? `${fmt(n)} ${label}` : fmt(n);
}

/**
 * An error message for an absurd value (a mistyped figure or a failed sensor), else null.
 * Checks: non-finite; absolute pressure below zero (psia, kPa abs, and gauge pressures below a
 * standard atmosphere's vacuum); vacuum outside 0..30 inHg; temperature outside −40..600 °F
 * (the same band converted for °C); speed below 0 or above 1000 rpm.
 */
export function validateReadingValue(point: MeasurementPointSettings, value: number): string | null {
  if (!Number.isFinite(value)) {
    return `${point.name}: the reading is not a number.`;
  }
  const pressureScale = pressureScaleOf(point.unit);
  if (pressureScale === 'inHg_vacuum') {
    if (value < VACUUM_RANGE_INHG.min || value > VACUUM_RANGE_INHG.max) {
      return (
        `${point.name}: ${withUnit(value, point.unit)} is outside the vacuum gauge range ` +
        `${VACUUM_RANGE_INHG.min}–${VACUUM_RANGE_INHG.max} inHg.`
      );
    }
  } else if (pressureScale !== null) {
    const absoluteKpa = absoluteKpaOf(value, pressureScale);
    if (absoluteKpa !== null && absoluteKpa < 0) {
      return pressureScale === 'psia' || pressureScale === 'kPa_abs'
        ? `${point.name}: ${withUnit(value, point.unit)} is impossible — absolute pressure cannot be negative.`
        : `${point.name}: ${withUnit(value, point.unit)} is impossible — it is below a perfect vacuum.`;
    }
  }
  const scale = temperatureScaleOf(point.unit);
  if (scale !== null) {
    const valueF = scale === 'F' ? value : celsiusToFahrenheit(value);
    if (valueF < TEMPERATURE_SENSOR_RANGE_F.min || valueF > TEMPERATURE_SENSOR_RANGE_F.max) {
      return (
        `${point.name}: ${withUnit(value, point.unit)} is outside the sensor range ` +
        `(${TEMPERATURE_SENSOR_RANGE_F.min} to ${TEMPERATURE_SENSOR_RANGE_F.max} °F).`
      );
    }
  }
  if (point.kind === 'speed' || isRpm(point.unit)) {
    if (value < SPEED_RANGE_RPM.min || value > SPEED_RANGE_RPM.max) {
      return (
        `${point.name}: ${withUnit(value, point.unit)} is outside the plausible speed range ` +
        `${SPEED_RANGE_RPM.min}–${SPEED_RANGE_RPM.max} rpm.`
      );
    }
  }
  return null;
}

// ---------------------------------------------------------------------------------------------
// Threshold decisions (the one place the raise/clear/hold rule lives)
// ---------------------------------------------------------------------------------------------

/** Raise strictly above `limit`; clear strictly below `limit − deadband`; otherwise hold. */
export function decideHighSide(active: boolean, value: number, limit: number, deadband: number): ConditionAction {
  if (!active) return value > limit ? 'raise' : 'hold';
  return value < limit - deadband ? 'clear' : 'hold';
}

/** Raise strictly below `limit`; clear strictly above `limit + deadband`; otherwise hold. */
export function decideLowSide(active: boolean, value: number, limit: number, deadband: number): ConditionAction {
  if (!active) return value < limit ? 'raise' : 'hold';
  return value > limit + deadband ? 'clear' : 'hold';
}

export interface RiseRate {
  /** (new value − oldest value in the window) / minutes between them. */
  ratePerMin: number;
  spanMinutes: number;
  fromValue: number;
  fromTakenAt: Date;
}

/**
 * Rate of rise of `reading` over the window ending at it: against the oldest reading of the same
 * point taken no earlier than `windowMinutes` before it. Null when there is no such earlier reading
 * or the span between the two is shorter than `minimumSpanMinutes` (too noisy to judge).
 */
export function riseRatePerMinute(
  reading: PointReading,
  history: readonly PointReading[],
  windowMinutes: number = DEFAULT_RATE_WINDOW_MINUTES,
  minimumSpanMinutes: number = DEFAULT_MINIMUM_RATE_SPAN_MINUTES,
): RiseRate | null {
  const endMs = reading.takenAt.getTime();
  const startMs = endMs - windowMinutes * MS_PER_MINUTE;
  let oldest: PointReading | null = null;
  for (const r of history) {
    const t = r.takenAt.getTime();
    if (r.pointId !== reading.pointId || !Number.isFinite(r.value) || !Number.isFinite(t)) continue;
    if (t < startMs || t > endMs) continue;
    if (oldest === null || t < oldest.takenAt.getTime()) oldest = r;
  }
  if (oldest === null) return null;
  const spanMinutes = (endMs - oldest.takenAt.getTime()) / MS_PER_MINUTE;
  if (spanMinutes <= 0 || spanMinutes < minimumSpanMinutes) return null;
  return {
    ratePerMin: (reading.value - oldest.value) / spanMinutes,
    spanMinutes,
    fromValue: oldest.value,
    fromTakenAt: oldest.takenAt,
  };
}

// ---------------------------------------------------------------------------------------------
// evaluateReading
// ---------------------------------------------------------------------------------------------

function setting(n: number | null | undefined): number | null {
  return typeof n === 'number' && Number.isFinite(n) ? n : null;
}

function isActive(active: EvaluateReadingContext['activeConditions'], kind: AlarmConditionKind): boolean {
  return active instanceof Set ? active.has(kind) : (active as readonly AlarmConditionKind[]).includes(kind);
}

interface LevelCheck {
  kind: AlarmConditionKind;
  side: 'high' | 'low';
  value: number;
  limit: number;
  unit: string;
  /** e.g. "its high limit", "the overspeed limit". */
  limitName: string;
  /** Message on raise and while held active (written only when read). */
  raised: () => string;
}

/**
 * A decision whose message is written only when someone reads it: a logger batch evaluates thousands of readings
 * and keeps the messages of the few that raise or clear an alarm.
 */
function decided(d: Omit<ConditionDecision, 'message'>, make: () => string): ConditionDecision {
  let text: string | undefined;
  return {
    kind: d.kind,
    priority: d.priority,
    action: d.action,
    evaluated: d.evaluated,
    value: d.value,
    limit: d.limit,
    unit: d.unit,
    get message() {
      return (text ??= make());
    },
  };
}

function levelDecision(check: LevelCheck, active: boolean, deadband: number, subject: () => string): ConditionDecision {
  const decide = check.side === 'high' ? decideHighSide : decideLowSide;
  const action = decide(active, check.value, check.limit, deadband);
  const clearAt = check.side === 'high' ? check.limit - deadband : check.limit + deadband;
  const direction = check.side === 'high' ? 'below' : 'above';
  const message = () => {
    if (action === 'raise') return check.raised();
    if (action === 'clear')
      return deadband > 0
        ? `${subject()} is back to normal: ${direction} ${check.limitName} ${withUnit(check.limit, check.unit)} ` +
            `less its deadband (${withUnit(clearAt, check.unit)}).`
        : `${subject()} is back to normal: ${direction} ${check.limitName} ${withUnit(check.limit, check.unit)}.`;
    if (active) return `${check.raised()} Still in alarm until ${direction} ${withUnit(clearAt, check.unit)}.`;
    return `${subject()} is within ${check.limitName} ${withUnit(check.limit, check.unit)}.`;
  };
  return decided(
    {
      kind: check.kind,
      priority: priorityOf(check.kind),
      action,
      evaluated: true,
      value: check.value,
      limit: check.limit,
      unit: check.unit,
    },
    message,
  );
}

function notEvaluated(kind: AlarmConditionKind, limit: number | null, unit: string, message: string | (() => string)): ConditionDecision {
  const d = { kind, priority: priorityOf(kind), action: 'hold' as const, evaluated: false, value: null, limit, unit };
  return typeof message === 'string' ? { ...d, message } : decided(d, message);
}

function limitRemoved(kind: AlarmConditionKind, name: string, unit: string): ConditionDecision {
  return {
    kind,
    priority: priorityOf(kind),
    action: 'clear',
    evaluated: true,
    value: null,
    limit: null,
    unit,
    message: `${name}: the ${ALARM_CONDITION_LABELS[kind].toLowerCase()} limit is no longer set, so the alarm is cleared.`,
  };
}

/**
 * Decides, for every condition that applies to the point, whether to raise, clear or hold it.
 * Conditions that do not apply (no limit set, not active) are left out; a condition that is active
 * but whose limit has been removed gets 'clear'.
 */
export function evaluateReading(ctx: EvaluateReadingContext): ConditionDecision[] {
  const { point, engine, reading } = ctx;
  const unit = point.unit;
  const value = reading.value;
  const rawDeadband = setting(point.deadband) ?? 0;
  const deadband = rawDeadband > 0 ? rawDeadband : 0;
  const name = point.name;
  let subjectText: string | undefined;
  const subject = () => (subjectText ??= `${name} ${withUnit(value, unit)}`);
  const active = (kind: AlarmConditionKind) => isActive(ctx.activeConditions, kind);
  const out: ConditionDecision[] = [];

  if (!Number.isFinite(value)) {
    for (const kind of ALARM_CONDITION_KINDS) {
      if (active(kind)) out.push(notEvaluated(kind, null, unit, `${name}: the reading is not a number; the alarm is left as it is.`));
    }
    return out;
  }

  const level = (kind: AlarmConditionKind, check: Omit<LevelCheck, 'kind'> | null) => {
    if (check) out.push(levelDecision({ kind, ...check }, active(kind), deadband, subject));
    else if (active(kind)) out.push(limitRemoved(kind, name, unit));
  };

  // High-high
  const highHigh = setting(point.highHighLimit);
  level(
    'high_high',
    highHigh === null
      ? null
      : {
          side: 'high',
          value,
          limit: highHigh,
          unit,
          limitName: 'its high-high limit',
          raised: () => `${subject()} is above its high-high limit ${withUnit(highHigh, unit)}.`,
        },
  );

  // Above the engine's maximum allowable working pressure (steam pressure points only)
  if (point.kind === 'throttle_pressure' || point.kind === 'receiver_pressure') {
    const mawpPsig = setting(engine.maximumAllowableWorkingPressurePsig);
    const limit = mawpPsig === null ? null : mawpInPointUnit(mawpPsig, unit);
    if (mawpPsig === null) {
      out.push(notEvaluated('above_mawp', null, unit, `${name}: the engine has no maximum allowable working pressure set.`));
    } else if (limit === null) {
      out.push(
        notEvaluated(
          'above_mawp',
          null,
          unit,
          `${name}: unit "${unit}" cannot be compared with the maximum allowable working pressure ${fmt(mawpPsig)} psig.`,
        ),
      );
    } else {
      level('above_mawp', {
        side: 'high',
        value,
        limit,
        unit,
        limitName: 'the maximum allowable working pressure',
        raised: () => `${subject()} is above the maximum allowable working pressure ${withUnit(limit, unit)}.`,
      });
    }
  } else if (active('above_mawp')) {
    out.push(limitRemoved('above_mawp', name, unit));
  }

  // Overspeed (speed points only)
  if (point.kind === 'speed') {
    const overspeed = setting(engine.overspeedRpm);
    if (overspeed === null) {
      out.push(notEvaluated('overspeed', null, unit, `${name}: the engine has no overspeed limit set.`));
    } else if (!isRpm(unit)) {
      out.push(
        notEvaluated('overspeed', null, unit, `${name}: unit "${unit}" cannot be compared with the overspeed limit ${fmt(overspeed)} rpm.`),
      );
    } else {
      level('overspeed', {
        side: 'high',
        value,
        limit: overspeed,
        unit,
        limitName: 'the overspeed limit',
        raised: () => `${subject()} is above the overspeed limit ${withUnit(overspeed, unit)}.`,
      });
    }
  } else if (active('overspeed')) {
    out.push(limitRemoved('overspeed', name, unit));
  }

  // High
  const high = setting(point.highLimit);
  level(
    'high',
    high === null
      ? null
      : {
          side: 'high',
          value,
          limit: high,
          unit,
          limitName: 'its high limit',
          raised: () => `${subject()} is above its high limit ${withUnit(high, unit)}.`,
        },
  );

  // Low
  const low = setting(point.lowLimit);
  level(
    'low',
    low === null
      ? null
      : {
          side: 'low',
          value,
          limit: low,
          unit,
          limitName: 'its low limit',
          raised: () => `${subject()} is below its low limit ${withUnit(low, unit)}.`,
        },
  );

  // Rate of rise
  const maxRate = setting(point.maxRiseRatePerMin);
  const rateUnit = `${unit}/min`;
  if (maxRate === null) {
    if (active('rate_of_rise')) out.push(limitRemoved('rate_of_rise', name, rateUnit));
  } else {
    const windowMinutes = ctx.rateWindowMinutes ?? DEFAULT_RATE_WINDOW_MINUTES;
    const minSpan = ctx.minimumRateSpanMinutes ?? DEFAULT_MINIMUM_RATE_SPAN_MINUTES;
    const rate = riseRatePerMinute(reading, ctx.recentHistory, windowMinutes, minSpan);
    const isActiveRate = active('rate_of_rise');
    if (rate === null) {
      out.push(
        notEvaluated(
          'rate_of_rise',
          maxRate,
          rateUnit,
          () =>
            `${name}: rate of rise not checked — it needs an earlier reading at least ${fmt(minSpan)} min before this one ` +
            `and within the last ${fmt(windowMinutes)} min.`,
        ),
      );
    } else {
      const action = decideHighSide(isActiveRate, rate.ratePerMin, maxRate, 0);
      const message = () => {
        const over =
          `${name} is rising at ${withUnit(rate.ratePerMin, rateUnit)} over the last ${fmt(rate.spanMinutes)} min ` +
          `(${withUnit(rate.fromValue, unit)} to ${withUnit(value, unit)})`;
        return action === 'raise' || (action === 'hold' && isActiveRate)
          ? `${over}, above its limit ${withUnit(maxRate, rateUnit)}.`
          : action === 'clear'
            ? `${over}; back within its limit ${withUnit(maxRate, rateUnit)}.`
            : `${over}; within its limit ${withUnit(maxRate, rateUnit)}.`;
      };
      out.push(
        decided(
          {
            kind: 'rate_of_rise',
            priority: priorityOf('rate_of_rise'),
            action,
            evaluated: true,
            value: rate.ratePerMin,
            limit: maxRate,
            unit: rateUnit,
          },
          message,
        ),
      );
    }
  }

  // Rise above ambient (bearing temperatures)
  const maxRise = point.kind === 'bearing_temperature' ? setting(point.maxRiseAboveAmbient) : null;
  if (maxRise === null) {
    if (active('above_ambient')) out.push(limitRemoved('above_ambient', name, unit));
  } else {
    const ambient = setting(ctx.ambientTemperature);
    if (ambient === null) {
      out.push(
        notEvaluated(
          'above_ambient',
          maxRise,
          unit,
          () => `${name}: rise above ambient not checked — there is no ambient temperature reading.`,
        ),
      );
    } else {
      const rise = value - ambient;
      const isActiveAmbient = active('above_ambient');
      const action = decideHighSide(isActiveAmbient, rise, maxRise, deadband);
      const message = () => {
        const base = `${subject()} is ${withUnit(rise, unit)} above ambient ${withUnit(ambient, unit)}`;
        return action === 'raise' || (action === 'hold' && isActiveAmbient)
          ? `${base}, more than the allowed ${withUnit(maxRise, unit)}.`
          : action === 'clear'
            ? `${base}; back within the allowed ${withUnit(maxRise, unit)}` +
              `${deadband > 0 ? ` less its deadband ${withUnit(deadband, unit)}` : ''}.`
            : `${base}; within the allowed ${withUnit(maxRise, unit)}.`;
      };
      out.push(
        decided(
          { kind: 'above_ambient', priority: priorityOf('above_ambient'), action, evaluated: true, value: rise, limit: maxRise, unit },
          message,
        ),
      );
    }
  }

  return out;
}
