import type { ComponentType } from 'react';
import { Badge } from '@mantine/core';
import {
  IconAlertOctagon,
  IconAlertTriangle,
  IconBellCheck,
  IconCircleDashedCheck,
  IconClockPause,
  IconTrendingUp,
} from '@tabler/icons-react';
import { ALARM_PRIORITY_WORDS, ALARM_STATE_WORDS, type AlarmPriority, type AlarmState } from '@crankjournal/shared-types';

type Icon = ComponentType<{ size?: number | string; stroke?: number; 'aria-hidden'?: boolean }>;

/** How an alarm state looks: an icon and a word as well as a colour, so it reads without colour. */
export interface AlarmLook {
  color: string;
  variant: 'filled' | 'light' | 'outline';
  Icon: Icon;
  word: string;
  /** A short word for tight places (board tiles). */
  short: string;
  shelved: boolean;
}

/** Red for high-high, amber for high; an advisory pre-alarm (a forecast, not an abnormal state) stays neutral. */
export function priorityColor(priority: AlarmPriority | null | undefined): string {
  return priority === 'high_high' ? 'signal' : priority === 'advisory' ? 'gray' : 'amber';
}

/** The highest of some priorities (for a counter that takes the colour of the highest waiting one). */
export function highestPriority(priorities: readonly AlarmPriority[]): AlarmPriority {
  return priorities.includes('high_high') ? 'high_high' : priorities.includes('high') ? 'high' : priorities.length ? 'advisory' : 'high';
}

export function alarmLook(state: AlarmState, priority: AlarmPriority | null | undefined): AlarmLook | null {
  const color = priorityColor(priority);
  const level = priority === 'advisory' ? 'Pre-alarm' : ALARM_PRIORITY_WORDS[priority ?? 'high'];
  switch (state) {
    case 'active_unacknowledged':
      return {
        color,
        // A pre-alarm is advisory: an outline, never a fill.
        variant: priority === 'advisory' ? 'outline' : 'filled',
        Icon: priority === 'high_high' ? IconAlertOctagon : priority === 'advisory' ? IconTrendingUp : IconAlertTriangle,
        word: ALARM_STATE_WORDS[state],
        short: `${level} — not acknowledged`,
        shelved: false,
      };
    case 'active_acknowledged':
      return {
        color,
        variant: 'light',
        Icon: IconBellCheck,
        word: ALARM_STATE_WORDS[state],
        short: `${level} — acknowledged`,
        shelved: false,
      };
    case 'returned_unacknowledged':
      return {
        color: 'amber',
        variant: 'outline',
        Icon: IconCircleDashedCheck,
        word: ALARM_STATE_WORDS[state],
        short: 'Returned — not acknowledged',
        shelved: false,
      };
    case 'shelved':
      return { color: 'gray', variant: 'outline', Icon: IconClockPause, word: ALARM_STATE_WORDS[state], short: 'Shelved', shelved: true };
    case 'normal':
    default:
      return null;
  }
}

export function isUnacknowledged(state: AlarmState): boolean {
  return state === 'active_unacknowledged' || state === 'returned_unacknowledged';
}

/** The alarm state as a badge with icon and word. */
export function AlarmStateBadge({
  state,
  priority,
  short = false,
  size = 'lg',
}: {
  state: AlarmState;
  priority: AlarmPriority | null | undefined;
  short?: boolean;
  size?: 'md' | 'lg' | 'xl';
}) {
  const look = alarmLook(state, priority);
  if (!look) return null;
  return (
    <Badge
      size={size}
      color={look.color}
      variant={look.variant}
      className={look.shelved ? 'cj-shelved' : undefined}
      leftSection={<look.Icon size={16} stroke={2} aria-hidden />}
      styles={{ root: { textTransform: 'none', fontWeight: 600, height: 'auto', minHeight: 28, whiteSpace: 'normal' } }}
    >
      {short ? look.short : look.word}
    </Badge>
  );
}

/** A time on the run's day as 14:05:09; an earlier day with its date. */
export function alarmTime(iso: string | null): string {
  if (!iso) return '';
  const d = new Date(iso);
  const today = new Date();
  const sameDay = d.toDateString() === today.toDateString();
  return sameDay
    ? d.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' })
    : d.toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });
}
