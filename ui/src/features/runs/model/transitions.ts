import { RUN_TRANSITIONS, type Role, type RunState } from '@crankjournal/shared-types';

export type TransitionTarget = Exclude<RunState, 'planned'>;

/** Who may move a run into each state. The server enforces the same rule; this only decides which buttons to show. */
export const TRANSITION_ROLES: Record<TransitionTarget, readonly Role[]> = {
  preparing: ['operator', 'chief_engineer'],
  cleared: ['chief_engineer'],
  running: ['operator', 'chief_engineer'],
  stopped: ['operator', 'chief_engineer'],
  // Closing is the countersignature: the chief engineer's alone.
  closed: ['chief_engineer'],
  abandoned: ['operator', 'chief_engineer'],
};

/** What each transition's button says, by the state it leads to (and, for preparing, where it comes from). */
export function transitionLabel(from: RunState, to: TransitionTarget): string {
  switch (to) {
    case 'preparing':
      return from === 'cleared' ? 'Return to preparing' : 'Prepare';
    case 'cleared':
      return 'Clear to start';
    case 'running':
      return 'Start engine';
    case 'stopped':
      return 'Stop engine';
    case 'closed':
      return 'Close and countersign';
    case 'abandoned':
      return 'Abandon';
  }
}

/** The transitions this role may make from this state, in the order the buttons appear (the forward step first). */
export function allowedTransitions(state: RunState, role: Role | undefined): TransitionTarget[] {
  if (!role) return [];
  const order: TransitionTarget[] = ['preparing', 'cleared', 'running', 'stopped', 'closed', 'abandoned'];
  const next = RUN_TRANSITIONS[state] as TransitionTarget[];
  const forward = next.filter((t) => t !== 'abandoned' && !(state === 'cleared' && t === 'preparing'));
  const rest = next.filter((t) => !forward.includes(t));
  return [
    ...forward.sort((a, b) => order.indexOf(a) - order.indexOf(b)),
    ...rest.sort((a, b) => order.indexOf(a) - order.indexOf(b)),
  ].filter((t) => TRANSITION_ROLES[t].includes(role));
}

/** States in which a run is over and its log is a record. */
export const FINISHED_STATES: readonly RunState[] = ['closed', 'abandoned'];

/** "2 h 05 min" from seconds. */
export function formatDuration(seconds: number): string {
  const s = Math.max(0, Math.floor(seconds));
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  if (h === 0) return `${m} min`;
  return `${h} h ${String(m).padStart(2, '0')} min`;
}

/** A run's planned day: the server keeps a date ("2026-12-05"), shown as that local calendar day. */
export function formatPlannedFor(value: string | null, opts: { long?: boolean } = {}): string {
  if (!value) return 'Date not fixed';
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  const d = m ? new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3])) : new Date(value);
  if (Number.isNaN(d.getTime())) return value;
  return d.toLocaleDateString(undefined, { weekday: opts.long ? 'long' : 'short', day: 'numeric', month: 'short', year: 'numeric' });
}
