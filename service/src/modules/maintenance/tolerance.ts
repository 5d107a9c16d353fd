import type { MaintenanceUnit, ToleranceStatus, WebDeflectionPair, WebDeflectionSummary } from '@crankjournal/shared-types';

/**
 * A measurement against its acceptance range. A value exactly on a limit is within it (a limit is the last
 * acceptable figure; common practice, no source). Either end of the range may be open.
 */
export function toleranceStatus(
  value: number,
  toleranceMin: number | null | undefined,
  toleranceMax: number | null | undefined,
): { status: ToleranceStatus; outOfTolerance: boolean; excess: number } {
  if (!Number.isFinite(value)) throw new RangeError('value must be a finite number');
  const min = toleranceMin ?? null;
  const max = toleranceMax ?? null;
  if (min !== null && max !== null && min > max) throw new RangeError('toleranceMin must not be above toleranceMax');
  if (min === null && max === null) return { status: 'no_tolerance', outOfTolerance: false, excess: 0 };
  if (max !== null && value > max) return { status: 'above', outOfTolerance: true, excess: value - max };
  if (min !== null && value < min) return { status: 'below', outOfTolerance: true, excess: min - value };
  return { status: 'within', outOfTolerance: false, excess: 0 };
}

/**
 * Crank web deflection as a single figure: the spread (largest minus smallest) of the dial readings taken
 * round the crank, in one unit. The readings of other units are left out; null when fewer than two remain.
 */
export function webDeflectionSpread(
  items: { kind: string; value: number; unit: MaintenanceUnit; crankAngleDeg?: number | null; toleranceMax?: number | null }[],
): WebDeflectionSummary | null {
  const web = items.filter((i) => i.kind === 'web_deflection');
  if (web.length < 2) return null;
  const unit = web[0].unit;
  const sameUnit = web.filter((i) => i.unit === unit);
  const same = sameUnit.map((i) => i.value);
  if (same.length < 2) return null;
  return { spread: Math.max(...same) - Math.min(...same), unit, readings: same.length, pairs: webDeflectionPairs(sameUnit) };
}

/**
 * Web deflection judged as the trade does, pair by pair (common practice, no source): the vertical pair is the
 * reading at 90° against the one at 270°; the horizontal pair is the head-end dead centre (0°) against crank-end dead
 * centre (180°, or the mean of the readings just either side of it, 165° and 195°, where the rod fouls the gauge).
 * Each pair's deflection is set against its own limit: the largest tolerance given on that pair's readings.
 */
export function webDeflectionPairs(
  items: { value: number; crankAngleDeg?: number | null; toleranceMax?: number | null }[],
): WebDeflectionPair[] {
  const at = (deg: number) =>
    items.filter((i) => i.crankAngleDeg !== null && i.crankAngleDeg !== undefined && i.crankAngleDeg % 360 === deg);
  const judge = (pair: WebDeflectionPair['pair'], a: typeof items, b: typeof items): WebDeflectionPair | null => {
    if (!a.length || !b.length) return null;
    const mean = (xs: typeof items) => xs.reduce((s, x) => s + x.value, 0) / xs.length;
    const deflection = Math.abs(mean(a) - mean(b));
    const limits = [...a, ...b].map((x) => x.toleranceMax).filter((x): x is number => x !== null && x !== undefined);
    const limit = limits.length ? Math.max(...limits) : null;
    return { pair, deflection, limit, status: limit === null ? 'no_tolerance' : deflection > limit ? 'above' : 'within' };
  };
  const crankEnd = at(180).length ? at(180) : [...at(165), ...at(195)];
  return [judge('vertical', at(90), at(270)), judge('horizontal', at(0), crankEnd)].filter((p): p is WebDeflectionPair => p !== null);
}
