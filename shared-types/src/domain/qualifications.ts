/**
 * Crew qualifications: the chief engineer grants them per person, per engine and per duty.
 *
 * The duties and where Crankjournal asks for them:
 * - `pre_lube`       — pre-lubricating the main bearings: signing a checklist whose template asks for it
 *                      (the demo's pre-lube checklist).
 * - `start_and_run`  — starting and running the engine: moving a run to running (the start gate), acknowledging,
 *                      shelving and unshelving the engine's alarms, and signing checklists that ask for it
 *                      (the demo's pre-start inspection and warm-up).
 * - `shutdown`       — stopping and securing the engine: signing checklists that ask for it (the demo's shutdown).
 * - `mill_operation` — working the rolling mill: signing checklists that ask for it.
 *
 * A qualification is current from its granted date to its expiry date, both inclusive (calendar days in UTC),
 * unless it has been withdrawn. Administrators and chief engineers are not exempt: everyone needs their own.
 */
export const DUTIES = ['pre_lube', 'start_and_run', 'shutdown', 'mill_operation'] as const;
export type Duty = (typeof DUTIES)[number];

export const DUTY_LABELS: Record<Duty, string> = {
  pre_lube: 'Pre-lube',
  start_and_run: 'Start and run',
  shutdown: 'Shutdown',
  mill_operation: 'Mill operation',
};

export const DUTY_DESCRIPTIONS: Record<Duty, string> = {
  pre_lube: 'Pre-lubricate the main bearings before a start and sign the pre-lube checklist.',
  start_and_run: 'Start the engine, run it, answer its alarms, and sign the pre-start and warm-up checklists.',
  shutdown: 'Stop and secure the engine and sign the shutdown checklist.',
  mill_operation: 'Work the rolling mill and sign its checklists.',
};

/** The duty asked of whoever acknowledges, shelves or unshelves an engine's alarms. */
export const ALARM_DUTY: Duty = 'start_and_run';
/** The duty asked of whoever starts a run (moves it to running). */
export const START_DUTY: Duty = 'start_and_run';

/** Qualifications that end within this many days show as "expiring soon". */
export const QUALIFICATION_EXPIRY_WARNING_DAYS = 30;

export const QUALIFICATION_STATUSES = ['current', 'expiring_soon', 'expired', 'not_yet_valid', 'withdrawn'] as const;
export type QualificationStatus = (typeof QUALIFICATION_STATUSES)[number];

export const QUALIFICATION_STATUS_LABELS: Record<QualificationStatus, string> = {
  current: 'Current',
  expiring_soon: 'Expiring soon',
  expired: 'Expired',
  not_yet_valid: 'Not yet valid',
  withdrawn: 'Withdrawn',
};

/** Statuses under which the person may do the duty. */
export const QUALIFIED_STATUSES: readonly QualificationStatus[] = ['current', 'expiring_soon'];
