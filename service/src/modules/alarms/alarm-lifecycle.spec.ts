/**
 * Transitions follow the alarm state model described, in general terms, by ANSI/ISA-18.2-2016,
 * Management of Alarm Systems for the Process Industries, alarm state transition diagram, and
 * IEC 62682:2014 (its international counterpart), from memory: an alarm becomes active and
 * unacknowledged; acknowledging an active alarm makes it active-acknowledged; an acknowledged alarm
 * whose condition clears returns to normal; an unacknowledged one whose condition clears waits,
 * returned but unacknowledged, until someone acknowledges it; if the condition comes back first it is
 * active and unacknowledged again; shelving is a deliberate, time-limited suppression by the operator.
 * The 24 h maximum shelve and the refusals are product rules, not from a source.
 */
import {
  ALARM_STATES,
  ALARM_STATE_LABELS,
  AlarmTransitionError,
  type AlarmLifecycle,
  type AlarmState,
  applyShelveExpiry,
  isConditionActive,
  needsAcknowledgement,
  newActiveAlarm,
  transition,
} from './alarm-lifecycle.js';

const NOW = new Date('2024-06-01T10:00:00Z');
const hours = (h: number) => new Date(NOW.getTime() + h * 3_600_000);
const ctx = { now: NOW };

function inState(state: Exclude<AlarmState, 'shelved'>): AlarmLifecycle {
  return {
    state,
    conditionActive: state === 'active_unacknowledged' || state === 'active_acknowledged',
    shelvedUntil: null,
    shelveReason: null,
  };
}

function shelved(conditionActive: boolean, until = hours(2)): AlarmLifecycle {
  return { state: 'shelved', conditionActive, shelvedUntil: until, shelveReason: 'sensor lead damaged' };
}

function refusal(fn: () => unknown): AlarmTransitionError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(AlarmTransitionError);
    return e as AlarmTransitionError;
  }
  throw new Error('expected an AlarmTransitionError');
}

describe('labels', () => {
  it('every state has a plain label', () => {
    for (const s of ALARM_STATES) expect(ALARM_STATE_LABELS[s]).toMatch(/\w/);
    expect(ALARM_STATE_LABELS.active_unacknowledged).toBe('Active — not acknowledged');
    expect(new Set(Object.values(ALARM_STATE_LABELS)).size).toBe(ALARM_STATES.length);
  });
});

describe('ISA-18.2 / IEC 62682 alarm states (see file header)', () => {
  it('a new alarm is active and unacknowledged', () => {
    const a = newActiveAlarm();
    expect(a.state).toBe('active_unacknowledged');
    expect(needsAcknowledgement(a.state)).toBe(true);
  });
  it('normal → condition present → active, unacknowledged', () => {
    expect(transition(inState('normal'), { type: 'reactivate' }, ctx).state).toBe('active_unacknowledged');
  });
  it('active unacknowledged → acknowledge → active acknowledged', () => {
    expect(transition(inState('active_unacknowledged'), { type: 'acknowledge' }, ctx).state).toBe('active_acknowledged');
  });
  it('active acknowledged → return to normal → normal', () => {
    expect(transition(inState('active_acknowledged'), { type: 'return_to_normal' }, ctx).state).toBe('normal');
  });
  it('active unacknowledged → return to normal → returned, unacknowledged', () => {
    const r = transition(inState('active_unacknowledged'), { type: 'return_to_normal' }, ctx);
    expect(r.state).toBe('returned_unacknowledged');
    expect(isConditionActive(r)).toBe(false);
    expect(needsAcknowledgement(r.state)).toBe(true);
  });
  it('returned unacknowledged → acknowledge → normal', () => {
    expect(transition(inState('returned_unacknowledged'), { type: 'acknowledge' }, ctx).state).toBe('normal');
  });
  it('returned unacknowledged → condition present again → active, unacknowledged', () => {
    expect(transition(inState('returned_unacknowledged'), { type: 'reactivate' }, ctx).state).toBe('active_unacknowledged');
  });
});

describe('refusals (product rules)', () => {
  it('acknowledging a normal alarm is refused with a plain message', () => {
    const e = refusal(() => transition(inState('normal'), { type: 'acknowledge' }, ctx));
    expect(e.message).toBe('This alarm is normal — there is nothing to acknowledge.');
    expect(e.from).toBe('normal');
    expect(e.event).toBe('acknowledge');
  });
  it('acknowledging twice, or while shelved, is refused', () => {
    refusal(() => transition(inState('active_acknowledged'), { type: 'acknowledge' }, ctx));
    refusal(() => transition(shelved(true), { type: 'acknowledge' }, ctx));
  });
  it('return to normal when the condition is already clear, and reactivate when already active, are refused', () => {
    refusal(() => transition(inState('normal'), { type: 'return_to_normal' }, ctx));
    refusal(() => transition(inState('returned_unacknowledged'), { type: 'return_to_normal' }, ctx));
    refusal(() => transition(inState('active_unacknowledged'), { type: 'reactivate' }, ctx));
    refusal(() => transition(inState('active_acknowledged'), { type: 'reactivate' }, ctx));
    refusal(() => transition(shelved(true), { type: 'reactivate' }, ctx));
    refusal(() => transition(shelved(false), { type: 'return_to_normal' }, ctx));
  });
  it('unshelving or expiring an alarm that is not shelved is refused', () => {
    refusal(() => transition(inState('active_unacknowledged'), { type: 'unshelve' }, ctx));
    refusal(() => transition(inState('normal'), { type: 'shelve_expired' }, ctx));
  });
});

describe('shelving', () => {
  const shelve = (reason: string, until: Date) => ({ type: 'shelve' as const, reason, until });

  it('shelves with a reason and a future end, remembering whether the condition is present', () => {
    const s = transition(inState('active_unacknowledged'), shelve('  sensor lead damaged ', hours(8)), ctx);
    expect(s).toEqual({ state: 'shelved', conditionActive: true, shelvedUntil: hours(8), shelveReason: 'sensor lead damaged' });
    const n = transition(inState('normal'), shelve('planned test', hours(1)), ctx);
    expect(n.conditionActive).toBe(false);
  });

  it('refuses a blank reason', () => {
    expect(refusal(() => transition(inState('active_acknowledged'), shelve('   ', hours(1)), ctx)).message).toMatch(/reason/);
  });

  it('refuses an end that is now or past', () => {
    refusal(() => transition(inState('active_acknowledged'), shelve('x', NOW), ctx));
    refusal(() => transition(inState('active_acknowledged'), shelve('x', hours(-1)), ctx));
    refusal(() => transition(inState('active_acknowledged'), shelve('x', new Date(Number.NaN)), ctx));
  });

  it('allows exactly 24 h by default and refuses longer; the maximum is a setting', () => {
    expect(transition(inState('active_acknowledged'), shelve('x', hours(24)), ctx).state).toBe('shelved');
    expect(refusal(() => transition(inState('active_acknowledged'), shelve('x', hours(24.01)), ctx)).message).toMatch(/24 h/);
    expect(transition(inState('active_acknowledged'), shelve('x', hours(48)), { now: NOW, maxShelveHours: 72 }).state).toBe('shelved');
    refusal(() => transition(inState('active_acknowledged'), shelve('x', hours(2)), { now: NOW, maxShelveHours: 1 }));
  });

  it('refuses shelving an alarm that is already shelved', () => {
    refusal(() => transition(shelved(true), shelve('again', hours(3)), ctx));
  });

  it('while shelved, the condition is tracked but the alarm stays shelved', () => {
    const cleared = transition(shelved(true), { type: 'return_to_normal' }, ctx);
    expect(cleared.state).toBe('shelved');
    expect(cleared.conditionActive).toBe(false);
    const back = transition(cleared, { type: 'reactivate' }, ctx);
    expect(back.state).toBe('shelved');
    expect(back.conditionActive).toBe(true);
    expect(back.shelvedUntil).toEqual(hours(2));
  });

  it('unshelving returns to active, unacknowledged if the condition is present, else normal', () => {
    const a = transition(shelved(true), { type: 'unshelve' }, ctx);
    expect(a.state).toBe('active_unacknowledged');
    expect(a.shelvedUntil).toBeNull();
    expect(a.shelveReason).toBeNull();
    expect(transition(shelved(false), { type: 'unshelve' }, ctx).state).toBe('normal');
  });

  it('an acknowledged alarm shelved and unshelved with the condition present must be acknowledged again', () => {
    const s = transition(inState('active_acknowledged'), shelve('x', hours(1)), ctx);
    expect(transition(s, { type: 'unshelve' }, ctx).state).toBe('active_unacknowledged');
  });
});

describe('shelve expiry', () => {
  it('before the end, applyShelveExpiry leaves the alarm as it is and the event is refused', () => {
    const s = shelved(true, hours(2));
    expect(applyShelveExpiry(s, hours(1.99))).toBe(s);
    expect(refusal(() => transition(s, { type: 'shelve_expired' }, { now: hours(1) })).message).toMatch(/not expired/);
  });
  it('at the end (now ≥ shelvedUntil) it comes back active and unacknowledged if the condition is present', () => {
    expect(applyShelveExpiry(shelved(true, hours(2)), hours(2)).state).toBe('active_unacknowledged');
  });
  it('after the end it goes to normal if the condition has cleared', () => {
    const r = applyShelveExpiry(shelved(false, hours(2)), hours(3));
    expect(r.state).toBe('normal');
    expect(r.shelvedUntil).toBeNull();
  });
  it('does nothing to an alarm that is not shelved', () => {
    const a = inState('active_acknowledged');
    expect(applyShelveExpiry(a, hours(100))).toBe(a);
  });
});
