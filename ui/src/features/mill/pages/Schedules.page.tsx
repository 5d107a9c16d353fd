import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Group, Loader, Stack, Text, Title } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import { MILL_WRITERS, type ScheduleSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { schedulesQuery } from '../api/mill.api';
import { product, sectionText } from '../model/format';
import { PlanFromTemplate } from '../components/PlanFromTemplate';

const col = columnHelper<ScheduleSummary>();

/** /mill/schedules: the templates, and the working schedules planned from them. */
export default function SchedulesPage() {
  const canWrite = useHasRole(...MILL_WRITERS);
  const { data, isLoading, error } = useQuery(schedulesQuery());
  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Schedule',
        cell: (c) => (
          <Stack gap={0}>
            <Anchor component={Link} to={`/mill/schedules/${c.row.original.id}`} fw={600} fz="lg">
              {c.getValue()}
            </Anchor>
            <Text fz="sm" c="dimmed">
              {c.row.original.millName}
              {c.row.original.templateName ? ` · from “${c.row.original.templateName}”` : ''}
            </Text>
          </Stack>
        ),
      }),
      col.accessor((s) => product(s), { id: 'product', header: 'Product', cell: (c) => <Text fz="sm">{c.getValue()}</Text> }),
      col.accessor('steelGrade', { header: 'Steel' }),
      col.accessor((s) => sectionText(s.stock), {
        id: 'stock',
        header: 'Stock, mm',
        cell: (c) => <Text className="cj-num">{c.getValue()}</Text>,
      }),
      col.accessor('passCount', { header: 'Passes', cell: (c) => <Text className="cj-num">{c.getValue()}</Text> }),
      col.accessor('flaggedPasses', {
        header: 'Flagged',
        cell: (c) =>
          c.getValue() > 0 ? (
            <Badge color="signal" variant="filled">
              {c.getValue()} flagged
            </Badge>
          ) : (
            <Text c="dimmed">none</Text>
          ),
      }),
      col.accessor((s) => s.lotReference ?? '', {
        id: 'lot',
        header: 'Lot',
        cell: (c) =>
          c.row.original.lotId ? (
            <Anchor component={Link} to={`/mill/lots/${c.row.original.lotId}`}>
              {c.getValue()}
            </Anchor>
          ) : (
            '—'
          ),
      }),
    ],
    [],
  );
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  const live = data.filter((s) => !s.archived);
  return (
    <Stack gap="lg">
      <PageHeader
        title="Pass schedules"
        subtitle={
          'Each pass of a product from its stock: stand, entry and exit section, reduction and temperature, ' +
          'with the roll load and the flywheel’s share worked out.'
        }
        action={
          canWrite && (
            <Group>
              <Button component={Link} to="/mill/schedules/new" variant="default" leftSection={<IconPlus />}>
                New schedule
              </Button>
              <PlanFromTemplate />
            </Group>
          )
        }
      />
      <Title order={2} fz="xl">
        Templates
      </Title>
      <DataTable
        data={live.filter((s) => s.isTemplate)}
        columns={columns}
        caption="Templates"
        empty="No templates yet."
        getRowId={(s) => s.id}
      />
      <Title order={2} fz="xl">
        Working schedules
      </Title>
      <DataTable
        data={live.filter((s) => !s.isTemplate)}
        columns={columns}
        caption="Working schedules"
        empty="No schedules planned yet."
        getRowId={(s) => s.id}
      />
      {data.some((s) => s.archived) && (
        <Text c="dimmed" fz="sm">
          {data.filter((s) => s.archived).length} archived schedule(s) not shown.
        </Text>
      )}
    </Stack>
  );
}
