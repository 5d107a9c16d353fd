import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Button, Card, Group, Loader, Stack, Text, Title } from '@mantine/core';
import { IconCheck } from '@tabler/icons-react';
import { errorText } from '../../../api/http';
import { bearingsQuery, dueListQuery } from '../api/maintenance.api';
import { DueList } from './DueList';
import { DriftBadge } from './DriftBadge';

/**
 * The Today panel of the maintenance lead and the chief engineer: inspections overrun or coming due (overrun
 * first), and bearings whose latest run was flagged by the drift rule. Calm when all is in date.
 */
export function TodayMaintenance() {
  const due = useQuery(dueListQuery());
  const bearings = useQuery(bearingsQuery());
  const needs = (due.data?.items ?? []).filter((p) => p.due.status !== 'in_hand');
  const drifting = (bearings.data ?? []).filter((b) => b.latestRunDrift);
  return (
    <Card withBorder padding="lg" radius="md" data-testid="today-maintenance">
      <Stack gap="sm">
        <Group justify="space-between">
          <Title order={2} fz={22}>
            Maintenance due
          </Title>
          <Button component={Link} to="/maintenance/due" variant="default">
            All plans
          </Button>
        </Group>
        {due.isLoading && <Loader size="sm" />}
        {due.error && <Alert color="signal">{errorText(due.error)}</Alert>}
        {due.data && needs.length === 0 && (
          <Group gap="xs">
            <IconCheck size={18} color="var(--mantine-color-copper-6)" />
            <Text c="dimmed">Every inspection is in hand.</Text>
          </Group>
        )}
        {needs.length > 0 && <DueList plans={needs.slice(0, 8)} compact showEngine={false} />}
        {drifting.map((b) => (
          <Group key={b.id} gap="sm">
            <DriftBadge size="sm" />
            <Text fz="sm">
              <Anchor component={Link} to={`/maintenance/bearings/${b.id}`} fw={600}>
                {b.label}
              </Anchor>{' '}
              ran above its usual band on its latest run.
            </Text>
          </Group>
        ))}
        {due.data && (
          <Text fz="xs" c="dimmed">
            {due.data.ruleText}
          </Text>
        )}
      </Stack>
    </Card>
  );
}
