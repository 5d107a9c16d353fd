import { useState, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  ActionIcon,
  Alert,
  Anchor,
  Badge,
  Button,
  Card,
  Grid,
  Group,
  Loader,
  Select,
  SimpleGrid,
  Stack,
  Table,
  Text,
  Title,
} from '@mantine/core';
import { IconLinkOff } from '@tabler/icons-react';
import { LOT_STATUS_LABELS, MILL_WRITERS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { formatPlannedFor } from '../../runs/model/transitions';
import { runsListQuery } from '../../runs/api/runs.api';
import { lotQuery, useLinkRun, useUnlinkRun } from '../api/mill.api';
import { fmt, product, when } from '../model/format';
import { LotStatusBadge } from '../components/LotStatusBadge';
import { LotStatusActions, LotSteps } from '../components/LotStatusActions';
import { QuotePanel } from '../components/QuotePanel';
import { LotMoneyPanel } from '../../payments/components/LotMoneyPanel';

function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack gap={2}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <div>{children}</div>
    </Stack>
  );
}

/** /mill/lots/:id — a customer lot: its steps, quotes, runs, bars and tonnage. */
export default function LotDetailPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole(...MILL_WRITERS);
  const { data: lot, isLoading, error } = useQuery(lotQuery(id));
  const runs = useQuery(runsListQuery());
  const link = useLinkRun(id);
  const unlink = useUnlinkRun(id);
  const [runId, setRunId] = useState<string | null>(null);
  if (isLoading) return <Loader />;
  if (error || !lot) return <Alert color="signal">{errorText(error)}</Alert>;
  const delivered = lot.status === 'dispatched';
  const linkable = (runs.data ?? []).filter((r) => !lot.runs.some((x) => x.id === r.id) && r.state !== 'abandoned');
  return (
    <Stack gap="lg">
      <PageHeader
        title={`${lot.reference} · ${lot.customerName}`}
        subtitle={`${product(lot)} · ${lot.steelGrade} · ${fmt(lot.quantityTonnes, 2)} t due ${formatPlannedFor(lot.dueDate)}`}
        state={<LotStatusBadge status={lot.status} />}
        action={<LotStatusActions lot={lot} />}
      />
      <Card withBorder padding="lg">
        <LotSteps lot={lot} />
      </Card>
      <Grid gap="md">
        <Grid.Col span={{ base: 12, md: 6 }}>
          <Card withBorder padding="lg" h="100%">
            <Title order={2} fz="xl" mb="sm">
              Customer and product
            </Title>
            <SimpleGrid cols={2} spacing="md">
              <Field label="Customer">{lot.customerName}</Field>
              <Field label="Contact">{lot.customerContact || '—'}</Field>
              <Field label="E-mail">{lot.customerEmail}</Field>
              <Field label="Product">{product(lot)}</Field>
              <Field label="Steel">
                {lot.steelGrade}
                {lot.carbonPct !== null && !/% C/.test(lot.steelGrade) ? ` (${fmt(lot.carbonPct, 2)} % C)` : ''}
              </Field>
              <Field label="Quantity, due">
                <Text className="cj-num">
                  {fmt(lot.quantityTonnes, 2)} t by {formatPlannedFor(lot.dueDate)}
                </Text>
              </Field>
            </SimpleGrid>
            {lot.notes && (
              <Text mt="md" style={{ whiteSpace: 'pre-wrap' }}>
                {lot.notes}
              </Text>
            )}
          </Card>
        </Grid.Col>
        <Grid.Col span={{ base: 12, md: 6 }}>
          <Card withBorder padding="lg" h="100%">
            <Title order={2} fz="xl" mb="sm">
              Tonnage
            </Title>
            <SimpleGrid cols={2} spacing="md">
              <Field label="Produced">
                <Text className="cj-num" fz="xl" fw={600} data-testid="lot-produced">
                  {fmt(lot.producedTonnes, 2)} t
                </Text>
              </Field>
              <Field label="Scrapped">
                <Text className="cj-num" fz="xl" fw={600}>
                  {fmt(lot.scrappedTonnes, 2)} t
                </Text>
              </Field>
              <Field label="From the bars’ weights">
                <Text className="cj-num">
                  {fmt(lot.barTonnes.produced, 2)} t good, {fmt(lot.barTonnes.scrapped, 2)} t scrap ({lot.bars.length} bars)
                </Text>
              </Field>
            </SimpleGrid>
          </Card>
        </Grid.Col>
      </Grid>
      <QuotePanel lot={lot} canWrite={canWrite} />
      <LotMoneyPanel lot={lot} />
      <Card withBorder padding="lg">
        <Title order={2} fz="xl" mb="sm">
          Runs that roll the lot
        </Title>
        {lot.runs.length === 0 && <Text c="dimmed">No run linked yet.</Text>}
        <Stack gap="xs">
          {lot.runs.map((r) => (
            <Group key={r.id} gap="sm">
              <Anchor component={Link} to={`/mill/rolling/${r.id}`} fw={600}>
                {r.title}
              </Anchor>
              <RunStateBadge state={r.state} size="md" />
              <Text fz="sm" c="dimmed">
                {formatPlannedFor(r.plannedFor)}
              </Text>
              {canWrite && !delivered && (
                <ActionIcon variant="subtle" aria-label={`Unlink ${r.title}`} onClick={() => unlink.mutate(r.id)}>
                  <IconLinkOff />
                </ActionIcon>
              )}
            </Group>
          ))}
        </Stack>
        {canWrite && !delivered && (
          <Group align="flex-end" mt="md">
            <Select
              label="Link a run"
              w={360}
              searchable
              data={linkable.map((r) => ({ value: r.id, label: `${r.title} (${r.engineName})` }))}
              value={runId}
              onChange={setRunId}
            />
            <Button
              variant="default"
              disabled={!runId}
              loading={link.isPending}
              onClick={() => runId && link.mutate(runId, { onSuccess: () => setRunId(null) })}
            >
              Link run
            </Button>
          </Group>
        )}
        {(link.error || unlink.error) && (
          <Alert mt="sm" color="signal" role="alert">
            {errorText(link.error ?? unlink.error)}
          </Alert>
        )}
      </Card>
      {lot.bars.length > 0 && (
        <Card withBorder padding="lg">
          <Title order={2} fz="xl" mb="sm">
            Bars
          </Title>
          <Table.ScrollContainer minWidth={500}>
            <Table aria-label="Bars of the lot">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Bar</Table.Th>
                  <Table.Th>Run</Table.Th>
                  <Table.Th>Passes</Table.Th>
                  <Table.Th>Weight</Table.Th>
                  <Table.Th />
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {lot.bars.map((b) => (
                  <Table.Tr key={b.id}>
                    <Table.Td fw={600}>{b.barCode}</Table.Td>
                    <Table.Td>
                      <Anchor component={Link} to={`/mill/rolling/${b.runId}`}>
                        {b.runTitle}
                      </Anchor>
                    </Table.Td>
                    <Table.Td className="cj-num">{b.passes}</Table.Td>
                    <Table.Td className="cj-num">{b.weightKg !== null ? `${fmt(b.weightKg, 0)} kg` : '—'}</Table.Td>
                    <Table.Td>
                      {b.scrapped && (
                        <Badge color="gray" variant="outline">
                          Scrapped
                        </Badge>
                      )}
                    </Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
        </Card>
      )}
      <Card withBorder padding="lg">
        <Title order={2} fz="xl" mb="sm">
          History
        </Title>
        <Stack gap={4}>
          {lot.history.map((h, i) => (
            <Text key={i} fz="sm">
              <span className="cj-num">{when(h.at)}</span> · {h.from ? `${LOT_STATUS_LABELS[h.from]} → ` : ''}
              {LOT_STATUS_LABELS[h.to]} by {h.byName}
              {h.note ? ` — ${h.note}` : ''}
            </Text>
          ))}
        </Stack>
      </Card>
    </Stack>
  );
}
