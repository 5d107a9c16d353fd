import type { MaintenanceUnit, ToleranceStatus } from '@crankjournal/shared-types';

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
  items: { kind: string; value: number; unit: MaintenanceUnit }[],
): { spread: number; unit: MaintenanceUnit; readings: number } | null {
  const web = items.filter((i) => i.kind === 'web_deflection');
  if (web.length < 2) return null;
  const unit = web[0].unit;
  const same = web.filter((i) => i.unit === unit).map((i) => i.value);
  if (same.length < 2) return null;
  return { spread: Math.max(...same) - Math.min(...same), unit, readings: same.length };
}
