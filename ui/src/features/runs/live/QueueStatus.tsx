import { Alert, Button, Group, List, Stack, Text } from '@mantine/core';
import { IconAlertOctagon, IconCloudOff, IconCloudUpload } from '@tabler/icons-react';
import dayjs from 'dayjs';
import type { Outbox, OutboxItem, RefusedItem } from '../../../api/outbox';

const time = (iso: string | null) => (iso ? dayjs(iso).format('HH:mm:ss') : '—');

export function waitingText(n: number) {
  return n === 1 ? '1 item waiting to send' : `${n} items waiting to send`;
}

/** What this run keeps on the tablet until the server answers, and what the server refused, with its reason. */
export function QueueStatus({
  pending,
  failed,
  sending,
  queue,
}: {
  pending: OutboxItem[];
  failed: RefusedItem[];
  sending: boolean;
  queue: Outbox;
}) {
  if (pending.length === 0 && failed.length === 0) return null;
  const last = pending.reduce<OutboxItem | null>((a, q) => (!a || (q.lastTriedAt ?? '') > (a.lastTriedAt ?? '') ? q : a), null);
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
                Kept on this tablet and sent in order as soon as the server answers (tried every 10 s and when the connection comes back).
                Do not clear the browser’s data until they are sent.
              </Text>
              <Text fz="sm" c="dimmed">
                {sending
                  ? 'Sending now…'
                  : `Oldest: ${pending[0].label}, kept ${time(pending[0].queuedAt)}` +
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
        <RefusedAlert key={f.id} item={f} queue={queue} />
      ))}
    </Stack>
  );
}

/** One item the server refused, with its reason; it stays until the person dismisses it. */
export function RefusedAlert({ item: f, queue }: { item: RefusedItem; queue: Outbox }) {
  return (
    <Alert role="alert" variant="light" color="signal" icon={<IconAlertOctagon />} title={`${f.label}: refused by the server`}>
      <Stack gap={4}>
        <Text fz="sm" data-testid="refused-reason">
          {f.error}
          {f.kind === 'round' &&
            (f.result
              ? ` ${f.result.stored} reading(s) were stored; ${f.result.rejectedCount} refused.`
              : ' None of its readings were stored.')}
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
        <Text fz="sm">
          Recorded {dayjs(f.queuedAt).format('D MMM HH:mm')}
          {f.userName ? ` by ${f.userName}` : ''}. Write it on the paper sheet or enter it again, then dismiss this.
        </Text>
        <Group>
          <Button variant="default" size="md" onClick={() => void queue.dismissFailed(f.id)}>
            Dismiss
          </Button>
        </Group>
      </Stack>
    </Alert>
  );
}
