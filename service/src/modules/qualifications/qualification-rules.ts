import {
  DUTY_LABELS,
  GATE_REASON_CODES,
  QUALIFICATION_EXPIRY_WARNING_DAYS,
  QUALIFIED_STATUSES,
  type Duty,
  type QualificationStatus,
  type StartGateReason,
} from '@crankjournal/shared-types';

const MS_PER_DAY = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** The calendar date (UTC) of an instant, as YYYY-MM-DD. Qualification dates are compared in UTC. */
export function utcDateOf(at: Date): string {
  return at.toISOString().slice(0, 10);
}

function dayNumber(isoDate: string): number {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new Error(`not a calendar date: ${isoDate}`);
  return Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / MS_PER_DAY;
}

/** Whole calendar days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return dayNumber(to) - dayNumber(from);
}

/** True for a real calendar date written YYYY-MM-DD (2026-02-30 is refused). */
export function isCalendarDate(s: string): boolean {
  const m = ISO_DATE.exec(s);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
}

export interface QualificationDates {
  grantedOn: string;
  expiresOn: string;
  withdrawnAt: Date | null;
}

/**
 * Where a qualification stands on `today`: valid from its granted date to its expiry date, both inclusive;
 * "expiring soon" within `warningDays` of the expiry; withdrawn overrides everything.
 */
export function qualificationStatus(
  q: QualificationDates,
  today: string,
  warningDays = QUALIFICATION_EXPIRY_WARNING_DAYS,
): QualificationStatus {
  if (q.withdrawnAt) return 'withdrawn';
  if (daysBetween(today, q.grantedOn) > 0) return 'not_yet_valid';
  const left = daysBetween(today, q.expiresOn);
  if (left < 0) return 'expired';
  if (left <= warningDays) return 'expiring_soon';
  return 'current';
}

export function isQualified(status: QualificationStatus | 'none'): boolean {
  return status !== 'none' && QUALIFIED_STATUSES.includes(status);
}

export interface QualificationFinding {
  /** 'none' when the person never held this duty on this engine. */
  status: QualificationStatus | 'none';
  grantedOn?: string;
  expiresOn?: string;
  withdrawnAt?: Date | null;
}

/**
 * What is wrong with a person's qualification for a duty, in words a person can act on; null when they
 * are qualified. `who` is "You" for the person asking, or a name.
 */
export function qualificationProblem(
  finding: QualificationFinding,
  duty: Duty,
  engineName: string,
  who = 'You',
): { code: string; message: string } | null {
  if (isQualified(finding.status)) return null;
  const dutyWords = `${DUTY_LABELS[duty].toLowerCase()} qualification for ${engineName}`;
  const whose = who === 'You' ? 'Your' : `${who}’s`;
  switch (finding.status) {
    case 'expired':
      return {
        code: GATE_REASON_CODES.qualificationExpired,
        message: `${whose} ${dutyWords} expired on ${finding.expiresOn}. The chief engineer must renew it.`,
      };
    case 'not_yet_valid':
      return { code: GATE_REASON_CODES.qualificationMissing, message: `${whose} ${dutyWords} is valid only from ${finding.grantedOn}.` };
    case 'withdrawn':
      return {
        code: GATE_REASON_CODES.qualificationMissing,
        message:
          `${whose} ${dutyWords} was withdrawn${finding.withdrawnAt ? ` on ${utcDateOf(finding.withdrawnAt)}` : ''}. ` +
          'Only the chief engineer can grant it again.',
      };
    default:
      return {
        code: GATE_REASON_CODES.qualificationMissing,
        message: `${who === 'You' ? 'You hold' : `${who} holds`} no ${dutyWords}. The chief engineer grants it.`,
      };
  }
}

/** The start gate's reason when the person starting is not qualified to start and run the engine. */
export function starterReason(finding: QualificationFinding, duty: Duty, engineName: string): StartGateReason | null {
  const p = qualificationProblem(finding, duty, engineName);
  return p
    ? { code: p.code, message: `${p.message} Starting the engine needs a current ${DUTY_LABELS[duty].toLowerCase()} qualification.` }
    : null;
}
