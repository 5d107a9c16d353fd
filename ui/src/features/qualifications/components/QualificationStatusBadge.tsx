import { Badge } from '@mantine/core';
import { IconAlertTriangle, IconBan, IconCircleCheck, IconClockHour4, IconX } from '@tabler/icons-react';
import { QUALIFICATION_STATUS_LABELS, type QualificationStatus } from '@crankjournal/shared-types';

/** A qualification's standing as a word with an icon; colour only when it needs someone (expiring, expired). */
export function QualificationStatusBadge({ status, size = 'md' }: { status: QualificationStatus; size?: 'sm' | 'md' | 'lg' }) {
  const label = QUALIFICATION_STATUS_LABELS[status];
  switch (status) {
    case 'current':
      return (
        <Badge size={size} variant="outline" color="gray" leftSection={<IconCircleCheck size={14} color="var(--mantine-color-copper-5)" />}>
          {label}
        </Badge>
      );
    case 'expiring_soon':
      return (
        <Badge size={size} variant="outline" color="amber" leftSection={<IconClockHour4 size={14} />}>
          {label}
        </Badge>
      );
    case 'expired':
      return (
        <Badge size={size} variant="light" color="signal" leftSection={<IconAlertTriangle size={14} />}>
          {label}
        </Badge>
      );
    case 'not_yet_valid':
      return (
        <Badge size={size} variant="outline" color="gray" leftSection={<IconClockHour4 size={14} />}>
          {label}
        </Badge>
      );
    case 'withdrawn':
      return (
        <Badge size={size} variant="outline" color="gray" leftSection={<IconBan size={14} />}>
          {label}
        </Badge>
      );
  }
  return (
    <Badge size={size} variant="outline" color="gray" leftSection={<IconX size={14} />}>
      {label}
    </Badge>
  );
}
