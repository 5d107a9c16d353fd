import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Group, Loader, SimpleGrid, Stack, Table, Text, ThemeIcon, Title } from '@mantine/core';
import { IconClipboardCheck, IconEngine, IconFileTypeCsv, IconFileTypePdf, IconPlus, IconTool } from '@tabler/icons-react';
import { ALARM_KIND_WORDS, type BearingHistory, type BearingRunRow, type TimelineEntry } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { UnitValue } from '../../../components/UnitValue/UnitValue';
import { Caution } from '../../../components/Caution/Caution';
import { useHasRole } from '../../auth/useSession';
import { bearingHistoryQuery, downloadHistoryCsv, downloadHistoryPdf } from '../api/maintenance.api';
import { DriftBadge } from '../components/DriftBadge';
import { RiseVsLoadChart, SeasonsChart } from '../components/HistoryCharts';
import { day, fmt } from '../model/format';

const HOT_BEARING_CAUTION =
  'A bearing running above its usual band is a warning, not a verdict: follow the engine house’s ' +
  'hot-bearing procedure (ease the load, open the feed, never cool a hot journal suddenly) and stop ' +
  'the engine if the rise keeps on. Crankjournal aids a qualified crew; it never replaces local codes, ' +
  'the insurer’s inspections or licensed practice.';

function DriftCell({ r }: { r: BearingRunRow }) {
  if (!r.drift)
    return (
      <Text fz="xs" c="dimmed">
        {r.driftNote ?? '—'}
      </Text>
    );
  const d = r.drift;
  // The band behind the verdict: a prediction interval, wider with few runs and away from the mean load.
  const band = (
    <Text fz="xs" c="dimmed" className="cj-num" data-testid="drift-band">
      {fmt(d.confidence * 100, 0)} % band ± {fmt(d.halfWidthF, 1)} °F from {d.historyRuns} runs ({d.degreesOfFreedom} degrees of freedom, t
      = {fmt(d.tQuantile, 2)})
    </Text>
  );
  if (d.flagged)
    return (
      <Stack gap={2}>
        <DriftBadge size="sm" />
        <Text fz="xs" className="cj-num">
          rise {fmt(r.riseAtPeakF, 1)} °F &gt; limit {fmt(d.limitF, 1)} °F
        </Text>
        {band}
      </Stack>
    );
  return (
    <Stack gap={2}>
      <Text fz="xs" c="dimmed" className="cj-num">
        within (limit {fmt(d.limitF, 1)} °F)
      </Text>
      {band}
    </Stack>
  );
}

function RunsTable({ history }: { history: BearingHistory }) {
  return (
    <Table.ScrollContainer minWidth={980}>
      <Table verticalSpacing="sm" aria-label="Runs of this bearing" className="cj-num">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Date</Table.Th>
            <Table.Th>Run</Table.Th>
            <Table.Th>Peak</Table.Th>
            <Table.Th>Mean</Table.Th>
            <Table.Th>Rise above ambient</Table.Th>
            <Table.Th>Speed</Table.Th>
            <Table.Th>Indicated power</Table.Th>
            <Table.Th>Alarms</Table.Th>
            <Table.Th>Drift rule</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {[...history.runs].reverse().map((r) => (
            <Table.Tr
              key={r.runId}
              data-testid={`bearing-run-${r.runId}`}
              data-flagged={r.drift?.flagged ? 'true' : 'false'}
              bg={r.drift?.flagged ? 'var(--mantine-color-amber-light)' : undefined}
            >
              <Table.Td>{day(r.startedAt)}</Table.Td>
              <Table.Td>
                <Anchor component={Link} to={`/runs/${r.runId}`}>
                  {r.title}
                </Anchor>
                <Text fz="xs" c="dimmed">
                  {fmt(r.runningHours, 2)} h · {r.readings} readings of {r.pointCode}
                </Text>
              </Table.Td>
              <Table.Td>
                <UnitValue value={r.peakTemperature} unit={r.unit} size="sm" decimals={1} />
              </Table.Td>
              <Table.Td>
                <UnitValue value={r.meanTemperature} unit={r.unit} size="sm" decimals={1} />
              </Table.Td>
              <Table.Td>
                <UnitValue value={r.riseAtPeakF} unit="degF" delta size="sm" decimals={1} />
              </Table.Td>
              <Table.Td>{r.meanSpeedRpm === null ? '—' : <UnitValue value={r.meanSpeedRpm} unit="rpm" size="sm" decimals={1} />}</Table.Td>
              <Table.Td>
                {r.indicatedHp === null ? (
                  <Text c="dimmed">—</Text>
                ) : (
                  <UnitValue value={r.indicatedHp} unit="hp" raw size="sm" decimals={0} />
                )}
              </Table.Td>
              <Table.Td>
                <Group gap={4}>
                  {r.alarms.length === 0 && <Text c="dimmed">—</Text>}
                  {r.alarms.map((a) => (
                    <Badge
                      key={a.id}
                      size="sm"
                      variant={a.priority === 'high_high' ? 'filled' : 'light'}
                      color={a.priority === 'high_high' ? 'signal' : 'amber'}
                    >
                      {ALARM_KIND_WORDS[a.kind]}
                    </Badge>
                  ))}
                </Group>
              </Table.Td>
              <Table.Td>
                <DriftCell r={r} />
              </Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

const TIMELINE_ICON = { run: IconEngine, inspection: IconClipboardCheck, work: IconTool } as const;
const TIMELINE_WORD = { run: 'Run', inspection: 'Inspection', work: 'Work' } as const;
const timelineLink = (t: TimelineEntry) =>
  t.type === 'run' ? `/runs/${t.id}` : t.type === 'inspection' ? `/maintenance/inspections/${t.id}` : `/maintenance/work/${t.id}`;

function Timeline({ entries }: { entries: TimelineEntry[] }) {
  return (
    <Stack gap={6} data-testid="bearing-timeline">
      {[...entries].reverse().map((t) => {
        const Icon = TIMELINE_ICON[t.type];
        return (
          <Group key={`${t.type}-${t.id}`} gap="sm" wrap="nowrap" align="flex-start">
            <ThemeIcon
              variant={t.attention ? 'filled' : 'light'}
              color={t.attention ? (t.type === 'work' ? 'brass' : 'amber') : 'gray'}
              size={36}
            >
              <Icon size={20} />
            </ThemeIcon>
            <Stack gap={0}>
              <Group gap="xs">
                <Text fz="xs" c="dimmed" className="cj-num" w={96}>
                  {day(t.at)}
                </Text>
                <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
                  {TIMELINE_WORD[t.type]}
                </Text>
              </Group>
              <Anchor component={Link} to={timelineLink(t)} fw={600}>
                {t.title}
              </Anchor>
              <Text fz="sm" c={t.attention ? undefined : 'dimmed'}>
                {t.detail}
              </Text>
            </Stack>
          </Group>
        );
      })}
    </Stack>
  );
}

/**
 * /maintenance/bearings/:id — every run of the bearing with its temperatures at load, the drift flag and its
 * rule, the charts, and inspections and work on one timeline.
 */
export default function BearingHistoryPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data: h, isLoading, error } = useQuery(bearingHistoryQuery(id));
  if (isLoading) return <Loader />;
  if (error || !h) return <Alert color="signal">{errorText(error)}</Alert>;
  const b = h.bearing;
  const flagged = h.runs.filter((r) => r.drift?.flagged);
  return (
    <Stack gap="lg">
      <PageHeader
        title={b.label}
        subtitle={
          `${b.engineName} · journal ${b.journalDiameterIn} × ${b.journalLengthIn} in` +
          (b.radialClearanceIn ? ` · radial clearance ${b.radialClearanceIn} in` : '') +
          ` · ${b.loadSharePercent} % of the rotating load · points ${b.points.map((p) => p.code).join(', ') || '—'}`
        }
        state={flagged.length ? <DriftBadge /> : undefined}
        action={
          <Group gap="sm">
            <Button variant="default" leftSection={<IconFileTypePdf size={18} />} onClick={() => void downloadHistoryPdf(b.id)}>
              History report (PDF)
            </Button>
            <Button variant="default" leftSection={<IconFileTypeCsv size={18} />} onClick={() => void downloadHistoryCsv(b.id)}>
              CSV
            </Button>
            {canWrite && (
              <Button
                component={Link}
                to={`/maintenance/inspections/new?engineId=${b.engineId}&bearingId=${b.id}`}
                leftSection={<IconPlus size={18} />}
              >
                Record an inspection
              </Button>
            )}
          </Group>
        }
      />
      {flagged.length > 0 && (
        <Alert
          color="amber"
          variant="light"
          title={`${flagged.length === 1 ? 'One run' : `${flagged.length} runs`} above this bearing’s usual band`}
          data-testid="drift-summary"
        >
          {flagged
            .map(
              (r) => `${r.title} (${day(r.startedAt)}): rise ${fmt(r.riseAtPeakF, 1)} °F against a limit of ${fmt(r.drift!.limitF, 1)} °F`,
            )
            .join('; ')}
          .
        </Alert>
      )}
      <Card withBorder padding="md" radius="md">
        <Stack gap={4}>
          <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
            The drift rule
          </Text>
          <Text fz="sm" data-testid="drift-rule">
            {h.ruleText}
          </Text>
          <Text fz="sm" c="dimmed">
            {h.loadMeasureNote}
          </Text>
        </Stack>
      </Card>
      <Card withBorder padding="lg" radius="md">
        <Title order={2} fz={22} mb="sm">
          Runs
        </Title>
        {h.runs.length === 0 ? <Text c="dimmed">This bearing has no readings in any run yet.</Text> : <RunsTable history={h} />}
      </Card>
      <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="md">
        <SeasonsChart history={h} />
        <RiseVsLoadChart history={h} />
      </SimpleGrid>
      <Card withBorder padding="lg" radius="md">
        <Group justify="space-between" mb="sm">
          <Title order={2} fz={22}>
            Runs, inspections and work
          </Title>
          {canWrite && (
            <Button
              component={Link}
              to={`/maintenance/work/new?engineId=${b.engineId}&bearingId=${b.id}`}
              variant="default"
              leftSection={<IconTool size={18} />}
            >
              Record work
            </Button>
          )}
        </Group>
        <Timeline entries={h.timeline} />
      </Card>
      <Caution title="Hot bearings">{HOT_BEARING_CAUTION}</Caution>
    </Stack>
  );
}
