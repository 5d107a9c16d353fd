import { Badge } from '@mantine/core';
import {
  type IconCheck,
  IconFileInvoice,
  IconHelpCircle,
  IconCalendarEvent,
  IconFlame,
  IconSearch,
  IconTruckDelivery,
  IconThumbUp,
} from '@tabler/icons-react';
import { LOT_STATUS_LABELS, type LotStatus } from '@crankjournal/shared-types';

const ICONS: Record<LotStatus, typeof IconCheck> = {
  on_the_slate: IconHelpCircle,
  priced: IconFileInvoice,
  ordered: IconThumbUp,
  on_roll_plan: IconCalendarEvent,
  rolled: IconFlame,
  passed: IconSearch,
  dispatched: IconTruckDelivery,
};

/** A lot's status as a word with an icon; calm grey except a dispatched lot's quiet tick. */
export function LotStatusBadge({ status, size = 'lg' }: { status: LotStatus; size?: 'md' | 'lg' }) {
  const Icon = ICONS[status];
  return (
    <Badge
      size={size}
      variant={status === 'dispatched' ? 'light' : 'outline'}
      color={status === 'dispatched' ? 'copper' : 'gray'}
      leftSection={<Icon size={14} />}
      data-testid="lot-status"
      styles={{ root: { minWidth: 'max-content', overflow: 'visible' }, label: { overflow: 'visible' } }}
    >
      {LOT_STATUS_LABELS[status]}
    </Badge>
  );
}
