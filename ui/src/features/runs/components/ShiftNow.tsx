import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, List, Loader, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { IconBell, IconHandStop } from '@tabler/icons-react';
import { GATE_REASON_CODES, type RunSummary, type StartGateReason } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { runsListQuery, startGateQuery } from '../api/runs.api';
import { formatDuration, formatPlannedFor } from '../model/transitions';
import { currentAndNextRuns } from './TodayRuns';
import { OpenAlarmsBadge, RunStateBadge } from './RunStateBadge';

/** Who can clear each reason the start gate gives (the roles of the routes that clear it). */
export function whoClears(reason: StartGateReason): string {
  switch (reason.code) {
    case GATE_REASON_CODES.qualificationMissing:
    case GATE_REASON_CODES.qualificationExpired:
    case GATE_REASON_CODES.signerNotQualified:
      return 'The chief engineer records the qualification';
    case 'active_high_high_alarm':
      return 'The crew on watch clears the cause; an operator or the chief engineer acknowledges';
    default:
      return 'An operator or the chief engineer signs it';
  }
}

/** The engine's state in a word: running (or stopped, not yet closed), preparing, or at rest. */
export function engineStateWord(run: RunSummary | undefined): 'Running' | 'Stopped' | 'Preparing' | 'At rest' {
  if (!run) return 'At rest';
  if (run.state === 'running') return 'Running';
  if (run.state === 'stopped') return 'Stopped';
  if (run.state === 'preparing' || run.state === 'cleared') return 'Preparing';
  return 'At rest';
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <Stack gap={0}>
      <Text fz="xs" c="dimmed">
        {label}
      </Text>
      <Text className="cj-num" fz={34} fw={600} lh={1.1}>
        {value}
      </Text>
    </Stack>
  );
}

function NextRunGate({ run }: { run: RunSummary }) {
  const gate = useQuery(startGateQuery(run.id));
  return (
    <Card withBorder padding="lg" radius="md" data-testid="shift-gate">
      <Stack gap="xs">
        <Title order={2} fz={20}>
          Before “{run.title}” may start
        </Title>
        {gate.isLoading && <Loader size="sm" />}
        {gate.error && <Alert color="signal">{errorText(gate.error)}</Alert>}
        {gate.data && gate.data.reasons.length === 0 && <Text>Nothing stands in the way: the start gate allows a start.</Text>}
        {gate.data && gate.data.reasons.length > 0 && (
          <List spacing="xs" icon={<IconHandStop size={18} color="var(--cj-amber)" aria-hidden />}>
            {gate.data.reasons.map((r, i) => (
              <List.Item key={`${r.code}-${i}`}>
                <Text>{r.message}</Text>
                <Text fz="sm" c="dimmed">
                  {whoClears(r)}
                </Text>
              </List.Item>
            ))}
          </List>
        )}
        <Group>
          <Button component={Link} to={`/runs/${run.id}`} variant="default">
            Open the run
          </Button>
        </Group>
      </Stack>
    </Card>
  );
}

/**
 * The top of the shift board: the engine's state now (running time and revolutions in large figures), open alarms,
 * and what the next run needs before it may start, with who can clear each reason.
 */
export function ShiftNow() {
  const canStart = useHasRole('chief_engineer', 'operator');
  const { data, isLoading, error } = useQuery(runsListQuery());
  const runs = currentAndNextRuns(data ?? [], 5);
  const now = runs.find((r) => r.state === 'running' || r.state === 'stopped');
  const next = runs.find((r) => r.state === 'planned' || r.state === 'preparing' || r.state === 'cleared');
  const withAlarms = (data ?? []).filter((r) => r.openAlarms > 0);
  const word = engineStateWord(now ?? next);
  return (
    <Stack gap="md">
      <Card withBorder padding="lg" radius="md" data-testid="shift-engine">
        {isLoading && <Loader size="sm" />}
        {error && <Alert color="signal">{errorText(error)}</Alert>}
        {data && (
          <Group justify="space-between" align="flex-start" wrap="wrap" gap="md">
            <Stack gap={4}>
              <Text fz="xs" c="dimmed">
                Engine now
              </Text>
              <Title order={2} fz={30} data-testid="engine-state">
                {word}
              </Title>
              {(now ?? next) && (
                <Group gap="xs">
                  <Text fw={600}>{(now ?? next)!.title}</Text>
                  <RunStateBadge state={(now ?? next)!.state} size="md" />
                </Group>
              )}
              {!now && next?.plannedFor && (
                <Text fz="sm" c="dimmed">
                  Next run planned for {formatPlannedFor(next.plannedFor, { long: true })}
                </Text>
              )}
            </Stack>
            {now && (
              <SimpleGrid cols={2} spacing="xl">
                <Figure label="Running time" value={formatDuration(now.runningSeconds)} />
                <Figure label="Revolutions" value={now.revolutions.toLocaleString()} />
              </SimpleGrid>
            )}
            {(now ?? next) && (
              <Button component={Link} to={`/runs/${(now ?? next)!.id}`} size="lg">
                {now ? 'Open the live run' : 'Prepare the run'}
              </Button>
            )}
          </Group>
        )}
      </Card>
      {withAlarms.length > 0 && (
        <Card withBorder padding="lg" radius="md" data-testid="shift-alarms">
          <Stack gap="xs">
            <Group gap="xs">
              <IconBell size={20} aria-hidden />
              <Title order={2} fz={20}>
                Open alarms
              </Title>
            </Group>
            {withAlarms.map((r) => (
              <Group key={r.id} justify="space-between" wrap="wrap">
                <Group gap="xs">
                  <Text fw={600}>{r.title}</Text>
                  <OpenAlarmsBadge count={r.openAlarms} size="md" planning={r.state !== 'running'} />
                </Group>
                <Button component={Link} to={`/runs/${r.id}?tab=alarms`} variant="default">
                  See the alarms
                </Button>
              </Group>
            ))}
          </Stack>
        </Card>
      )}
      {canStart && next && <NextRunGate run={next} />}
    </Stack>
  );
}
