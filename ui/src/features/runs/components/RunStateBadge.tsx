import { Badge } from '@mantine/core';
import {
  IconBan,
  IconBell,
  IconCalendar,
  IconCheck,
  IconChecklist,
  IconLock,
  IconPlayerPlayFilled,
  IconPlayerStop,
} from '@tabler/icons-react';
import { RUN_STATE_LABELS, type RunState } from '@crankjournal/shared-types';

/**
 * A run's state as a word with an icon. Normal states are neutral outlines (running included: the running time is
 * what shows it); a closed run carries a lock; an abandoned run has its own dashed mark, not the struck-through
 * mark of an amended value.
 */
export function RunStateBadge({ state, size = 'lg' }: { state: RunState; size?: 'md' | 'lg' | 'xl' }) {
  const label = RUN_STATE_LABELS[state];
  const icon = 14;
  switch (state) {
    case 'running':
      return (
        <Badge
          size={size}
          color="gray"
          variant="outline"
          leftSection={<IconPlayerPlayFilled size={icon} color="var(--cj-copper)" />}
          data-state="running"
        >
          {label}
        </Badge>
      );
    case 'cleared':
      return (
        <Badge size={size} color="gray" variant="outline" leftSection={<IconCheck size={icon} color="var(--mantine-color-copper-5)" />}>
          {label}
        </Badge>
      );
    case 'preparing':
      return (
        <Badge size={size} color="gray" variant="outline" leftSection={<IconChecklist size={icon} />}>
          {label}
        </Badge>
      );
    case 'planned':
      return (
        <Badge size={size} color="gray" variant="outline" leftSection={<IconCalendar size={icon} />}>
          {label}
        </Badge>
      );
    case 'stopped':
      return (
        <Badge size={size} color="gray" variant="light" leftSection={<IconPlayerStop size={icon} />}>
          {label}
        </Badge>
      );
    case 'closed':
      return (
        <Badge size={size} color="gray" variant="light" leftSection={<IconLock size={icon} />}>
          {label}
        </Badge>
      );
    case 'abandoned':
      return (
        <Badge size={size} color="gray" variant="outline" className="cj-abandoned" leftSection={<IconBan size={icon} />}>
          {label}
        </Badge>
      );
  }
}

/**
 * Open alarms on a run, shown only when there are any: filled red on the run itself (a live abnormal state), an
 * amber outline in planning lists (`planning`), where it is a warning to look, not the alarm.
 */
export function OpenAlarmsBadge({
  count,
  size = 'lg',
  planning = false,
}: {
  count: number;
  size?: 'md' | 'lg' | 'xl';
  planning?: boolean;
}) {
  if (count <= 0) return null;
  return (
    <Badge size={size} color={planning ? 'amber' : 'signal'} variant={planning ? 'outline' : 'filled'} leftSection={<IconBell size={14} />}>
      {count === 1 ? '1 open alarm' : `${count} open alarms`}
    </Badge>
  );
}
