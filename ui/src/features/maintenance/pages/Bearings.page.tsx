import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Card, Loader, Stack, Table, Text } from '@mantine/core';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { BEARING_KIND_LABELS } from '../../engines/labels';
import { bearingsQuery } from '../api/maintenance.api';
import { DriftBadge } from '../components/DriftBadge';
import { day } from '../model/format';

/** /maintenance/bearings — every bearing, how many runs it has a history of, and whether any run drifted. */
export default function BearingsPage() {
  const { data, isLoading, error } = useQuery(bearingsQuery());
  return (
    <Stack gap="lg">
      <PageHeader
        title="Bearings"
        subtitle="Each bearing against its own history: temperatures at load over the seasons, the drift flag, inspections and work."
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <Card withBorder padding="lg" radius="md">
          <Table.ScrollContainer minWidth={720}>
            <Table verticalSpacing="md" aria-label="Bearings">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Bearing</Table.Th>
                  <Table.Th>Kind</Table.Th>
                  <Table.Th>Engine</Table.Th>
                  <Table.Th>Runs</Table.Th>
                  <Table.Th>Last run</Table.Th>
                  <Table.Th>Last inspection</Table.Th>
                  <Table.Th>Drift</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {data.length === 0 && (
                  <Table.Tr>
                    <Table.Td colSpan={7}>
                      <Text c="dimmed">No engine has bearings described yet.</Text>
                    </Table.Td>
                  </Table.Tr>
                )}
                {data.map((b) => (
                  <Table.Tr key={b.id}>
                    <Table.Td>
                      <Anchor component={Link} to={`/maintenance/bearings/${b.id}`} fw={600} fz="lg">
                        {b.label}
                      </Anchor>
                      <Text fz="xs" c="dimmed">
                        {b.pointCodes.join(', ') || 'no temperature point'}
                      </Text>
                    </Table.Td>
                    <Table.Td>{BEARING_KIND_LABELS[b.kind]}</Table.Td>
                    <Table.Td>{b.engineName}</Table.Td>
                    <Table.Td className="cj-num">{b.runCount}</Table.Td>
                    <Table.Td className="cj-num">{day(b.lastRunAt)}</Table.Td>
                    <Table.Td className="cj-num">{day(b.lastInspectionAt)}</Table.Td>
                    <Table.Td>
                      {b.driftRuns > 0 ? (
                        <Stack gap={2}>
                          <DriftBadge size="sm" />
                          <Text fz="xs" c="dimmed">
                            {b.driftRuns} run{b.driftRuns > 1 ? 's' : ''}
                            {b.latestRunDrift ? ', the latest among them' : ', not the latest'}
                          </Text>
                        </Stack>
                      ) : (
                        <Text c="dimmed" fz="sm">
                          None
                        </Text>
                      )}
                    </Table.Td>
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
