import {
  daysBetween,
  isCalendarDate,
  isQualified,
  qualificationProblem,
  qualificationStatus,
  starterReason,
  utcDateOf,
} from './qualification-rules.js';

// Calendar arithmetic is checked against plain calendar facts (common practice, no source):
// 2028 is a leap year (29 February exists), 2026 is not; a non-leap year has 365 days.
describe('calendar dates', () => {
  it('counts whole days, across a month end and a leap day', () => {
    expect(daysBetween('2026-01-31', '2026-02-01')).toBe(1);
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2);
    expect(daysBetween('2026-02-28', '2026-03-01')).toBe(1);
    expect(daysBetween('2026-01-01', '2027-01-01')).toBe(365);
    expect(daysBetween('2026-03-10', '2026-03-01')).toBe(-9);
  });
  it('refuses dates that do not exist', () => {
    expect(isCalendarDate('2026-02-29')).toBe(false);
    expect(isCalendarDate('2028-02-29')).toBe(true);
    expect(isCalendarDate('2026-13-01')).toBe(false);
    expect(isCalendarDate('26-01-01')).toBe(false);
  });
  it('takes the UTC date of an instant', () => {
    expect(utcDateOf(new Date('2026-12-05T23:30:00-02:00'))).toBe('2026-12-06');
  });
});

describe('qualificationStatus (granted and expiry dates both inclusive)', () => {
  const q = { grantedOn: '2026-03-01', expiresOn: '2026-12-31', withdrawnAt: null };
  it('is current well inside its dates', () => {
    expect(qualificationStatus(q, '2026-06-01', 30)).toBe('current');
  });
  it('is still valid on its expiry day and expired the day after', () => {
    expect(qualificationStatus(q, '2026-12-31', 30)).toBe('expiring_soon');
    expect(qualificationStatus(q, '2027-01-01', 30)).toBe('expired');
  });
  it('warns within the window and not before it', () => {
    expect(qualificationStatus(q, '2026-12-01', 30)).toBe('expiring_soon');
    expect(qualificationStatus(q, '2026-11-30', 30)).toBe('current');
  });
  it('is not yet valid before its granted date, valid on it', () => {
    expect(qualificationStatus(q, '2026-02-28', 30)).toBe('not_yet_valid');
    expect(qualificationStatus(q, '2026-03-01', 30)).toBe('current');
  });
  it('is withdrawn whatever its dates', () => {
    expect(qualificationStatus({ ...q, withdrawnAt: new Date('2026-05-01T10:00:00Z') }, '2026-06-01', 30)).toBe('withdrawn');
  });
  it('counts only current and expiring-soon as qualified', () => {
    expect(isQualified('current')).toBe(true);
    expect(isQualified('expiring_soon')).toBe(true);
    expect(isQualified('expired')).toBe(false);
    expect(isQualified('withdrawn')).toBe(false);
    expect(isQualified('not_yet_valid')).toBe(false);
    expect(isQualified('none')).toBe(false);
  });
});

describe('qualification reasons', () => {
  it('says nothing when qualified', () => {
    expect(qualificationProblem({ status: 'current' }, 'pre_lube', 'No. 2 engine')).toBeNull();
    expect(starterReason({ status: 'expiring_soon', expiresOn: '2026-12-31' }, 'start_and_run', 'No. 2 engine')).toBeNull();
  });
  it('names the expiry date of an expired qualification', () => {
    const r = starterReason({ status: 'expired', expiresOn: '2026-10-31' }, 'start_and_run', 'No. 2 engine');
    expect(r?.code).toBe('qualification_expired');
    expect(r?.message).toContain('Your start and run qualification for No. 2 engine expired on 2026-10-31');
  });
  it('says a missing qualification is missing, naming the person when it is not the reader', () => {
    const r = qualificationProblem({ status: 'none' }, 'pre_lube', 'No. 2 engine', 'A. Person');
    expect(r).toEqual({
      code: 'qualification_missing',
      message: 'A. Person holds no pre-lube qualification for No. 2 engine. The chief engineer grants it.',
    });
  });
  it('treats a withdrawn or not-yet-valid qualification as missing', () => {
    expect(qualificationProblem({ status: 'withdrawn', withdrawnAt: new Date('2026-05-01T00:00:00Z') }, 'shutdown', 'E')?.code).toBe(
      'qualification_missing',
    );
    expect(qualificationProblem({ status: 'not_yet_valid', grantedOn: '2027-01-01' }, 'shutdown', 'E')?.message).toContain(
      'valid only from 2027-01-01',
    );
  });
});
