import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, Loader, Stack, Text, Title } from '@mantine/core';
import type { RunState, RunSummary } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { runsListQuery } from '../api/runs.api';
import { FINISHED_STATES, formatDuration, formatPlannedFor } from '../model/transitions';
import { OpenAlarmsBadge, RunStateBadge } from './RunStateBadge';

/** Runs under way come first, then those being prepared, then the planned ones by date. */
const ORDER: RunState[] = ['running', 'stopped', 'cleared', 'preparing', 'planned'];

export function currentAndNextRuns(runs: RunSummary[], limit = 3): RunSummary[] {
  return runs
    .filter((r) => !FINISHED_STATES.includes(r.state))
    .sort(
      (a, b) =>
        ORDER.indexOf(a.state) - ORDER.indexOf(b.state) ||
        (a.plannedFor ?? '9999').localeCompare(b.plannedFor ?? '9999') ||
        a.title.localeCompare(b.title),
    )
    .slice(0, limit);
}

const when = (r: RunSummary) => {
  if (r.state === 'running' || r.state === 'stopped') return `Running time ${formatDuration(r.runningSeconds)}`;
  return r.plannedFor ? `Planned for ${formatPlannedFor(r.plannedFor, { long: true })}` : 'Date not fixed';
};

/** The Today panel: the run under way or coming next, with a button to open it. */
export function TodayRuns() {
  const canPlan = useHasRole('chief_engineer', 'operator');
  const { data, isLoading, error } = useQuery(runsListQuery());
  const runs = currentAndNextRuns(data ?? []);
  return (
    <Card withBorder padding="lg" radius="md">
      <Stack gap="sm">
        <Title order={2} fz={22}>
          Runs now and next
        </Title>
        {isLoading && <Loader size="sm" />}
        {error && <Alert color="signal">{errorText(error)}</Alert>}
        {data && runs.length === 0 && (
          <Group justify="space-between">
            <Text c="dimmed">No run is planned or under way.</Text>
            {canPlan && (
              <Button component={Link} to="/runs/new" variant="default" size="lg">
                Plan a run
              </Button>
            )}
          </Group>
        )}
        {runs.map((r, i) => (
          <Card key={r.id} withBorder padding="md" radius="sm">
            <Group justify="space-between" wrap="wrap" gap="sm">
              <Stack gap={4}>
                <Group gap="sm" wrap="wrap">
                  <Text fw={700} fz="lg">
                    {r.title}
                  </Text>
                  <RunStateBadge state={r.state} size="md" />
                  <OpenAlarmsBadge count={r.openAlarms} size="md" planning />
                </Group>
                <Text fz="sm" c="dimmed" className="cj-num">
                  {r.engineName} · {when(r)}
                </Text>
              </Stack>
              <Button component={Link} to={`/runs/${r.id}`} size="lg" variant={i === 0 ? 'filled' : 'default'}>
                Open run
              </Button>
            </Group>
          </Card>
        ))}
      </Stack>
    </Card>
  );
}
