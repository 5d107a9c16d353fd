import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Button, Group, Loader, Select, Stack, Text } from '@mantine/core';
import { IconLock, IconPlus } from '@tabler/icons-react';
import { RUN_PURPOSE_LABELS, RUN_STATES, RUN_STATE_LABELS, type RunState, type RunSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { formatNumber } from '../../units/units';
import { enginesListQuery } from '../../engines/api/engines.api';
import { runsListQuery } from '../api/runs.api';
import { OpenAlarmsBadge, RunStateBadge } from '../components/RunStateBadge';
import { FINISHED_STATES, formatDuration, formatPlannedFor } from '../model/transitions';

const col = columnHelper<RunSummary>();
const stateOptions = RUN_STATES.map((s) => ({ value: s, label: RUN_STATE_LABELS[s] }));

/** When a run is or was: its start, else its planned day. */
export function runWhen(r: Pick<RunSummary, 'startedAt' | 'plannedFor'>): string {
  if (r.startedAt)
    return new Date(r.startedAt).toLocaleString(undefined, {
      weekday: 'short',
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
    });
  return formatPlannedFor(r.plannedFor);
}

export default function RunsPage() {
  const [params, setParams] = useSearchParams();
  const engineId = params.get('engine') ?? undefined;
  const state = (params.get('state') as RunState | null) ?? undefined;
  const canPlan = useHasRole('chief_engineer', 'operator');
  const engines = useQuery(enginesListQuery());
  const { data, isLoading, error } = useQuery(runsListQuery({ engineId, state }));

  const setFilter = (key: 'engine' | 'state', value: string | null) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };

  const columns = useMemo(
    () => [
      col.accessor('title', {
        header: 'Run',
        cell: (c) => {
          const r = c.row.original;
          const finished = FINISHED_STATES.includes(r.state);
          return (
            <Stack gap={0}>
              <Group gap={6} wrap="nowrap">
                {r.state === 'closed' && <IconLock size={16} aria-label="Closed" />}
                <Anchor component={Link} to={`/runs/${r.id}`} fw={600} fz="lg" c={finished ? 'dimmed' : undefined}>
                  {c.getValue()}
                </Anchor>
              </Group>
              <Text fz="sm" c="dimmed">
                {RUN_PURPOSE_LABELS[r.purpose]}
              </Text>
            </Stack>
          );
        },
      }),
      col.accessor('engineName', { header: 'Engine' }),
      col.accessor('state', {
        header: 'State',
        cell: (c) => (
          <Group gap={6} wrap="wrap">
            <RunStateBadge state={c.getValue()} size="md" />
            <OpenAlarmsBadge count={c.row.original.openAlarms} size="md" />
          </Group>
        ),
      }),
      col.accessor((r) => r.startedAt ?? r.plannedFor ?? '', {
        id: 'when',
        header: 'When',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {runWhen(c.row.original)}
          </Text>
        ),
      }),
      col.accessor('runningSeconds', {
        header: 'Running time',
        cell: (c) => (
          <Text className="cj-num" fw={600}>
            {c.getValue() > 0 ? formatDuration(c.getValue()) : '—'}
          </Text>
        ),
      }),
      col.accessor('revolutions', {
        header: 'Revolutions',
        cell: (c) => (
          <Text className="cj-num" fw={600}>
            {c.getValue() > 0 ? formatNumber(c.getValue(), 0) : '—'}
          </Text>
        ),
      }),
    ],
    [],
  );

  return (
    <>
      <PageHeader
        title="Runs"
        subtitle="Every run of every engine: planned, under way, and the closed logs."
        action={
          canPlan && (
            <Button component={Link} to="/runs/new" size="lg" leftSection={<IconPlus />}>
              Plan a run
            </Button>
          )
        }
      />
      <Group mb="md" gap="md" wrap="wrap">
        <Select
          label="Engine"
          placeholder="All engines"
          clearable
          w={260}
          data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
          value={engineId ?? null}
          onChange={(v) => setFilter('engine', v)}
        />
        <Select
          label="State"
          placeholder="All states"
          clearable
          w={220}
          data={stateOptions}
          value={state ?? null}
          onChange={(v) => setFilter('state', v)}
        />
      </Group>
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <DataTable
          data={data}
          columns={columns}
          caption="Runs"
          getRowId={(r) => r.id}
          empty={engineId || state ? 'No runs match these filters.' : 'No runs yet.'}
        />
      )}
    </>
  );
}
