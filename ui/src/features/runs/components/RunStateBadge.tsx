import { Badge } from '@mantine/core';
import { IconCalendar, IconCheck, IconChecklist, IconLock, IconPlayerPlayFilled, IconPlayerStop, IconX } from '@tabler/icons-react';
import { RUN_STATE_LABELS, type RunState } from '@crankjournal/shared-types';

/** A run's state as a word with an icon. Colour only while the engine is running; a closed run looks closed. */
export function RunStateBadge({ state, size = 'lg' }: { state: RunState; size?: 'md' | 'lg' | 'xl' }) {
  const label = RUN_STATE_LABELS[state];
  const icon = 14;
  switch (state) {
    case 'running':
      return (
        <Badge size={size} color="copper" variant="filled" leftSection={<IconPlayerPlayFilled size={icon} />}>
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
        <Badge size={size} color="iron" variant="filled" leftSection={<IconLock size={icon} />}>
          {label}
        </Badge>
      );
    case 'abandoned':
      return (
        <Badge
          size={size}
          color="gray"
          variant="light"
          leftSection={<IconX size={icon} />}
          styles={{ label: { textDecoration: 'line-through' } }}
        >
          {label}
        </Badge>
      );
  }
}

/** Open alarms on a run: red with a word, shown only when there are any. */
export function OpenAlarmsBadge({ count, size = 'lg' }: { count: number; size?: 'md' | 'lg' | 'xl' }) {
  if (count <= 0) return null;
  return (
    <Badge size={size} color="signal" variant="filled">
      {count === 1 ? '1 open alarm' : `${count} open alarms`}
    </Badge>
  );
}
