import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Loader, Stack, Text } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import type { EngineSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { UnitValue } from '../../../components/UnitValue/UnitValue';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { formatNumber } from '../../units/units';
import { enginesListQuery } from '../api/engines.api';
import { ENGINE_TYPE_LABELS } from '../labels';

const col = columnHelper<EngineSummary>();

export default function EnginesPage() {
  const isChief = useHasRole('chief_engineer');
  const { data, isLoading, error } = useQuery(enginesListQuery());

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Engine',
        cell: (c) => (
          <Stack gap={0}>
            <Anchor component={Link} to={`/engines/${c.row.original.id}`} fw={600} fz="lg">
              {c.getValue()}
            </Anchor>
            <Text fz="sm" c="dimmed">
              {[
                ENGINE_TYPE_LABELS[c.row.original.type],
                c.row.original.yearBuilt && `built ${c.row.original.yearBuilt}`,
                c.row.original.builder,
              ]
                .filter(Boolean)
                .join(' · ')}
            </Text>
          </Stack>
        ),
      }),
      col.accessor('ratedSpeedRpm', {
        header: 'Rated speed',
        cell: (c) => <UnitValue value={c.getValue()} unit="rpm" decimals={0} size="sm" />,
      }),
      col.accessor('runningHours', {
        header: 'Running hours',
        cell: (c) => <UnitValue value={c.getValue()} unit="h" raw decimals={1} size="md" />,
      }),
      col.accessor('revolutions', {
        header: 'Revolutions',
        cell: (c) => (
          <Text component="span" className="cj-num" fz={22} fw={600}>
            {formatNumber(c.getValue(), 0)}
          </Text>
        ),
      }),
      col.accessor('activeRunId', {
        header: 'Now',
        enableSorting: false,
        cell: (c) =>
          c.getValue() ? (
            <Button component={Link} to={`/runs/${c.getValue()}`} variant="light" size="md">
              Open current run
            </Button>
          ) : (
            <Badge color="gray" variant="outline" size="lg">
              No run open
            </Badge>
          ),
      }),
    ],
    [],
  );

  return (
    <>
      <PageHeader
        title="Engines"
        subtitle="Each engine with its running hours and revolutions over all runs."
        action={
          isChief && (
            <Button component={Link} to="/engines/new" leftSection={<IconPlus />} size="lg" variant="default">
              Describe a new engine
            </Button>
          )
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && <DataTable data={data} columns={columns} caption="Engines" getRowId={(e) => e.id} empty="No engine described yet." />}
    </>
  );
}
