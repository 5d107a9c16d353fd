import type { Role } from '../domain/roles.js';
import type { Duty, QualificationStatus } from '../domain/qualifications.js';

export interface QualificationDto {
  id: string;
  userId: string;
  userName: string;
  engineId: string;
  engineName: string;
  duty: Duty;
  /** Calendar dates (YYYY-MM-DD), both inclusive. */
  grantedOn: string;
  expiresOn: string;
  notes: string;
  status: QualificationStatus;
  /** Days from today to the expiry date (negative once expired). */
  daysToExpiry: number;
  grantedByName: string;
  grantedAt: string;
  updatedAt: string;
  withdrawnAt: string | null;
  withdrawnByName: string | null;
  withdrawnReason: string | null;
}

export interface GrantQualificationRequest {
  userId: string;
  engineId: string;
  duty: Duty;
  grantedOn: string;
  expiresOn: string;
  notes?: string;
}
/**
 * Renewal: the standing qualification is withdrawn ("Renewed") and a new one granted in its place, so the
 * old dates stay in the record. grantedOn defaults to today, notes to the old notes.
 */
export interface RenewQualificationRequest {
  grantedOn?: string;
  expiresOn: string;
  notes?: string;
}
export interface WithdrawQualificationRequest {
  reason: string;
}

export interface QualificationMatrixRow {
  userId: string;
  displayName: string;
  role: Role;
  /** The person's qualification for each duty on this engine (withdrawn ones left out), or null. */
  cells: Record<Duty, QualificationDto | null>;
}
/** The crew against the duties of one engine, for the chief engineer. */
export interface QualificationMatrix {
  engineId: string;
  engineName: string;
  today: string;
  warningDays: number;
  duties: Duty[];
  rows: QualificationMatrixRow[];
  /** Every qualification that ends within the warning window or has ended (not withdrawn), soonest first. */
  attention: QualificationDto[];
}
