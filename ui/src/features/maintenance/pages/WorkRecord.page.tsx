import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Anchor,
  Badge,
  Button,
  Card,
  Checkbox,
  Group,
  Loader,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Textarea,
  Title,
} from '@mantine/core';
import { IconCheck } from '@tabler/icons-react';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { useCloseWorkRecord, workRecordQuery } from '../api/maintenance.api';
import { HazardCautions } from '../components/HazardCautions';
import { day, fmt } from '../model/format';

const localNow = () => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

/**
 * /maintenance/work/:id — a work record: what, who, parts, hours, what prompted it, its hazards; closing it
 * resets the plans it satisfies.
 */
export default function WorkRecordPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data: w, isLoading, error } = useQuery(workRecordQuery(id));
  const close = useCloseWorkRecord(id);
  const [completedAt, setCompletedAt] = useState(localNow());
  const [note, setNote] = useState('');
  const [reset, setReset] = useState<string[]>([]);
  useEffect(() => {
    if (w) setReset(w.satisfiesPlanIds);
  }, [w]);
  if (isLoading) return <Loader />;
  if (error || !w) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <Stack gap="lg">
      <PageHeader
        title={w.title}
        subtitle={`${w.engineName}${w.bearingLabel ? ` · ${w.bearingLabel}` : ''} · started ${day(w.startedAt)}`}
        state={
          w.status === 'open' ? (
            <Badge color="brass" size="lg">
              Open
            </Badge>
          ) : (
            <Badge color="gray" variant="outline" size="lg" leftSection={<IconCheck size={14} />}>
              Closed {day(w.closedAt)}
            </Badge>
          )
        }
      />
      <HazardCautions hazards={w.hazards} />
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
        <Card withBorder padding="lg" radius="md">
          <Stack gap="sm">
            <Title order={2} fz={20}>
              What was done
            </Title>
            <Text style={{ whiteSpace: 'pre-wrap' }}>{w.description || '—'}</Text>
            <Text>
              <b>By:</b> {w.performedBy}{' '}
              <Text span c="dimmed" fz="sm">
                (recorded by {w.recordedByName})
              </Text>
            </Text>
            <Text className="cj-num">
              <b>Labour:</b> {fmt(w.labourHours, 1)} h
            </Text>
            {w.promptedByInspectionId && (
              <Text>
                <b>Prompted by the inspection:</b>{' '}
                <Anchor component={Link} to={`/maintenance/inspections/${w.promptedByInspectionId}`}>
                  {w.promptedByInspectionTitle}
                </Anchor>
              </Text>
            )}
            {w.promptedByAlarmMessage && (
              <Text>
                <b>Prompted by the alarm:</b> {w.promptedByAlarmMessage}
              </Text>
            )}
          </Stack>
        </Card>
        <Card withBorder padding="lg" radius="md">
          <Title order={2} fz={20} mb="sm">
            Parts and materials
          </Title>
          {w.parts.length === 0 ? (
            <Text c="dimmed">None recorded.</Text>
          ) : (
            <Table aria-label="Parts and materials" className="cj-num">
              <Table.Tbody>
                {w.parts.map((p, i) => (
                  <Table.Tr key={i}>
                    <Table.Td>{p.description}</Table.Td>
                    <Table.Td ta="right">
                      {fmt(p.quantity, p.quantity % 1 ? 2 : 0)} {p.unit}
                    </Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          )}
        </Card>
      </SimpleGrid>
      <Card withBorder padding="lg" radius="md">
        <Stack gap="sm">
          <Title order={2} fz={20}>
            Plans it satisfies
          </Title>
          {w.satisfiesPlans.length === 0 && <Text c="dimmed">None.</Text>}
          {w.status === 'closed' ? (
            <>
              {w.satisfiesPlans.map((p) => (
                <Group key={p.id} gap="xs">
                  <Anchor component={Link} to={`/maintenance/plans/${p.id}`}>
                    {p.title}
                  </Anchor>
                  {w.resetPlans.some((r) => r.id === p.id) ? (
                    <Badge variant="outline" color="gray" leftSection={<IconCheck size={12} />}>
                      counters reset
                    </Badge>
                  ) : (
                    <Text fz="sm" c="dimmed">
                      not reset
                    </Text>
                  )}
                </Group>
              ))}
              <Text fz="sm" c="dimmed" className="cj-num">
                Closed by {w.closedByName} on {day(w.closedAt)} at {fmt(w.runHoursAtCompletion, 1)} running hours and{' '}
                {fmt(w.revolutionsAtCompletion, 0)} revolutions.
                {w.closeNote ? ` ${w.closeNote}` : ''}
              </Text>
            </>
          ) : canWrite ? (
            <Stack gap="sm">
              {w.satisfiesPlans.map((p) => (
                <Checkbox
                  key={p.id}
                  label={`Reset the counters of “${p.title}” (its intervals start again from this work)`}
                  checked={reset.includes(p.id)}
                  onChange={(e) => setReset((r) => (e.currentTarget.checked ? [...r, p.id] : r.filter((x) => x !== p.id)))}
                />
              ))}
              <Group align="flex-end" gap="sm" wrap="wrap">
                <TextInput
                  label="Finished at"
                  type="datetime-local"
                  value={completedAt}
                  onChange={(e) => setCompletedAt(e.currentTarget.value)}
                />
                <Textarea label="Closing note" autosize minRows={1} value={note} onChange={(e) => setNote(e.currentTarget.value)} w={360} />
              </Group>
              {close.error && <Alert color="signal">{errorText(close.error)}</Alert>}
              <Text fz="sm" c="dimmed">
                Closing records when the work was finished and the engine’s counters then; the record can no longer be changed afterwards.
              </Text>
              <Button
                size="lg"
                w="fit-content"
                loading={close.isPending}
                onClick={() => close.mutate({ completedAt: new Date(completedAt).toISOString(), resetPlanIds: reset, note })}
              >
                Close the work record
              </Button>
            </Stack>
          ) : (
            w.satisfiesPlans.map((p) => (
              <Anchor key={p.id} component={Link} to={`/maintenance/plans/${p.id}`}>
                {p.title}
              </Anchor>
            ))
          )}
        </Stack>
      </Card>
    </Stack>
  );
}
