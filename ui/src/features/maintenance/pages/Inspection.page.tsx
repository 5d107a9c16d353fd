import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Anchor,
  Badge,
  Button,
  Card,
  FileInput,
  Group,
  Image,
  Loader,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { IconAlertOctagon, IconCheck, IconFileTypePdf, IconPaperclip, IconTool } from '@tabler/icons-react';
import {
  INSPECTION_KIND_LABELS,
  MEASUREMENT_ITEM_KIND_LABELS,
  type AttachmentDto,
  type InspectionDto,
  type MeasurementItemDto,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { attachmentObjectUrl, downloadAttachment, inspectionQuery, useUploadAttachment } from '../api/maintenance.api';
import { HazardCautions } from '../components/HazardCautions';
import { day, fmt, measure } from '../model/format';

function ToleranceCell({ m }: { m: MeasurementItemDto }) {
  if (m.status === 'no_tolerance')
    return (
      <Text c="dimmed" fz="sm">
        No tolerance set
      </Text>
    );
  if (!m.outOfTolerance)
    return (
      <Group gap={4} wrap="nowrap">
        <IconCheck size={16} color="var(--mantine-color-copper-6)" />
        <Text fz="sm">Within</Text>
      </Group>
    );
  return (
    <Badge color="signal" variant="filled" leftSection={<IconAlertOctagon size={14} />} data-testid="out-of-tolerance">
      Out of tolerance: {m.status === 'above' ? 'above' : 'below'} by {measure(m.excess, m.unit)}
    </Badge>
  );
}

function Measurements({ inspection }: { inspection: InspectionDto }) {
  if (!inspection.measurements.length) return <Text c="dimmed">No measurements recorded.</Text>;
  return (
    <Table.ScrollContainer minWidth={820}>
      <Table verticalSpacing="sm" aria-label="Measurements" className="cj-num">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Measurement</Table.Th>
            <Table.Th>Where</Table.Th>
            <Table.Th>Value</Table.Th>
            <Table.Th>Nominal</Table.Th>
            <Table.Th>Tolerance</Table.Th>
            <Table.Th>Against tolerance</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {inspection.measurements.map((m) => (
            <Table.Tr
              key={m.id}
              data-out={m.outOfTolerance ? 'true' : 'false'}
              bg={m.outOfTolerance ? 'var(--mantine-color-signal-light)' : undefined}
            >
              <Table.Td>{MEASUREMENT_ITEM_KIND_LABELS[m.kind]}</Table.Td>
              <Table.Td>
                {m.label}
                {m.crankAngleDeg !== null && m.kind === 'web_deflection' ? (
                  <Text span c="dimmed" fz="xs">
                    {' '}
                    · crank at {fmt(m.crankAngleDeg, 0)}°
                  </Text>
                ) : null}
                {m.note && (
                  <Text fz="xs" c="dimmed">
                    {m.note}
                  </Text>
                )}
              </Table.Td>
              <Table.Td fw={700} fz="lg">
                {measure(m.value, m.unit)}
              </Table.Td>
              <Table.Td>{measure(m.nominal, m.unit)}</Table.Td>
              <Table.Td>
                {m.toleranceMin === null && m.toleranceMax === null
                  ? '—'
                  : `${m.toleranceMin === null ? '…' : measure(m.toleranceMin, m.unit)} to ` +
                    (m.toleranceMax === null ? '…' : measure(m.toleranceMax, m.unit))}
              </Table.Td>
              <Table.Td>
                <ToleranceCell m={m} />
              </Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

function Photo({ a }: { a: AttachmentDto }) {
  const [url, setUrl] = useState<string | null>(null);
  const [failed, setFailed] = useState(false);
  useEffect(() => {
    let live = true;
    let made: string | null = null;
    attachmentObjectUrl(a.id)
      .then((u) => {
        made = u;
        if (live) setUrl(u);
        else URL.revokeObjectURL(u);
      })
      .catch(() => live && setFailed(true));
    return () => {
      live = false;
      if (made) URL.revokeObjectURL(made);
    };
  }, [a.id]);
  return (
    <Card withBorder padding="xs" radius="sm">
      {url ? (
        <Image src={url} alt={a.caption || a.filename} radius="sm" />
      ) : failed ? (
        <Text c="dimmed">The photo could not be loaded.</Text>
      ) : (
        <Loader size="sm" />
      )}
      <Text fz="sm" mt={6}>
        {a.caption || a.filename}
      </Text>
      <Text fz="xs" c="dimmed">
        {a.uploadedByName} · {day(a.uploadedAt)}
      </Text>
    </Card>
  );
}

function Attachments({ inspection, canWrite }: { inspection: InspectionDto; canWrite: boolean }) {
  const upload = useUploadAttachment(inspection.id);
  const [file, setFile] = useState<File | null>(null);
  const [caption, setCaption] = useState('');
  const images = inspection.attachments.filter((a) => a.kind === 'image');
  const docs = inspection.attachments.filter((a) => a.kind === 'pdf');
  return (
    <Stack gap="sm">
      {inspection.attachments.length === 0 && <Text c="dimmed">No photos or documents.</Text>}
      {images.length > 0 && (
        <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="sm">
          {images.map((a) => (
            <Photo key={a.id} a={a} />
          ))}
        </SimpleGrid>
      )}
      {docs.map((a) => (
        <Group key={a.id} gap="xs">
          <IconFileTypePdf size={20} />
          <Anchor component="button" type="button" onClick={() => void downloadAttachment(a)}>
            {a.caption || a.filename}
          </Anchor>
          <Text fz="xs" c="dimmed">
            {fmt(a.sizeBytes / 1024, 0)} kB · {a.uploadedByName}
          </Text>
        </Group>
      ))}
      {canWrite && (
        <Group align="flex-end" gap="sm" wrap="wrap">
          <FileInput
            label="Photo or PDF"
            placeholder="Choose a file"
            accept="image/png,image/jpeg,image/webp,image/gif,application/pdf"
            value={file}
            onChange={setFile}
            leftSection={<IconPaperclip size={16} />}
            w={260}
            clearable
          />
          <TextInput label="Caption" value={caption} onChange={(e) => setCaption(e.currentTarget.value)} w={320} />
          <Button
            disabled={!file}
            loading={upload.isPending}
            onClick={() =>
              file &&
              upload.mutate(
                { file, caption },
                {
                  onSuccess: () => {
                    setFile(null);
                    setCaption('');
                  },
                },
              )
            }
          >
            Attach
          </Button>
        </Group>
      )}
      {upload.error && <Alert color="signal">{errorText(upload.error)}</Alert>}
    </Stack>
  );
}

/** /maintenance/inspections/:id — one inspection: measurements against tolerances, findings, follow-up, photos, the work it prompted. */
export default function InspectionPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data: i, isLoading, error } = useQuery(inspectionQuery(id));
  if (isLoading) return <Loader />;
  if (error || !i) return <Alert color="signal">{errorText(error)}</Alert>;
  const hazardous = i.kind === 'bearing_clearance' || i.kind === 'crank_web_deflection' || i.kind === 'alignment';
  return (
    <Stack gap="lg">
      <PageHeader
        title={i.title}
        subtitle={`${INSPECTION_KIND_LABELS[i.kind]} · ${i.engineName} · ${day(i.inspectedAt)} · at ${fmt(i.runHoursAt, 1)} running hours`}
        state={
          i.outOfToleranceCount > 0 ? (
            <Badge color="signal" size="lg" leftSection={<IconAlertOctagon size={16} />}>
              {i.outOfToleranceCount} out of tolerance
            </Badge>
          ) : i.measurementCount > 0 ? (
            <Badge color="gray" variant="outline" size="lg" leftSection={<IconCheck size={16} />}>
              All within tolerance
            </Badge>
          ) : undefined
        }
        action={
          canWrite && (
            <Button component={Link} to={`/maintenance/work/new?inspectionId=${i.id}`} leftSection={<IconTool size={18} />}>
              Record follow-up work
            </Button>
          )
        }
      />
      <Card withBorder padding="lg" radius="md">
        <SimpleGrid cols={{ base: 1, sm: 2, lg: 4 }} spacing="md">
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Bearing
            </Text>
            {i.bearingId ? (
              <Anchor component={Link} to={`/maintenance/bearings/${i.bearingId}`}>
                {i.bearingLabel}
              </Anchor>
            ) : (
              <Text>—</Text>
            )}
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Plan
            </Text>
            {i.planId ? (
              <Anchor component={Link} to={`/maintenance/plans/${i.planId}`}>
                {i.planTitle}
                {i.completesPlan ? ' (completed by this inspection)' : ''}
              </Anchor>
            ) : (
              <Text>—</Text>
            )}
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Prompted by
            </Text>
            {i.promptedByRunId ? (
              <Anchor component={Link} to={`/runs/${i.promptedByRunId}`}>
                {i.promptedByRunTitle ?? 'a run'}
                {i.promptedByAlarmId ? ' and its alarm' : ''}
              </Anchor>
            ) : (
              <Text>{i.promptedByAlarmId ? 'an alarm' : '—'}</Text>
            )}
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Inspected by
            </Text>
            <Text>
              {i.inspectorName || '—'}{' '}
              <Text span c="dimmed" fz="sm">
                (recorded by {i.recordedByName})
              </Text>
            </Text>
          </Stack>
        </SimpleGrid>
      </Card>
      <Card withBorder padding="lg" radius="md">
        <Title order={2} fz={22} mb="sm">
          Measurements
        </Title>
        <Measurements inspection={i} />
        {i.webDeflection && (
          <Text mt="sm" className="cj-num">
            Crank web deflection: largest spread round the turn {measure(i.webDeflection.spread, i.webDeflection.unit)} over{' '}
            {i.webDeflection.readings} readings.
          </Text>
        )}
        {i.webDeflection?.pairs.map((p) => (
          <Text key={p.pair} className="cj-num" c={p.status === 'above' ? 'signal.7' : undefined} data-testid={`web-pair-${p.pair}`}>
            {p.pair === 'vertical' ? 'Vertical pair (90° / 270°)' : 'Horizontal pair (dead centres)'}:{' '}
            {measure(p.deflection, i.webDeflection!.unit)}
            {p.limit !== null
              ? ` against its limit of ${measure(p.limit, i.webDeflection!.unit)}: ${p.status === 'above' ? 'over the limit' : 'within'}`
              : ', no limit given'}
          </Text>
        ))}
      </Card>
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
        <Card withBorder padding="lg" radius="md">
          <Title order={2} fz={22} mb="sm">
            Findings
          </Title>
          <Text style={{ whiteSpace: 'pre-wrap' }} data-testid="findings">
            {i.findings || 'None written.'}
          </Text>
        </Card>
        <Card withBorder padding="lg" radius="md">
          <Title order={2} fz={22} mb="sm">
            Follow-up
          </Title>
          {i.followUpActions.length === 0 && <Text c="dimmed">No follow-up actions.</Text>}
          <Stack gap={6}>
            {i.followUpActions.map((a, n) => {
              const w = a.workRecordId ? i.workRecords.find((x) => x.id === a.workRecordId) : undefined;
              return (
                <Group key={n} gap="sm" wrap="nowrap" align="flex-start">
                  {w?.status === 'closed' ? (
                    <IconCheck size={18} color="var(--mantine-color-copper-6)" />
                  ) : (
                    <Text c="dimmed">{n + 1}.</Text>
                  )}
                  <Stack gap={0}>
                    <Text>{a.text}</Text>
                    {w && (
                      <Anchor component={Link} to={`/maintenance/work/${w.id}`} fz="sm">
                        {w.status === 'closed' ? `Done: ${w.title} (${day(w.closedAt)})` : `In hand: ${w.title}`}
                      </Anchor>
                    )}
                  </Stack>
                </Group>
              );
            })}
          </Stack>
          {i.workRecords.length > 0 && (
            <Stack gap={4} mt="md">
              <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
                Work it prompted
              </Text>
              {i.workRecords.map((w) => (
                <Anchor key={w.id} component={Link} to={`/maintenance/work/${w.id}`}>
                  {w.title} — {w.status === 'closed' ? `closed ${day(w.closedAt)}` : 'open'}
                </Anchor>
              ))}
            </Stack>
          )}
        </Card>
      </SimpleGrid>
      <Card withBorder padding="lg" radius="md">
        <Title order={2} fz={22} mb="sm">
          Photos and documents
        </Title>
        <Attachments inspection={i} canWrite={canWrite} />
      </Card>
      {hazardous && <HazardCautions hazards={['lockout', 'lifting', 'raised_load']} />}
    </Stack>
  );
}
