import { Alert, Text } from '@mantine/core';
import { IconCloudOff } from '@tabler/icons-react';
import dayjs from 'dayjs';
import { useFiguresAsOf, useOnline } from './useOnline';

/** What works without the server, said once on every screen: everything recorded waits on the tablet. */
export const OFFLINE_ACTIONS =
  'Rounds and amendments of readings, checklist entries, photos and signatures, and alarm acknowledgements are kept on ' +
  'this tablet and sent in order when the server answers (a signature counts for the start gate once the server has it). ' +
  'Starting or stopping the engine, other amendments and everything else wait for the network.';

/**
 * Shown above every page while the tablet is offline or shows figures it kept: the time of the oldest figure on
 * screen, and which actions wait for the network.
 */
export function OfflineBanner() {
  const online = useOnline();
  const asOf = useFiguresAsOf();
  if (online && !asOf) return null;
  const when = asOf ? dayjs(asOf) : null;
  const stamp = when ? (when.isSame(dayjs(), 'day') ? when.format('HH:mm') : when.format('D MMM HH:mm')) : null;
  return (
    <Alert
      role="status"
      variant="outline"
      color="amber"
      mb="md"
      icon={<IconCloudOff />}
      data-testid="offline-banner"
      title={stamp ? `No connection to the server: figures as of ${stamp}` : 'No connection to the server'}
    >
      <Text fz="sm">{OFFLINE_ACTIONS}</Text>
    </Alert>
  );
}
