/**
 * Alarm lifecycle: the states an alarm passes through between its condition appearing and the crew
 * having dealt with it, after the alarm state model of the open alarm-management standards
 * (ANSI/ISA-18.2-2016 and IEC 62682:2014): normal, active and unacknowledged, active and
 * acknowledged, returned to normal but unacknowledged, and shelved (hidden from the crew by a
 * deliberate, recorded, time-limited decision). Pure functions; the caller records who and when.
 *
 * Process events ('reactivate', 'return_to_normal') come from limit evaluation; operator events
 * ('acknowledge', 'shelve', 'unshelve') from people; 'shelve_expired' from the clock. Events that
 * make no sense in the current state are refused with an AlarmTransitionError whose message can be
 * shown as it is.
 *
 * The 24 h default for the longest shelve is a product setting, not taken from a source.
 */

export type AlarmState = 'active_unacknowledged' | 'active_acknowledged' | 'returned_unacknowledged' | 'normal' | 'shelved';

export const ALARM_STATES: readonly AlarmState[] = [
  'active_unacknowledged',
  'active_acknowledged',
  'returned_unacknowledged',
  'normal',
  'shelved',
];

export const ALARM_STATE_LABELS: Readonly<Record<AlarmState, string>> = {
  active_unacknowledged: 'Active — not acknowledged',
  active_acknowledged: 'Active — acknowledged',
  returned_unacknowledged: 'Returned to normal — not acknowledged',
  normal: 'Normal',
  shelved: 'Shelved',
};

export type AlarmEvent =
  | { type: 'return_to_normal' }
  | { type: 'reactivate' }
  | { type: 'acknowledge' }
  | { type: 'shelve'; reason: string; until: Date }
  | { type: 'unshelve' }
  | { type: 'shelve_expired' };

export type AlarmEventType = AlarmEvent['type'];

export const ALARM_EVENT_LABELS: Readonly<Record<AlarmEventType, string>> = {
  return_to_normal: 'Returned to normal',
  reactivate: 'Condition present again',
  acknowledge: 'Acknowledged',
  shelve: 'Shelved',
  unshelve: 'Unshelved',
  shelve_expired: 'Shelve expired',
};

/** An alarm's lifecycle fields. `conditionActive` is what is tracked while shelved. */
export interface AlarmLifecycle {
  state: AlarmState;
  /** Whether the alarm's condition is present. Derived from `state` except while shelved. */
  conditionActive: boolean;
  shelvedUntil: Date | null;
  shelveReason: string | null;
}

export interface TransitionContext {
  now: Date;
  /** Longest allowed shelve in hours; default DEFAULT_MAX_SHELVE_HOURS. */
  maxShelveHours?: number;
}

export const DEFAULT_MAX_SHELVE_HOURS = 24;

const MS_PER_HOUR = 3_600_000;

export class AlarmTransitionError extends Error {
  readonly from: AlarmState;
  readonly event: AlarmEventType;
  constructor(from: AlarmState, event: AlarmEventType, message: string) {
    super(message);
    this.name = 'AlarmTransitionError';
    this.from = from;
    this.event = event;
  }
}

/** A newly raised alarm: condition present, nobody has acknowledged it. */
export function newActiveAlarm(): AlarmLifecycle {
  return { state: 'active_unacknowledged', conditionActive: true, shelvedUntil: null, shelveReason: null };
}

/** Whether the condition is present, taking it from the state unless the alarm is shelved. */
export function isConditionActive(alarm: AlarmLifecycle): boolean {
  if (alarm.state === 'shelved') return alarm.conditionActive;
  return alarm.state === 'active_unacknowledged' || alarm.state === 'active_acknowledged';
}

/** States that wait for someone to acknowledge them. */
export function needsAcknowledgement(state: AlarmState): boolean {
  return state === 'active_unacknowledged' || state === 'returned_unacknowledged';
}

function settled(state: Exclude<AlarmState, 'shelved'>): AlarmLifecycle {
  return {
    state,
    conditionActive: state === 'active_unacknowledged' || state === 'active_acknowledged',
    shelvedUntil: null,
    shelveReason: null,
  };
}

function leaveShelf(alarm: AlarmLifecycle): AlarmLifecycle {
  return settled(alarm.conditionActive ? 'active_unacknowledged' : 'normal');
}

function isValidDate(d: unknown): d is Date {
  return d instanceof Date && Number.isFinite(d.getTime());
}

/** Applies one event. Returns the new lifecycle fields or throws AlarmTransitionError. */
export function transition(alarm: AlarmLifecycle, event: AlarmEvent, context: TransitionContext): AlarmLifecycle {
  const from = alarm.state;
  const refuse = (message: string): never => {
    throw new AlarmTransitionError(from, event.type, message);
  };
  const conditionActive = isConditionActive(alarm);

  switch (event.type) {
    case 'acknowledge':
      switch (from) {
        case 'active_unacknowledged':
          return settled('active_acknowledged');
        case 'returned_unacknowledged':
          return settled('normal');
        case 'active_acknowledged':
          return refuse('This alarm has already been acknowledged.');
        case 'normal':
          return refuse('This alarm is normal — there is nothing to acknowledge.');
        case 'shelved':
          return refuse('This alarm is shelved — unshelve it before acknowledging it.');
      }
      break;

    case 'return_to_normal':
      if (!conditionActive) return refuse('The alarm condition has already returned to normal.');
      switch (from) {
        case 'active_unacknowledged':
          return settled('returned_unacknowledged');
        case 'active_acknowledged':
          return settled('normal');
        case 'shelved':
          return { ...alarm, conditionActive: false };
        default:
          return refuse('The alarm condition has already returned to normal.');
      }

    case 'reactivate':
      if (conditionActive) return refuse('The alarm condition is already active.');
      if (from === 'shelved') return { ...alarm, conditionActive: true };
      return settled('active_unacknowledged');

    case 'shelve': {
      if (from === 'shelved') {
        const until = alarm.shelvedUntil ? ` until ${alarm.shelvedUntil.toISOString()}` : '';
        return refuse(`This alarm is already shelved${until}; unshelve it first to change the shelve.`);
      }
      const reason = typeof event.reason === 'string' ? event.reason.trim() : '';
      if (reason === '') return refuse('Give a reason for shelving this alarm.');
      if (!isValidDate(event.until)) return refuse('Give a valid date and time for the shelve to end.');
      if (!isValidDate(context.now)) return refuse('The current time is not valid.');
      const maxHours = context.maxShelveHours ?? DEFAULT_MAX_SHELVE_HOURS;
      if (!(Number.isFinite(maxHours) && maxHours > 0)) return refuse('The longest allowed shelve is not set correctly.');
      const nowMs = context.now.getTime();
      const untilMs = event.until.getTime();
      if (untilMs <= nowMs) return refuse('The shelve must end in the future.');
      if (untilMs - nowMs > maxHours * MS_PER_HOUR) {
        const latest = new Date(nowMs + maxHours * MS_PER_HOUR).toISOString();
        return refuse(`An alarm can be shelved for at most ${maxHours} h; choose an end no later than ${latest}.`);
      }
      return { state: 'shelved', conditionActive, shelvedUntil: new Date(untilMs), shelveReason: reason };
    }

    case 'unshelve':
      if (from !== 'shelved') return refuse('This alarm is not shelved.');
      return leaveShelf(alarm);

    case 'shelve_expired': {
      if (from !== 'shelved') return refuse('This alarm is not shelved.');
      if (!isValidDate(alarm.shelvedUntil)) return leaveShelf(alarm);
      if (context.now.getTime() < alarm.shelvedUntil.getTime()) {
        return refuse(`The shelve has not expired yet — it runs until ${alarm.shelvedUntil.toISOString()}.`);
      }
      return leaveShelf(alarm);
    }
  }
  return refuse('Unknown alarm event.');
}

/**
 * When a shelved alarm's time is up (now ≥ shelvedUntil) it comes back: active and unacknowledged
 * if its condition is still present, otherwise normal. Any other alarm is returned unchanged.
 */
export function applyShelveExpiry(alarm: AlarmLifecycle, now: Date): AlarmLifecycle {
  if (alarm.state !== 'shelved') return alarm;
  if (isValidDate(alarm.shelvedUntil) && now.getTime() < alarm.shelvedUntil.getTime()) return alarm;
  return transition(alarm, { type: 'shelve_expired' }, { now });
}
