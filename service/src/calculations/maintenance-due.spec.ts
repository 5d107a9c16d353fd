import { maintenanceDue, resetFromWorkRecord, addDays, DUE_RULE_TEXT, MS_PER_DAY, type LastDone } from './maintenance-due.js';

// Due rules are the product's own (10 % of interval or 7 days; common practice, no source).
const lastDone: LastDone = { runHours: 1000, revolutions: 4_000_000, date: new Date('2025-05-01T00:00:00Z') };
const plan = { intervalRunHours: 200, intervalRevolutions: 900_000, intervalDays: 365 };

describe('each criterion can come due first', () => {
  it('running hours first: 190 of 200 h used → due soon, governed by run hours', () => {
    const r = maintenanceDue(plan, lastDone, { runHours: 1190, revolutions: 4_500_000, now: new Date('2025-09-01T00:00:00Z') });
    expect(r.governing).toBe('run_hours');
    expect(r.status).toBe('coming_due');
    const hours = r.criteria.find((c) => c.criterion === 'run_hours')!;
    expect(hours.remaining).toBe(10);
    expect(hours.fractionRemaining).toBeCloseTo(0.05, 12);
  });

  it('revolutions first: 905,000 of 900,000 revolutions → overdue even though hours and days remain', () => {
    const r = maintenanceDue(plan, lastDone, { runHours: 1150, revolutions: 4_905_000, now: new Date('2025-09-01T00:00:00Z') });
    expect(r.governing).toBe('revolutions');
    expect(r.status).toBe('overrun');
    expect(r.criteria.find((c) => c.criterion === 'revolutions')!.remaining).toBe(-5000);
    expect(r.criteria.find((c) => c.criterion === 'run_hours')!.status).toBe('in_hand');
  });

  it('calendar first: little running, but 360 of 365 days gone → due soon with the calendar due date', () => {
    const now = addDays(lastDone.date, 360);
    const r = maintenanceDue(plan, lastDone, { runHours: 1020, revolutions: 4_090_000, now });
    expect(r.governing).toBe('calendar_days');
    expect(r.status).toBe('coming_due');
    expect(r.dueDate!.toISOString()).toBe('2026-05-01T00:00:00.000Z');
    expect(r.criteria.find((c) => c.criterion === 'calendar_days')!.remaining).toBeCloseTo(5, 9);
  });

  it('calendar overdue the day after the interval', () => {
    const r = maintenanceDue({ intervalDays: 30 }, lastDone, { runHours: 1000, revolutions: 4_000_000, now: addDays(lastDone.date, 31) });
    expect(r.status).toBe('overrun');
    expect(r.criteria[0].remaining).toBeCloseTo(-1, 9);
  });
});

describe('thresholds', () => {
  const at = (hoursUsed: number) =>
    maintenanceDue({ intervalRunHours: 200 }, lastDone, {
      runHours: 1000 + hoursUsed,
      revolutions: 4_000_000,
      now: new Date('2025-06-01T00:00:00Z'),
    }).status;
  it('exactly 10 % left is due soon; a little more is ok; reaching the interval is overdue', () => {
    expect(at(179.9)).toBe('in_hand');
    expect(at(180)).toBe('coming_due');
    expect(at(199.9)).toBe('coming_due');
    expect(at(200)).toBe('overrun');
  });

  it('a usage rate turns remaining hours into a due date, and 7 days or less is due soon', () => {
    const now = new Date('2025-06-01T00:00:00Z');
    // 150 of 200 h used: 50 h left (25 %), at 8 h a day → 6.25 days → due soon by date
    const soon = maintenanceDue(
      { intervalRunHours: 200 },
      lastDone,
      { runHours: 1150, revolutions: 4_000_000, now },
      { runHoursPerDay: 8 },
    );
    expect(soon.status).toBe('coming_due');
    expect(soon.dueDate!.getTime()).toBe(now.getTime() + 6.25 * 86_400_000);
    // at 2 h a day the same 50 h is 25 days away → ok
    const later = maintenanceDue(
      { intervalRunHours: 200 },
      lastDone,
      { runHours: 1150, revolutions: 4_000_000, now },
      { runHoursPerDay: 2 },
    );
    expect(later.status).toBe('in_hand');
    expect(later.dueDate!.getTime()).toBe(now.getTime() + 25 * 86_400_000);
  });

  it('the earliest estimate is the due date, whichever criterion gives it', () => {
    const now = new Date('2025-06-01T00:00:00Z');
    const r = maintenanceDue(
      plan,
      lastDone,
      { runHours: 1100, revolutions: 4_450_000, now },
      { runHoursPerDay: 4, revolutionsPerDay: 9_000 },
    );
    // hours: 100 left / 4 = 25 days; revolutions: 450,000 / 9,000 = 50 days; calendar: 2026-05-01
    expect(r.dueDate!.getTime()).toBe(now.getTime() + 25 * 86_400_000);
    expect(r.governing).toBe('run_hours');
    expect(r.status).toBe('in_hand');
  });

  it('thresholds are settings', () => {
    const r = maintenanceDue(
      { intervalRunHours: 200 },
      lastDone,
      { runHours: 1170, revolutions: 4_000_000, now: new Date('2025-06-01T00:00:00Z') },
      {},
      { dueSoonFraction: 0.2 },
    );
    expect(r.status).toBe('coming_due');
  });

  it('rejects a plan with no interval and counters that run backwards', () => {
    const now = new Date('2025-06-01T00:00:00Z');
    expect(() => maintenanceDue({}, lastDone, { runHours: 1100, revolutions: 4_000_000, now })).toThrow(RangeError);
    expect(() => maintenanceDue(plan, lastDone, { runHours: 900, revolutions: 4_000_000, now })).toThrow(RangeError);
  });

  it('exports the rule text', () => {
    expect(DUE_RULE_TEXT).toMatch(/10 %/);
    expect(DUE_RULE_TEXT).toMatch(/7 days/);
    // Our words (the same as DUE_STATUS_LABELS): coming due, overrun.
    expect(DUE_RULE_TEXT).toMatch(/coming due when/);
    expect(DUE_RULE_TEXT).toMatch(/overrun once/);
  });
});

describe('reset from the closing work record', () => {
  it('takes the counters and date from the record, and the task is then ok again', () => {
    const completedAt = new Date('2025-09-10T15:30:00Z');
    const next = resetFromWorkRecord({ completedAt, runHoursAtCompletion: 1203.5, revolutionsAtCompletion: 4_910_000 });
    expect(next).toEqual({ runHours: 1203.5, revolutions: 4_910_000, date: completedAt });
    expect(next.date).not.toBe(completedAt);
    const r = maintenanceDue(plan, next, { runHours: 1203.5, revolutions: 4_910_000, now: completedAt });
    expect(r.status).toBe('in_hand');
    expect(r.criteria.every((c) => c.used === 0)).toBe(true);
  });
});

describe('an overdue plan never shows a future date', () => {
  const now = new Date('2026-09-01T00:00:00Z');
  const lastDone = { runHours: 0, revolutions: 0, date: new Date('2026-08-01T00:00:00Z') };

  it('overdue on revolutions with no usage rate: no due date (not the calendar date ahead), and says so', () => {
    const r = maintenanceDue({ intervalRevolutions: 100_000, intervalDays: 365 }, lastDone, { runHours: 10, revolutions: 120_000, now });
    expect(r.status).toBe('overrun');
    expect(r.dueDate).toBeNull();
    expect(r.dueDateNote).toBe('overrun on revolutions; when it fell due is not known');
    expect(r.criteria.find((c) => c.criterion === 'revolutions')!.estimateNote).toMatch(/cannot be predicted: no usage rate/);
  });

  it('overdue on hours with a usage rate: the date it fell due, in the past', () => {
    const r = maintenanceDue(
      { intervalRunHours: 100, intervalDays: 365 },
      lastDone,
      { runHours: 120, revolutions: 0, now },
      { runHoursPerDay: 4 },
    );
    expect(r.status).toBe('overrun');
    expect(r.dueDate!.getTime()).toBe(now.getTime() - 5 * MS_PER_DAY);
    expect(r.dueDateNote).toBe('overrun on running hours');
  });

  it('not overdue, counters only, no rate: the date cannot be predicted', () => {
    const r = maintenanceDue({ intervalRunHours: 100 }, lastDone, { runHours: 10, revolutions: 0, now });
    expect(r.dueDate).toBeNull();
    expect(r.dueDateNote).toMatch(/cannot be predicted/);
  });
});
