import type { DueCriterionDto, DueStatus, InspectionPlanDto, MaintenanceUnit } from '@crankjournal/shared-types';
import { formatNumber } from '../../units/units';

export const fmt = (v: number | null | undefined, decimals = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : formatNumber(v, decimals);
export const day = (iso: string | null | undefined) =>
  iso ? new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' }) : '—';
export const dayShort = (iso: string | null | undefined) =>
  iso ? new Date(iso).toLocaleDateString(undefined, { day: 'numeric', month: 'short' }) : '—';

/** Decimals that suit each maintenance unit (thousandths of an inch for clearances). */
export const UNIT_DECIMALS: Record<MaintenanceUnit, number> = { in: 4, mm: 3, 'in/ft': 4, 'mm/m': 3 };
export const measure = (v: number | null | undefined, unit: MaintenanceUnit) =>
  v === null || v === undefined ? '—' : `${fmt(v, UNIT_DECIMALS[unit])} ${unit}`;

/** "every 500 h, 1,000,000 rev or 365 days" */
export function intervalText(p: Pick<InspectionPlanDto, 'intervalRunHours' | 'intervalRevolutions' | 'intervalDays'>): string {
  const parts: string[] = [];
  if (p.intervalRunHours != null) parts.push(`${fmt(p.intervalRunHours, 0)} h`);
  if (p.intervalRevolutions != null) parts.push(`${fmt(p.intervalRevolutions, 0)} rev`);
  if (p.intervalDays != null)
    parts.push(
      p.intervalDays % 365 === 0
        ? `${p.intervalDays / 365 === 1 ? '12 months' : `${(p.intervalDays / 365) * 12} months`}`
        : `${fmt(p.intervalDays, 0)} days`,
    );
  return parts.length ? `every ${parts.join(' or ')}, whichever first` : '—';
}

/** What is left of one criterion, in words. */
export function remainingText(c: DueCriterionDto): string {
  const d = c.criterion === 'run_hours' ? 1 : 0;
  const amount = Math.abs(c.remaining);
  const shown = Number(amount.toFixed(d));
  const unit = c.criterion === 'run_hours' ? 'h' : c.criterion === 'revolutions' ? 'rev' : shown === 1 ? 'day' : 'days';
  return c.remaining <= 0 ? `${fmt(amount, d)} ${unit} over` : `${fmt(amount, d)} ${unit} left`;
}

export const DUE_ORDER: Record<DueStatus, number> = { overrun: 0, coming_due: 1, in_hand: 2 };
