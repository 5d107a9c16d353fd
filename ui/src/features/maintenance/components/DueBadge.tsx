import { Badge } from '@mantine/core';
import { IconAlertOctagon, IconAlertTriangle, IconCheck } from '@tabler/icons-react';
import { DUE_STATUS_LABELS, type DueStatus } from '@crankjournal/shared-types';

/** Due status by word, icon and colour (colour only when a person is needed). */
const noCut = { root: { overflow: 'visible', flexShrink: 0 }, label: { overflow: 'visible' } } as const;

export function DueBadge({ status, size = 'md' }: { status: DueStatus; size?: 'sm' | 'md' | 'lg' }) {
  if (status === 'overrun')
    return (
      <Badge
        color="signal"
        variant="filled"
        size={size}
        styles={noCut}
        leftSection={<IconAlertOctagon size={14} />}
        data-testid="due-overrun"
      >
        {DUE_STATUS_LABELS.overrun}
      </Badge>
    );
  if (status === 'coming_due')
    return (
      <Badge
        color="amber"
        variant="outline"
        size={size}
        styles={noCut}
        leftSection={<IconAlertTriangle size={14} />}
        data-testid="due-coming"
      >
        {DUE_STATUS_LABELS.coming_due}
      </Badge>
    );
  return (
    <Badge color="gray" variant="outline" size={size} styles={noCut} leftSection={<IconCheck size={14} />}>
      {DUE_STATUS_LABELS.in_hand}
    </Badge>
  );
}
