import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Group, Loader, SimpleGrid, Stack, Table, Text, Title } from '@mantine/core';
import { IconClipboardPlus, IconPencil } from '@tabler/icons-react';
import { COMPONENT_KIND_LABELS, DUE_CRITERION_LABELS, INSPECTION_KIND_LABELS } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { inspectionsQuery, planQuery } from '../api/maintenance.api';
import { DueBadge } from '../components/DueBadge';
import { HazardCautions } from '../components/HazardCautions';
import { day, fmt, intervalText, remainingText } from '../model/format';

/** /maintenance/plans/:id — one plan: its intervals, what is used and left of each, its hazards and its inspections. */
export default function PlanDetailPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data: p, isLoading, error } = useQuery(planQuery(id));
  const inspections = useQuery({ ...inspectionsQuery({ engineId: p?.engineId }), enabled: !!p });
  if (isLoading) return <Loader />;
  if (error || !p) return <Alert color="signal">{errorText(error)}</Alert>;
  const mine = (inspections.data ?? []).filter((i) => i.planId === p.id);
  return (
    <Stack gap="lg">
      <PageHeader
        title={p.title}
        subtitle={`${p.componentLabel} · ${COMPONENT_KIND_LABELS[p.componentKind]} · ${p.engineName} · ${intervalText(p)}`}
        state={<DueBadge status={p.due.status} />}
        action={
          canWrite && (
            <Group gap="sm">
              <Button component={Link} to={`/maintenance/plans/${p.id}/edit`} variant="default" leftSection={<IconPencil size={18} />}>
                Edit plan
              </Button>
              <Button
                component={Link}
                to={`/maintenance/inspections/new?engineId=${p.engineId}&planId=${p.id}${p.bearingId ? `&bearingId=${p.bearingId}` : ''}`}
                leftSection={<IconClipboardPlus size={18} />}
              >
                Record this inspection
              </Button>
            </Group>
          )
        }
      />
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
        <Card withBorder padding="lg" radius="md">
          <Stack gap="sm">
            <Title order={2} fz={20}>
              What is due
            </Title>
            <Table className="cj-num" aria-label="Criteria">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Criterion</Table.Th>
                  <Table.Th>Interval</Table.Th>
                  <Table.Th>Used</Table.Th>
                  <Table.Th>Left</Table.Th>
                  <Table.Th>Due</Table.Th>
                  <Table.Th>Status</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {p.due.criteria.map((c) => {
                  const d = c.criterion === 'run_hours' ? 1 : 0;
                  return (
                    <Table.Tr key={c.criterion} fw={c.criterion === p.due.governing ? 700 : undefined}>
                      <Table.Td>{DUE_CRITERION_LABELS[c.criterion]}</Table.Td>
                      <Table.Td>{fmt(c.interval, d)}</Table.Td>
                      <Table.Td>{fmt(c.used, d)}</Table.Td>
                      <Table.Td>{remainingText(c)}</Table.Td>
                      <Table.Td>
                        {c.estimatedDueDate ? day(c.estimatedDueDate) : '—'}
                        {c.estimateNote && (
                          <Text fz="xs" c="dimmed">
                            {c.estimateNote}
                          </Text>
                        )}
                      </Table.Td>
                      <Table.Td>
                        <DueBadge status={c.status} size="sm" />
                      </Table.Td>
                    </Table.Tr>
                  );
                })}
              </Table.Tbody>
            </Table>
            <Text fz="sm" c="dimmed">
              Last done {day(p.lastDoneAt)} at {fmt(p.lastDoneRunHours, 1)} running hours and {fmt(p.lastDoneRevolutions, 0)} revolutions
              {p.lastResetByWorkRecordId ? (
                <>
                  {' '}
                  (
                  <Anchor component={Link} to={`/maintenance/work/${p.lastResetByWorkRecordId}`}>
                    reset by a work record
                  </Anchor>
                  )
                </>
              ) : p.lastResetByInspectionId ? (
                <>
                  {' '}
                  (
                  <Anchor component={Link} to={`/maintenance/inspections/${p.lastResetByInspectionId}`}>
                    reset by an inspection
                  </Anchor>
                  )
                </>
              ) : null}
              .
            </Text>
            {p.notes && <Text style={{ whiteSpace: 'pre-wrap' }}>{p.notes}</Text>}
            {!p.active && <Badge color="gray">Not active</Badge>}
          </Stack>
        </Card>
        <HazardCautions hazards={p.hazards} />
      </SimpleGrid>
      <Card withBorder padding="lg" radius="md">
        <Title order={2} fz={20} mb="sm">
          Inspections under this plan
        </Title>
        {mine.length === 0 ? (
          <Text c="dimmed">None recorded yet.</Text>
        ) : (
          <Stack gap={6}>
            {mine.map((i) => (
              <Group key={i.id} gap="sm">
                <Text className="cj-num" w={110} c="dimmed">
                  {day(i.inspectedAt)}
                </Text>
                <Anchor component={Link} to={`/maintenance/inspections/${i.id}`}>
                  {i.title}
                </Anchor>
                <Text fz="sm" c={i.outOfToleranceCount ? 'signal.7' : 'dimmed'}>
                  {INSPECTION_KIND_LABELS[i.kind]} · {i.outOfToleranceCount} of {i.measurementCount} out of tolerance
                </Text>
              </Group>
            ))}
          </Stack>
        )}
      </Card>
    </Stack>
  );
}
