import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Loader, Stack, Table, Text } from '@mantine/core';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { workRecordsQuery } from '../api/maintenance.api';
import { day } from '../model/format';

/** /maintenance/work — work records, open first. */
export default function WorkRecordsPage() {
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data, isLoading, error } = useQuery(workRecordsQuery());
  const rows = [...(data ?? [])].sort((a, b) =>
    a.status === b.status ? b.startedAt.localeCompare(a.startedAt) : a.status === 'open' ? -1 : 1,
  );
  return (
    <Stack gap="lg">
      <PageHeader
        title="Work records"
        action={
          canWrite && (
            <Button component={Link} to="/maintenance/work/new">
              Record work
            </Button>
          )
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <Card withBorder padding="lg" radius="md">
          <Table verticalSpacing="sm" aria-label="Work records">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Started</Table.Th>
                <Table.Th>Work</Table.Th>
                <Table.Th>Bearing</Table.Th>
                <Table.Th>Status</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {rows.length === 0 && (
                <Table.Tr>
                  <Table.Td colSpan={4}>
                    <Text c="dimmed">No work recorded yet.</Text>
                  </Table.Td>
                </Table.Tr>
              )}
              {rows.map((w) => (
                <Table.Tr key={w.id}>
                  <Table.Td className="cj-num">{day(w.startedAt)}</Table.Td>
                  <Table.Td>
                    <Anchor component={Link} to={`/maintenance/work/${w.id}`} fw={600}>
                      {w.title}
                    </Anchor>
                  </Table.Td>
                  <Table.Td>{w.bearingLabel ?? '—'}</Table.Td>
                  <Table.Td>
                    {w.status === 'open' ? (
                      <Badge color="brass">Open</Badge>
                    ) : (
                      <Text fz="sm" c="dimmed">
                        Closed {day(w.closedAt)}
                      </Text>
                    )}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Card>
      )}
    </Stack>
  );
}
