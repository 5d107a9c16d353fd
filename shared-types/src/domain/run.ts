export const RUN_STATES = ['planned', 'preparing', 'cleared', 'running', 'stopped', 'closed', 'abandoned'] as const;
export type RunState = (typeof RUN_STATES)[number];
export const RUN_PURPOSES = ['demonstration', 'production_lot', 'test', 'turning_over'] as const;
export type RunPurpose = (typeof RUN_PURPOSES)[number];

export const RUN_STATE_LABELS: Record<RunState, string> = {
  planned: 'Planned',
  preparing: 'Preparing',
  cleared: 'Cleared to start',
  running: 'Running',
  stopped: 'Stopped',
  closed: 'Closed',
  abandoned: 'Abandoned',
};
export const RUN_PURPOSE_LABELS: Record<RunPurpose, string> = {
  demonstration: 'Demonstration',
  production_lot: 'Production lot',
  test: 'Test',
  turning_over: 'Turning over for maintenance',
};
/** The transitions a run may make. `running` is reached only through the start gate. */
export const RUN_TRANSITIONS: Record<RunState, RunState[]> = {
  planned: ['preparing', 'abandoned'],
  preparing: ['cleared', 'abandoned'],
  cleared: ['running', 'preparing', 'abandoned'],
  running: ['stopped'],
  stopped: ['closed'],
  closed: [],
  abandoned: [],
};
/** Readings are accepted while a run is in one of these states. */
export const RUN_STATES_TAKING_READINGS: readonly RunState[] = ['preparing', 'cleared', 'running', 'stopped'];

export const READING_SOURCES = ['round', 'logger', 'import', 'live'] as const;
export type ReadingSource = (typeof READING_SOURCES)[number];

/** `pre_alarm`: the forecast of a limit within the pre-alarm setting (advisory, the lowest priority). */
export const ALARM_KINDS = ['high', 'high_high', 'low', 'rate_of_rise', 'above_ambient', 'above_mawp', 'overspeed', 'pre_alarm'] as const;
export type AlarmKind = (typeof ALARM_KINDS)[number];
export const ALARM_STATES = ['active_unacknowledged', 'active_acknowledged', 'returned_unacknowledged', 'normal', 'shelved'] as const;
export type AlarmState = (typeof ALARM_STATES)[number];
/** `advisory`: a pre-alarm, lowest of all; never e-mailed, never counted in the alarm system's figures. */
export type AlarmPriority = 'advisory' | 'high' | 'high_high';
export const ALARM_PRIORITY_WORDS: Record<AlarmPriority, string> = {
  advisory: 'Pre-alarm (advisory)',
  high: 'High',
  high_high: 'High-high',
};
export type AlarmSuppression = 'design' | 'state';
export const ALARM_STATE_WORDS: Record<AlarmState, string> = {
  active_unacknowledged: 'Active — not acknowledged',
  active_acknowledged: 'Active — acknowledged',
  returned_unacknowledged: 'Returned to normal — not acknowledged',
  normal: 'Normal',
  shelved: 'Shelved',
};
export const ALARM_KIND_WORDS: Record<AlarmKind, string> = {
  high: 'High',
  high_high: 'High-high',
  low: 'Low',
  rate_of_rise: 'Rising fast',
  above_ambient: 'Rise above ambient',
  above_mawp: 'Above maximum allowable working pressure',
  overspeed: 'Overspeed',
  pre_alarm: 'Limit forecast',
};

/**
 * Suppression by design, in words for the engine page. The service's rule table (alarm-suppression.ts) is checked
 * against these words by its unit test.
 */
export const DESIGN_SUPPRESSION_RULE_WORDS: readonly string[] = [
  'While high-high is active on a point, its high alarm is recorded but suppressed.',
  'While high-high is active on a point, its rising too fast alarm is recorded but suppressed (where marked related).',
  'While high-high is active on a point, its too far above ambient alarm is recorded but suppressed (where marked related).',
  'While high is active on a point, its rising too fast alarm is recorded but suppressed (where marked related).',
  'While high is active on a point, its too far above ambient alarm is recorded but suppressed (where marked related).',
];
