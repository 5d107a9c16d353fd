import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Group, Loader, Stack, Text } from '@mantine/core';
import type { MillRunSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { runWhen } from '../../runs/pages/Runs.page';
import { millRunsQuery } from '../api/mill.api';

const col = columnHelper<MillRunSummary>();

/** /mill/rolling: runs with bars rolled, and the open runs of engines that drive a mill. */
export default function RollingRunsPage() {
  const { data, isLoading, error } = useQuery(millRunsQuery());
  const columns = useMemo(
    () => [
      col.accessor('title', {
        header: 'Run',
        cell: (c) => (
          <Stack gap={0}>
            <Anchor component={Link} to={`/mill/rolling/${c.row.original.runId}`} fw={600} fz="lg">
              {c.getValue()}
            </Anchor>
            <Text fz="sm" c="dimmed">
              {c.row.original.engineName}
            </Text>
          </Stack>
        ),
      }),
      col.accessor('state', { header: 'State', cell: (c) => <RunStateBadge state={c.getValue()} size="md" /> }),
      col.accessor((r) => r.startedAt ?? r.plannedFor ?? '', {
        id: 'when',
        header: 'When',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {runWhen(c.row.original)}
          </Text>
        ),
      }),
      col.accessor('bars', { header: 'Bars', cell: (c) => <Text className="cj-num">{c.getValue()}</Text> }),
      col.accessor('passes', { header: 'Passes', cell: (c) => <Text className="cj-num">{c.getValue()}</Text> }),
      col.accessor('flaggedPasses', {
        header: 'Flagged',
        cell: (c) => (c.getValue() > 0 ? <Badge color="signal">{c.getValue()} flagged</Badge> : <Text c="dimmed">none</Text>),
      }),
      col.accessor((r) => r.lotReferences.join(', '), {
        id: 'lots',
        header: 'Lots',
        cell: (c) => <Group gap={4}>{c.getValue() || '—'}</Group>,
      }),
    ],
    [],
  );
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <>
      <PageHeader
        title="Rolling log"
        subtitle={
          'Bars and passes of each run, beside the run’s readings and alarms. Passes are logged while a run is ' +
          'running, or stopped and not yet closed.'
        }
      />
      <DataTable data={data} columns={columns} caption="Runs with rolling" empty="No run has rolled bars yet." getRowId={(r) => r.runId} />
    </>
  );
}
