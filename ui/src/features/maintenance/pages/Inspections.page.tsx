import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Loader, Stack, Table, Text } from '@mantine/core';
import { IconClipboardPlus } from '@tabler/icons-react';
import { INSPECTION_KIND_LABELS } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { inspectionsQuery } from '../api/maintenance.api';
import { day } from '../model/format';

/** /maintenance/inspections — every inspection, newest first. */
export default function InspectionsPage() {
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data, isLoading, error } = useQuery(inspectionsQuery());
  return (
    <Stack gap="lg">
      <PageHeader
        title="Inspections"
        action={
          canWrite && (
            <Button component={Link} to="/maintenance/inspections/new" leftSection={<IconClipboardPlus size={18} />}>
              Record an inspection
            </Button>
          )
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <Card withBorder padding="lg" radius="md">
          <Table.ScrollContainer minWidth={720}>
            <Table verticalSpacing="sm" aria-label="Inspections">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Date</Table.Th>
                  <Table.Th>Inspection</Table.Th>
                  <Table.Th>Kind</Table.Th>
                  <Table.Th>Bearing</Table.Th>
                  <Table.Th>Measurements</Table.Th>
                  <Table.Th>Photos</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {data.length === 0 && (
                  <Table.Tr>
                    <Table.Td colSpan={6}>
                      <Text c="dimmed">No inspection recorded yet.</Text>
                    </Table.Td>
                  </Table.Tr>
                )}
                {data.map((i) => (
                  <Table.Tr key={i.id}>
                    <Table.Td className="cj-num">{day(i.inspectedAt)}</Table.Td>
                    <Table.Td>
                      <Anchor component={Link} to={`/maintenance/inspections/${i.id}`} fw={600}>
                        {i.title}
                      </Anchor>
                    </Table.Td>
                    <Table.Td>{INSPECTION_KIND_LABELS[i.kind]}</Table.Td>
                    <Table.Td>{i.bearingLabel ?? '—'}</Table.Td>
                    <Table.Td>
                      {i.outOfToleranceCount > 0 ? (
                        <Badge color="signal">
                          {i.outOfToleranceCount} of {i.measurementCount} out of tolerance
                        </Badge>
                      ) : (
                        <Text fz="sm" c="dimmed">
                          {i.measurementCount ? `${i.measurementCount}, all within` : 'none'}
                        </Text>
                      )}
                    </Table.Td>
                    <Table.Td className="cj-num">{i.attachmentCount || '—'}</Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
        </Card>
      )}
    </Stack>
  );
}
