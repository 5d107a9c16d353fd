import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Button,
  Group,
  Loader,
  Modal,
  Paper,
  Select,
  Stack,
  Table,
  Tabs,
  Text,
  Textarea,
  TextInput,
  Title,
  UnstyledButton,
} from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconPlus } from '@tabler/icons-react';
import {
  DUTY_DESCRIPTIONS,
  DUTY_LABELS,
  ROLE_LABELS,
  type Duty,
  type QualificationDto,
  type QualificationMatrixRow,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { enginesListQuery } from '../../engines/api/engines.api';
import {
  myQualificationsQuery,
  qualificationHistoryQuery,
  qualificationMatrixQuery,
  useQualificationWrite,
} from '../api/qualifications.api';
import { QualificationStatusBadge } from '../components/QualificationStatusBadge';

const day = (iso: string) => {
  const [y, m, d] = iso.split('-').map(Number);
  return new Date(y, m - 1, d).toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });
};
const isoIn = (days: number) => {
  const d = new Date();
  d.setDate(d.getDate() + days);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};
const left = (q: QualificationDto) =>
  q.status === 'withdrawn'
    ? ''
    : q.daysToExpiry < 0
      ? `ended ${-q.daysToExpiry} day(s) ago`
      : q.daysToExpiry === 0
        ? 'ends today'
        : `${q.daysToExpiry} day(s) left`;

/** Everyone's own qualifications, standing ones first, then the withdrawn history. */
function Mine() {
  const q = useQuery(myQualificationsQuery());
  if (q.isLoading) return <Loader />;
  if (q.error) return <Alert color="signal">{errorText(q.error)}</Alert>;
  const list = q.data ?? [];
  if (!list.length) return <Text c="dimmed">You hold no qualifications. The chief engineer grants them, per engine and per duty.</Text>;
  return (
    <Table verticalSpacing="sm" aria-label="Your qualifications">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Engine</Table.Th>
          <Table.Th>Duty</Table.Th>
          <Table.Th>Valid</Table.Th>
          <Table.Th>Standing</Table.Th>
          <Table.Th>Notes</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {list.map((x) => (
          <Table.Tr key={x.id} style={x.status === 'withdrawn' ? { opacity: 0.6 } : undefined}>
            <Table.Td>{x.engineName}</Table.Td>
            <Table.Td>
              <Text fw={600}>{DUTY_LABELS[x.duty]}</Text>
              <Text fz="xs" c="dimmed">
                {DUTY_DESCRIPTIONS[x.duty]}
              </Text>
            </Table.Td>
            <Table.Td className="cj-num">
              {day(x.grantedOn)} – {day(x.expiresOn)}
            </Table.Td>
            <Table.Td>
              <Stack gap={2}>
                <QualificationStatusBadge status={x.status} />
                <Text fz="xs" c="dimmed">
                  {x.status === 'withdrawn' ? `${x.withdrawnReason ?? ''}` : left(x)}
                </Text>
              </Stack>
            </Table.Td>
            <Table.Td>
              <Text fz="sm">{x.notes || '—'}</Text>
            </Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
    </Table>
  );
}

interface Cell {
  row: QualificationMatrixRow;
  duty: Duty;
  q: QualificationDto | null;
}

/** Grant (empty cell) or renew and withdraw (held cell), with the person's history for this duty. */
function CellModal({ cell, engineId, isChief, onClose }: { cell: Cell | null; engineId: string; isChief: boolean; onClose: () => void }) {
  const write = useQualificationWrite();
  const [grantedOn, setGrantedOn] = useState(isoIn(0));
  const [expiresOn, setExpiresOn] = useState(isoIn(365));
  const [notes, setNotes] = useState('');
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const history = useQuery({ ...qualificationHistoryQuery(cell?.row.userId ?? '', engineId), enabled: !!cell && isChief });
  useEffect(() => {
    setGrantedOn(isoIn(0));
    setExpiresOn(isoIn(365));
    setNotes(cell?.q?.notes ?? '');
    setReason('');
    setError(null);
  }, [cell]);
  if (!cell) return <Modal opened={false} onClose={onClose} title="" />;
  const done = (what: string) => () => {
    notifications.show({ title: what, message: `${cell.row.displayName}: ${DUTY_LABELS[cell.duty]}` });
    onClose();
  };
  const fail = (e: unknown) => setError(errorText(e));
  const past = (history.data ?? []).filter((h) => h.duty === cell.duty && h.status === 'withdrawn');
  return (
    <Modal
      opened
      onClose={onClose}
      centered
      size="lg"
      title={<Text fw={700} fz="lg">{`${cell.row.displayName} — ${DUTY_LABELS[cell.duty]}`}</Text>}
    >
      <Stack>
        <Text fz="sm" c="dimmed">
          {DUTY_DESCRIPTIONS[cell.duty]}
        </Text>
        {error && (
          <Alert color="signal" role="alert">
            {error}
          </Alert>
        )}
        {cell.q ? (
          <Paper withBorder p="sm">
            <Group justify="space-between">
              <Text className="cj-num">
                {day(cell.q.grantedOn)} – {day(cell.q.expiresOn)}
              </Text>
              <QualificationStatusBadge status={cell.q.status} />
            </Group>
            <Text fz="sm">
              Granted by {cell.q.grantedByName}. {cell.q.notes}
            </Text>
          </Paper>
        ) : (
          <Text>Not qualified for this duty on this engine.</Text>
        )}
        {isChief && (
          <>
            <Title order={4}>{cell.q ? 'Renew' : 'Grant'}</Title>
            <Group grow>
              <TextInput
                type="date"
                label={cell.q ? 'Renewed on' : 'Granted on'}
                value={grantedOn}
                onChange={(e) => setGrantedOn(e.currentTarget.value)}
              />
              <TextInput type="date" label="Expires on" value={expiresOn} onChange={(e) => setExpiresOn(e.currentTarget.value)} />
            </Group>
            <Textarea label="Notes" rows={2} value={notes} onChange={(e) => setNotes(e.currentTarget.value)} />
            <Group justify="flex-end">
              {cell.q ? (
                <Button
                  size="lg"
                  loading={write.renew.isPending}
                  onClick={() =>
                    write.renew.mutate(
                      { id: cell.q!.id, req: { grantedOn, expiresOn, notes } },
                      { onSuccess: done('Renewed'), onError: fail },
                    )
                  }
                >
                  Renew until {expiresOn ? day(expiresOn) : '…'}
                </Button>
              ) : (
                <Button
                  size="lg"
                  leftSection={<IconPlus />}
                  loading={write.grant.isPending}
                  onClick={() =>
                    write.grant.mutate(
                      { userId: cell.row.userId, engineId, duty: cell.duty, grantedOn, expiresOn, notes },
                      { onSuccess: done('Granted'), onError: fail },
                    )
                  }
                >
                  Grant qualification
                </Button>
              )}
            </Group>
            {cell.q && (
              <>
                <Title order={4}>Withdraw</Title>
                <Textarea label="Reason (kept in the record)" rows={2} value={reason} onChange={(e) => setReason(e.currentTarget.value)} />
                <Group justify="flex-end">
                  <Button
                    color="signal"
                    variant="outline"
                    size="lg"
                    disabled={reason.trim().length < 3}
                    loading={write.withdraw.isPending}
                    onClick={() =>
                      write.withdraw.mutate({ id: cell.q!.id, reason: reason.trim() }, { onSuccess: done('Withdrawn'), onError: fail })
                    }
                  >
                    Withdraw qualification
                  </Button>
                </Group>
              </>
            )}
          </>
        )}
        {past.length > 0 && (
          <Stack gap={2}>
            <Text fw={600} fz="sm">
              Earlier
            </Text>
            {past.map((h) => (
              <Text key={h.id} fz="xs" c="dimmed">
                {day(h.grantedOn)} – {day(h.expiresOn)}; withdrawn by {h.withdrawnByName}: {h.withdrawnReason}
              </Text>
            ))}
          </Stack>
        )}
      </Stack>
    </Modal>
  );
}

/** The crew against the duties of one engine, with what is about to expire. */
function Matrix({ isChief }: { isChief: boolean }) {
  const engines = useQuery(enginesListQuery());
  const [picked, setPicked] = useState<string | null>(null);
  const engineId = picked ?? engines.data?.[0]?.id ?? '';
  const m = useQuery({ ...qualificationMatrixQuery(engineId), enabled: !!engineId });
  const [cell, setCell] = useState<Cell | null>(null);
  if (engines.isLoading || m.isLoading) return <Loader />;
  if (engines.error || m.error) return <Alert color="signal">{errorText(engines.error ?? m.error)}</Alert>;
  if (!m.data) return <Text c="dimmed">No engine described yet.</Text>;
  const d = m.data;
  return (
    <Stack gap="md">
      {(engines.data?.length ?? 0) > 1 && (
        <Select
          label="Engine"
          w={320}
          data={engines.data!.map((e) => ({ value: e.id, label: e.name }))}
          value={engineId}
          onChange={setPicked}
          allowDeselect={false}
        />
      )}
      {d.attention.length > 0 && (
        <Alert
          color="amber"
          variant="outline"
          title={`Expired or ending within ${d.warningDays} days`}
          data-testid="qualifications-attention"
        >
          <Stack gap={4}>
            {d.attention.map((q) => (
              <Group key={q.id} gap="xs">
                <QualificationStatusBadge status={q.status} size="sm" />
                <Text fz="sm">
                  <b>{q.userName}</b> — {DUTY_LABELS[q.duty]}:{' '}
                  {q.daysToExpiry < 0 ? `ended ${day(q.expiresOn)}` : `ends ${day(q.expiresOn)} (${left(q)})`}
                </Text>
              </Group>
            ))}
          </Stack>
        </Alert>
      )}
      <Table.ScrollContainer minWidth={720}>
        <Table verticalSpacing="xs" withColumnBorders aria-label={`Qualifications on ${d.engineName}`} data-testid="qualifications-matrix">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Person</Table.Th>
              {d.duties.map((duty) => (
                <Table.Th key={duty}>{DUTY_LABELS[duty]}</Table.Th>
              ))}
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {d.rows.map((row) => (
              <Table.Tr key={row.userId}>
                <Table.Td>
                  <Text fw={600}>{row.displayName}</Text>
                  <Text fz="xs" c="dimmed">
                    {ROLE_LABELS[row.role]}
                  </Text>
                </Table.Td>
                {d.duties.map((duty) => {
                  const q = row.cells[duty];
                  return (
                    <Table.Td key={duty} p={0}>
                      <UnstyledButton
                        onClick={() => setCell({ row, duty, q })}
                        w="100%"
                        p="xs"
                        mih={64}
                        aria-label={`${row.displayName}, ${DUTY_LABELS[duty]}: ${q ? q.status.replace('_', ' ') : 'not qualified'}`}
                      >
                        {q ? (
                          <Stack gap={2}>
                            <QualificationStatusBadge status={q.status} size="sm" />
                            <Text fz="xs" className="cj-num" c={q.status === 'expired' ? 'signal' : 'dimmed'}>
                              to {day(q.expiresOn)}
                            </Text>
                          </Stack>
                        ) : (
                          <Text fz="sm" c="dimmed">
                            {isChief ? '+ grant' : '—'}
                          </Text>
                        )}
                      </UnstyledButton>
                    </Table.Td>
                  );
                })}
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      <CellModal cell={cell} engineId={engineId} isChief={isChief} onClose={() => setCell(null)} />
    </Stack>
  );
}

/** /qualifications: your own for everyone; the crew matrix for the chief engineer (and, read-only, the administrator). */
export default function QualificationsPage() {
  const isChief = useHasRole('chief_engineer');
  const seesMatrix = useHasRole('chief_engineer', 'administrator');
  const [tab, setTab] = useState<string | null>(seesMatrix ? 'crew' : 'mine');
  return (
    <>
      <PageHeader
        title="Qualifications"
        subtitle={
          'Per person, per engine and per duty. Signing a checklist, starting a run and answering alarms each ' +
          'need a current one; nobody is exempt.'
        }
      />
      {seesMatrix ? (
        <Tabs value={tab} onChange={setTab}>
          <Tabs.List mb="md">
            <Tabs.Tab value="crew" fz="md" h={52}>
              Crew
            </Tabs.Tab>
            <Tabs.Tab value="mine" fz="md" h={52}>
              Yours
            </Tabs.Tab>
          </Tabs.List>
          <Tabs.Panel value="crew">
            <Matrix isChief={isChief} />
          </Tabs.Panel>
          <Tabs.Panel value="mine">
            <Mine />
          </Tabs.Panel>
        </Tabs>
      ) : (
        <Mine />
      )}
    </>
  );
}
