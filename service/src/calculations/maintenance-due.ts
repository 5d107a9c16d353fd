import { assertFinite } from './input-checks.js';
import { CalculationInputError } from './errors.js';
/**
 * When is maintenance due? A plan has intervals by running hours, revolutions and/or calendar days;
 * whichever criterion comes due first governs.
 *
 * Status per criterion (and overall, the worst of them):
 *   overrun     remaining ≤ 0 (the interval has been reached or passed);
 *   coming_due  remaining ≤ 10 % of the interval, or the estimated due date is within 7 days of now;
 *   in_hand     otherwise.
 * Both thresholds are options (dueSoonFraction, dueSoonDays). Counter criteria get an estimated due date
 * only when a usage rate (run-hours or revolutions per calendar day, e.g. averaged over the season) is given.
 */

export const DEFAULT_DUE_SOON_FRACTION = 0.1;
export const DEFAULT_DUE_SOON_DAYS = 7;
export const MS_PER_DAY = 86_400_000;

export const DUE_RULE_TEXT =
  'A task is due when any of its intervals (running hours, revolutions, calendar days) is reached, whichever ' +
  'comes first. It is coming due when 10 % or less of an interval remains, or when its estimated due date is ' +
  'within 7 days; overrun once an interval has been reached.';

export type DueStatus = 'in_hand' | 'coming_due' | 'overrun';
export type DueCriterion = 'run_hours' | 'revolutions' | 'calendar_days';

export interface MaintenancePlan {
  intervalRunHours?: number;
  intervalRevolutions?: number;
  intervalDays?: number;
}

export interface LastDone {
  runHours: number;
  revolutions: number;
  date: Date;
}

export interface CurrentCounters {
  runHours: number;
  revolutions: number;
  now: Date;
}

export interface UsageRates {
  runHoursPerDay?: number;
  revolutionsPerDay?: number;
}

export interface CriterionDue {
  criterion: DueCriterion;
  interval: number;
  used: number;
  /** in the criterion's own unit (hours, revolutions, days); negative when overrun */
  remaining: number;
  fractionRemaining: number;
  estimatedDueDate: Date | null;
  /** Why there is no estimated due date (a counter without a usage rate cannot be predicted), else null. */
  estimateNote: string | null;
  status: DueStatus;
}

export interface MaintenanceDueResult {
  status: DueStatus;
  /**
   * Earliest estimated due date over the criteria that have one; never a future date for an overrun plan (then the
   * earliest date an overrun criterion fell due, or null when none of them can be dated: see dueDateNote).
   */
  dueDate: Date | null;
  /** Said beside (or instead of) the due date: overrun on a counter, or a date that cannot be predicted. */
  dueDateNote: string | null;
  /** the criterion that governs: worst status, then earliest due date, then least fraction remaining */
  governing: DueCriterion;
  criteria: CriterionDue[];
}

const STATUS_RANK: Record<DueStatus, number> = { in_hand: 0, coming_due: 1, overrun: 2 };
const COUNTER_WORDS: Record<DueCriterion, string> = {
  run_hours: 'running hours',
  revolutions: 'revolutions',
  calendar_days: 'the calendar',
};

function assertDate(name: string, value: Date): void {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) throw new CalculationInputError(null, `${name} must be a valid date`);
}
function assertInterval(name: string, value: number | undefined): void {
  if (value === undefined) return;
  assertFinite(name, value);
  if (value <= 0) throw new CalculationInputError(null, `${name} must be greater than zero`);
}

export function addDays(date: Date, days: number): Date {
  return new Date(date.getTime() + days * MS_PER_DAY);
}
export function daysBetween(from: Date, to: Date): number {
  return (to.getTime() - from.getTime()) / MS_PER_DAY;
}

function classify(
  remaining: number,
  interval: number,
  daysToDue: number | null,
  o: { dueSoonFraction: number; dueSoonDays: number },
): DueStatus {
  if (remaining <= 0) return 'overrun';
  if (remaining <= o.dueSoonFraction * interval) return 'coming_due';
  if (daysToDue !== null && daysToDue <= o.dueSoonDays) return 'coming_due';
  return 'in_hand';
}

export function maintenanceDue(
  plan: MaintenancePlan,
  lastDone: LastDone,
  current: CurrentCounters,
  rates: UsageRates = {},
  options: { dueSoonFraction?: number; dueSoonDays?: number } = {},
): MaintenanceDueResult {
  assertInterval('intervalRunHours', plan.intervalRunHours);
  assertInterval('intervalRevolutions', plan.intervalRevolutions);
  assertInterval('intervalDays', plan.intervalDays);
  if (plan.intervalRunHours === undefined && plan.intervalRevolutions === undefined && plan.intervalDays === undefined) {
    throw new CalculationInputError(null, 'a plan needs at least one interval');
  }
  assertDate('lastDone.date', lastDone.date);
  assertDate('current.now', current.now);
  assertFinite('current.runHours', current.runHours);
  assertFinite('current.revolutions', current.revolutions);
  if (current.runHours < lastDone.runHours) throw new CalculationInputError(null, 'run-hour counter is below its value when last done');
  if (current.revolutions < lastDone.revolutions)
    throw new CalculationInputError(null, 'revolution counter is below its value when last done');
  const o = {
    dueSoonFraction: options.dueSoonFraction ?? DEFAULT_DUE_SOON_FRACTION,
    dueSoonDays: options.dueSoonDays ?? DEFAULT_DUE_SOON_DAYS,
  };

  const criteria: CriterionDue[] = [];
  const counter = (criterion: DueCriterion, interval: number, used: number, perDay: number | undefined) => {
    const remaining = interval - used;
    let estimatedDueDate: Date | null = null;
    let daysToDue: number | null = null;
    if (perDay !== undefined && perDay > 0) {
      daysToDue = remaining / perDay;
      estimatedDueDate = addDays(current.now, daysToDue);
    }
    criteria.push({
      criterion,
      interval,
      used,
      remaining,
      fractionRemaining: remaining / interval,
      estimatedDueDate,
      estimateNote: estimatedDueDate === null ? `the date cannot be predicted: no usage rate for ${COUNTER_WORDS[criterion]}` : null,
      status: classify(remaining, interval, daysToDue, o),
    });
  };
  if (plan.intervalRunHours !== undefined) {
    counter('run_hours', plan.intervalRunHours, current.runHours - lastDone.runHours, rates.runHoursPerDay);
  }
  if (plan.intervalRevolutions !== undefined) {
    counter('revolutions', plan.intervalRevolutions, current.revolutions - lastDone.revolutions, rates.revolutionsPerDay);
  }
  if (plan.intervalDays !== undefined) {
    const used = daysBetween(lastDone.date, current.now);
    const remaining = plan.intervalDays - used;
    criteria.push({
      criterion: 'calendar_days',
      interval: plan.intervalDays,
      used,
      remaining,
      fractionRemaining: remaining / plan.intervalDays,
      estimatedDueDate: addDays(lastDone.date, plan.intervalDays),
      estimateNote: null,
      status: classify(remaining, plan.intervalDays, remaining, o),
    });
  }

  const ordered = [...criteria].sort((a, b) => {
    const byStatus = STATUS_RANK[b.status] - STATUS_RANK[a.status];
    if (byStatus !== 0) return byStatus;
    const ta = a.estimatedDueDate?.getTime() ?? Infinity;
    const tb = b.estimatedDueDate?.getTime() ?? Infinity;
    if (ta !== tb) return ta - tb;
    return a.fractionRemaining - b.fractionRemaining;
  });
  const status = ordered[0].status;
  // An overrun plan is dated only by its overrun criteria (a calendar date still ahead would read as "not yet due").
  const candidates = status === 'overrun' ? criteria.filter((c) => c.status === 'overrun') : criteria;
  const dated = candidates.filter((c) => c.estimatedDueDate !== null).map((c) => (c.estimatedDueDate as Date).getTime());
  const dueDate = dated.length > 0 ? new Date(Math.min(...dated)) : null;
  let dueDateNote: string | null = null;
  if (status === 'overrun') {
    const overrunOn = candidates.map((c) => COUNTER_WORDS[c.criterion]).join(' and ');
    dueDateNote = dueDate === null ? `overrun on ${overrunOn}; when it fell due is not known` : `overrun on ${overrunOn}`;
  } else if (dueDate === null) {
    dueDateNote = 'the date cannot be predicted: no usage rate for the counters';
  }
  return { status, dueDate, dueDateNote, governing: ordered[0].criterion, criteria };
}

/** New "last done" from the work record that closed the task. */
export function resetFromWorkRecord(record: {
  completedAt: Date;
  runHoursAtCompletion: number;
  revolutionsAtCompletion: number;
}): LastDone {
  assertDate('completedAt', record.completedAt);
  assertFinite('runHoursAtCompletion', record.runHoursAtCompletion);
  assertFinite('revolutionsAtCompletion', record.revolutionsAtCompletion);
  if (record.runHoursAtCompletion < 0 || record.revolutionsAtCompletion < 0)
    throw new CalculationInputError(null, 'counters cannot be negative');
  return {
    runHours: record.runHoursAtCompletion,
    revolutions: record.revolutionsAtCompletion,
    date: new Date(record.completedAt.getTime()),
  };
}
