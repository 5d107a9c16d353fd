import { UNIT_LABELS, type MeasurementKind, type MeasurementPointDto } from '@crankjournal/shared-types';

/** Where a value stands against a point's limits, checked in the browser before a round is saved. The server checks again. */
export type LimitStanding = 'high_high' | 'high' | 'low' | 'above_normal' | 'below_normal' | 'normal';

type Limits = Pick<MeasurementPointDto, 'normalLow' | 'normalHigh' | 'lowLimit' | 'highLimit' | 'highHighLimit'>;

const has = (x: number | null | undefined): x is number => typeof x === 'number' && Number.isFinite(x);

/** The engine's own ceilings that also apply to some points (maximum allowable working pressure, overspeed). */
export interface EngineCeilings {
  mawpPsig?: number | null;
  overspeedRpm?: number | null;
}

/** The highest value a point may show before a high-high alarm: its own limit, or the engine's MAWP / overspeed. */
export function highHighCeiling(point: Limits & { kind?: MeasurementKind; unit: string }, engine?: EngineCeilings): number | null {
  const ceilings: number[] = [];
  if (has(point.highHighLimit)) ceilings.push(point.highHighLimit);
  if (engine && (point.kind === 'throttle_pressure' || point.kind === 'receiver_pressure') && point.unit === 'psig' && has(engine.mawpPsig))
    ceilings.push(engine.mawpPsig);
  if (engine && point.kind === 'speed' && point.unit === 'rpm' && has(engine.overspeedRpm)) ceilings.push(engine.overspeedRpm);
  return ceilings.length ? Math.min(...ceilings) : null;
}

/** Like the server's rules: a value strictly above a high limit (strictly below a low limit) is in alarm. */
export function limitStanding(
  point: Limits & { kind?: MeasurementKind; unit?: string },
  value: number,
  engine?: EngineCeilings,
): LimitStanding {
  const hh = highHighCeiling({ ...point, unit: point.unit ?? '' }, engine);
  if (hh !== null && value > hh) return 'high_high';
  if (has(point.highLimit) && value > point.highLimit) return 'high';
  if (has(point.lowLimit) && value < point.lowLimit) return 'low';
  if (has(point.normalHigh) && value > point.normalHigh) return 'above_normal';
  if (has(point.normalLow) && value < point.normalLow) return 'below_normal';
  return 'normal';
}

export const STANDING_WORDS: Record<LimitStanding, string> = {
  high_high: 'High-high',
  high: 'High',
  low: 'Low',
  above_normal: 'Above normal range',
  below_normal: 'Below normal range',
  normal: 'Normal',
};

export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit;
}

/** "140–190 °F", "≤ 190 °F", or null when the point has no normal range. */
export function normalRangeText(point: Limits & { unit: string }, fmt: (n: number) => string = String): string | null {
  const u = unitLabel(point.unit);
  if (has(point.normalLow) && has(point.normalHigh)) return `${fmt(point.normalLow)}–${fmt(point.normalHigh)} ${u}`;
  if (has(point.normalHigh)) return `≤ ${fmt(point.normalHigh)} ${u}`;
  if (has(point.normalLow)) return `≥ ${fmt(point.normalLow)} ${u}`;
  return null;
}

/** "High 200 · High-high 215 °F" or null. */
export function limitsText(point: Limits & { unit: string }, fmt: (n: number) => string = String): string | null {
  const parts: string[] = [];
  if (has(point.lowLimit)) parts.push(`Low ${fmt(point.lowLimit)}`);
  if (has(point.highLimit)) parts.push(`High ${fmt(point.highLimit)}`);
  if (has(point.highHighLimit)) parts.push(`High-high ${fmt(point.highHighLimit)}`);
  return parts.length ? `${parts.join(' · ')} ${unitLabel(point.unit)}` : null;
}

/** Parses what a person typed ("182", "182.5", "182,5"); null when empty, NaN when not a number. */
export function parseEntered(text: string): number | null {
  const t = text.trim().replace(',', '.');
  if (t === '') return null;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t)) return Number.NaN;
  return Number(t);
}
