/**
 * Which limit a point's trend is heading for, and how soon. Pure: the fit itself is in calculations/trend-forecast.
 */
import type { AlarmKind, LimitForecastDto } from '@crankjournal/shared-types';
import { FORECAST_METHOD_WORDS, forecastTimeToLimit, type TimedValue } from '../../calculations/trend-forecast.js';
import type { MeasurementPointSettings } from './alarm-rules.js';

/** Point kinds with a meaningful rate of change toward a limit: temperatures and pressures. */
const FORECAST_KINDS = new Set(['bearing_temperature', 'throttle_pressure', 'receiver_pressure', 'oil_pressure', 'vacuum']);

/**
 * The nearest limit not yet passed in the direction of the trend (high, then high-high; low), with the time to
 * reach it, or null. `preAlarmMinutes`: under it the forecast is an advisory pre-alarm.
 */
export function forecastForPoint(
  point: Pick<MeasurementPointSettings, 'kind' | 'unit' | 'highLimit' | 'highHighLimit' | 'lowLimit'>,
  readings: readonly { value: number; takenAt: Date }[],
  now: Date,
  preAlarmMinutes: number,
): LimitForecastDto | null {
  if (!FORECAST_KINDS.has(point.kind) || readings.length === 0) return null;
  const nowMs = now.getTime();
  const pts: TimedValue[] = readings.map((r) => ({ tMin: (r.takenAt.getTime() - nowMs) / 60_000, value: r.value }));
  const last = readings[readings.length - 1].value;
  const candidates: { kind: AlarmKind; limit: number; side: 'high' | 'low' }[] = [];
  for (const [kind, limit] of [
    ['high', point.highLimit],
    ['high_high', point.highHighLimit],
  ] as const)
    if (typeof limit === 'number' && last <= limit) candidates.push({ kind, limit, side: 'high' });
  if (typeof point.lowLimit === 'number' && last >= point.lowLimit) candidates.push({ kind: 'low', limit: point.lowLimit, side: 'low' });
  let best: LimitForecastDto | null = null;
  for (const c of candidates) {
    const f = forecastTimeToLimit(pts, 0, c.limit, c.side);
    if (!f || (best && best.minutesToLimit <= f.minutesToLimit)) continue;
    best = {
      limitKind: c.kind,
      limit: c.limit,
      unit: point.unit,
      minutesToLimit: f.minutesToLimit,
      ratePerMin: f.ratePerMin,
      preAlarm: f.minutesToLimit < preAlarmMinutes,
      preAlarmMinutes,
      method: FORECAST_METHOD_WORDS,
    };
  }
  return best;
}
