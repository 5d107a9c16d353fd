import { Alert, Button, Group, List, Stack, Text } from '@mantine/core';
import { IconAlertOctagon, IconCloudOff, IconCloudUpload } from '@tabler/icons-react';
import dayjs from 'dayjs';
import type { FailedRound, OfflineRoundQueue, QueuedRound } from './offline-queue';

const time = (iso: string | null) => (iso ? dayjs(iso).format('HH:mm:ss') : '—');

export function waitingText(n: number) {
  return n === 1 ? '1 round waiting to send' : `${n} rounds waiting to send`;
}

/** Rounds kept on this tablet until the server answers, and rounds the server refused. */
export function QueueStatus({
  pending,
  failed,
  sending,
  queue,
}: {
  pending: QueuedRound[];
  failed: FailedRound[];
  sending: boolean;
  queue: OfflineRoundQueue;
}) {
  if (pending.length === 0 && failed.length === 0) return null;
  const last = pending.reduce<QueuedRound | null>((a, q) => (!a || (q.lastTriedAt ?? '') > (a.lastTriedAt ?? '') ? q : a), null);
  return (
    <Stack gap="sm" mb="md">
      {pending.length > 0 && (
        <Alert
          role="status"
          aria-live="polite"
          variant="light"
          color="amber"
          icon={sending ? <IconCloudUpload /> : <IconCloudOff />}
          title={
            <Text fw={700} fz="lg">
              {waitingText(pending.length)}
            </Text>
          }
        >
          <Group justify="space-between" align="center" wrap="wrap" gap="sm">
            <Stack gap={2}>
              <Text fz="sm">
                Kept on this tablet and sent as soon as the server answers (tried every 10 s and when the connection comes back). Do not
                clear the browser’s data until they are sent.
              </Text>
              <Text fz="sm" c="dimmed">
                {sending
                  ? 'Sending now…'
                  : `Oldest taken ${time(pending[0].round.takenAt)}` +
                    (last?.lastTriedAt ? ` · last try ${time(last.lastTriedAt)}: ${last.lastError ?? ''}` : '')}
              </Text>
            </Stack>
            <Button variant="default" size="lg" loading={sending} onClick={() => void queue.flush()}>
              Send now
            </Button>
          </Group>
        </Alert>
      )}
      {failed.map((f) => (
        <Alert
          key={f.id}
          role="alert"
          variant="light"
          color="signal"
          icon={<IconAlertOctagon />}
          title={`Round of ${time(f.round.takenAt)} refused by the server`}
        >
          <Stack gap={4}>
            <Text fz="sm">
              {f.error}
              {f.result
                ? ` ${f.result.stored} reading(s) were stored; ${f.result.rejectedCount} refused.`
                : ' None of its readings were stored.'}
            </Text>
            {f.result && f.result.rejected.length > 0 && (
              <List size="sm">
                {f.result.rejected.map((r, i) => (
                  <List.Item key={i}>
                    {r.index !== undefined ? `Reading ${r.index + 1}` : r.line !== undefined ? `Line ${r.line}` : 'Row'}
                    {r.field || r.column ? ` (${r.field ?? r.column})` : ''}: {r.reason}
                  </List.Item>
                ))}
              </List>
            )}
            <Text fz="sm">Write the values on the paper log sheet or enter them again, then dismiss this.</Text>
            <Group>
              <Button variant="default" size="md" onClick={() => queue.dismissFailed(f.id)}>
                Dismiss
              </Button>
            </Group>
          </Stack>
        </Alert>
      ))}
    </Stack>
  );
}
