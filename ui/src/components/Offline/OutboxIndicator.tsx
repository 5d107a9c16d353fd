import { useEffect } from 'react';
import { Badge, Button, Divider, Popover, Stack, Text, UnstyledButton } from '@mantine/core';
import { IconAlertOctagon, IconCloudUpload } from '@tabler/icons-react';
import { useQueryClient } from '@tanstack/react-query';
import dayjs from 'dayjs';
import { outbox, type OutboxItem } from '../../api/outbox';
import { getSocket } from '../../api/socket';
import { useOutbox } from '../../api/useOutbox';
import { RefusedAlert } from '../../features/runs/live/QueueStatus';

/**
 * Sends the outbox from every screen while someone is signed in (on reconnect, `online`, every 10 s), refreshing
 * what the sent items changed.
 */
export function useOutboxRunner(token: string) {
  const qc = useQueryClient();
  useEffect(() => outbox().startAutoRetry(getSocket()), [token]);
  useEffect(
    () =>
      outbox().onSent((item: OutboxItem) => {
        if (item.runId) void qc.invalidateQueries({ queryKey: ['runs', 'run', item.runId] });
        if (item.ref?.checklistId) void qc.invalidateQueries({ queryKey: ['checklists', item.ref.checklistId] });
        if (item.kind === 'alarm-ack') void qc.invalidateQueries({ queryKey: ['alarms'] });
      }),
    [qc],
  );
}

/** The header's count of what waits on this tablet (and what the server refused), with the list and "Send now". */
export function OutboxIndicator() {
  const q = useOutbox();
  if (q.pending.length === 0 && q.failed.length === 0) return null;
  const oldest = q.pending[0];
  const last = q.pending.find((p) => p.lastError);
  return (
    <Popover width={420} position="bottom-end" shadow="md" withArrow>
      <Popover.Target>
        <UnstyledButton aria-label="Waiting to send" data-testid="outbox-indicator">
          <Badge
            size="lg"
            variant={q.failed.length ? 'filled' : 'outline'}
            color={q.failed.length ? 'signal' : 'amber'}
            leftSection={q.failed.length ? <IconAlertOctagon size={14} /> : <IconCloudUpload size={14} />}
          >
            {q.pending.length ? `${q.pending.length} waiting` : ''}
            {q.pending.length && q.failed.length ? ' · ' : ''}
            {q.failed.length ? `${q.failed.length} refused` : ''}
          </Badge>
        </UnstyledButton>
      </Popover.Target>
      <Popover.Dropdown>
        <Stack gap="sm">
          {oldest ? (
            <>
              <Text fw={700}>{q.pending.length === 1 ? '1 item waits' : `${q.pending.length} items wait`} to be sent, in this order</Text>
              <Text fz="sm" c="dimmed" data-testid="outbox-oldest">
                Oldest kept {dayjs(oldest.queuedAt).format('HH:mm:ss')}
                {last?.lastTriedAt ? ` · last try ${dayjs(last.lastTriedAt).format('HH:mm:ss')}: ${last.lastError ?? ''}` : ''}
              </Text>
              <Stack gap={2} component="ol" m={0} pl="md">
                {q.pending.map((p) => (
                  <Text component="li" fz="sm" key={p.id}>
                    {p.label}
                    {p.userName ? ` · ${p.userName}` : ''}
                  </Text>
                ))}
              </Stack>
              <Button size="md" loading={q.sending} onClick={() => void q.queue.flush()}>
                Send now
              </Button>
            </>
          ) : (
            <Text fw={700}>Nothing waits to be sent</Text>
          )}
          {q.failed.length > 0 && <Divider />}
          {q.failed.map((f) => (
            <RefusedAlert key={f.id} item={f} queue={q.queue} />
          ))}
        </Stack>
      </Popover.Dropdown>
    </Popover>
  );
}
