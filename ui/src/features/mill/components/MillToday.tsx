import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Anchor, Card, Group, Stack, Text, Title } from '@mantine/core';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { formatPlannedFor } from '../../runs/model/transitions';
import { lotsQuery, millRunsQuery } from '../api/mill.api';
import { LotStatusBadge } from './LotStatusBadge';

/** Today, for the mill lead: runs where passes can be logged, and the open lots by due date. */
export function MillToday() {
  const runs = useQuery(millRunsQuery());
  const lots = useQuery(lotsQuery());
  const rolling = (runs.data ?? []).filter((r) => r.state === 'running' || r.state === 'stopped');
  const open = (lots.data ?? []).filter((l) => l.status !== 'dispatched').slice(0, 5);
  return (
    <Card withBorder padding="lg" radius="md">
      <Title order={2} fz="xl" mb="sm">
        Mill
      </Title>
      <Stack gap="xs">
        {rolling.length === 0 && (
          <Text c="dimmed" fz="sm">
            No run is rolling now.{' '}
            <Anchor component={Link} to="/mill/schedules">
              Pass schedules
            </Anchor>
          </Text>
        )}
        {rolling.map((r) => (
          <Group key={r.runId} gap="sm">
            <RunStateBadge state={r.state} size="md" />
            <Anchor component={Link} to={`/mill/rolling/${r.runId}`} fw={600}>
              Log passes on {r.title}
            </Anchor>
          </Group>
        ))}
        {open.map((l) => (
          <Group key={l.id} gap="sm" wrap="nowrap">
            <LotStatusBadge status={l.status} size="md" />
            <Anchor component={Link} to={`/mill/lots/${l.id}`}>
              {l.reference} · {l.customerName}
            </Anchor>
            <Text fz="sm" c="dimmed">
              due {formatPlannedFor(l.dueDate)}
            </Text>
          </Group>
        ))}
      </Stack>
    </Card>
  );
}
