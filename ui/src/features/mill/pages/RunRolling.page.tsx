import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Grid, Group, Loader, SegmentedControl, Stack, Text } from '@mantine/core';
import { IconArrowRight, IconChevronDown, IconChevronRight } from '@tabler/icons-react';
import { MILL_WRITERS, type BarDto } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution } from '../../../components/Caution/Caution';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { runLogQuery, timelineQuery } from '../api/mill.api';
import { useMillRunLive } from '../api/useMillRunLive';
import { fmt, pct, sectionText } from '../model/format';
import { MILL_CAUTION } from '../model/caution';
import { PassCalcTable } from '../components/PassCalcTable';
import { StartBar } from '../components/StartBar';
import { LogPass } from '../components/LogPass';
import { Timeline } from '../components/Timeline';
import { BarRecord } from '../components/BarRecord';

function BarCard({ bar, defaultOpen, editable }: { bar: BarDto; defaultOpen: boolean; editable: boolean }) {
  const [open, setOpen] = useState(defaultOpen);
  const flagged = bar.passes.filter((p) => p.calc.warnings.length > 0).length;
  const maxUse = Math.max(0, ...bar.passes.map((p) => p.calc.standForceUtilisation));
  const speeds = bar.passes.map((p) => p.calc.flywheel?.endSpeedRpm).filter((x): x is number => x !== undefined);
  return (
    <Card withBorder padding="md" data-testid={`bar-${bar.barCode}`}>
      <Group justify="space-between" wrap="wrap" gap="sm">
        <Group gap="sm">
          <Button
            variant="subtle"
            size="md"
            px="xs"
            leftSection={open ? <IconChevronDown size={18} /> : <IconChevronRight size={18} />}
            onClick={() => setOpen(!open)}
            aria-expanded={open}
          >
            Bar {bar.barCode}
          </Button>
          <Text className="cj-num" fz="sm">
            {bar.passes.length} pass(es) · up to {pct(maxUse, 0)} of a stand’s force
            {speeds.length ? ` · lowest speed ${fmt(Math.min(...speeds), 1)} rpm` : ''}
          </Text>
          {flagged > 0 && (
            <Badge color="signal" variant="filled">
              {flagged} flagged
            </Badge>
          )}
          {bar.scrapped && (
            <Badge color="gray" variant="outline">
              Scrapped
            </Badge>
          )}
        </Group>
        <Text fz="sm" c="dimmed">
          {bar.scheduleId ? (
            <Anchor component={Link} to={`/mill/schedules/${bar.scheduleId}`}>
              {bar.scheduleName}
            </Anchor>
          ) : (
            'no schedule'
          )}
          {bar.lotId && (
            <>
              {' · '}
              <Anchor component={Link} to={`/mill/lots/${bar.lotId}`}>
                {bar.lotReference}
              </Anchor>
            </>
          )}
          {` · stock ${sectionText(bar.stock)}, ${fmt(bar.stockLengthMm, 0)} mm`}
          {bar.weightKg !== null ? ` · ${fmt(bar.weightKg, 0)} kg` : ''}
        </Text>
      </Group>
      {bar.scrapped && bar.scrapReason && (
        <Text fz="sm" mt="xs">
          Scrapped: {bar.scrapReason}
        </Text>
      )}
      {open && editable && <BarRecord bar={bar} />}
      {open && (
        <PassCalcTable
          caption={`Passes of bar ${bar.barCode}`}
          leadHeader="Time"
          rows={bar.passes.map((p) => ({
            key: p.id,
            passNumber: p.passNumber,
            standName: p.standName,
            entry: p.entry,
            exit: p.exit,
            planned: p.plannedExit,
            temperatureC: p.measuredTemperatureC,
            temperatureWord: 'measured',
            calc: p.calc,
            notes: p.notes,
            lead: (
              <Text className="cj-num" fz="sm" style={{ whiteSpace: 'nowrap' }}>
                {new Date(p.at).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' })}
              </Text>
            ),
          }))}
        />
      )}
    </Card>
  );
}

/** /mill/rolling/:runId — the rolling log of a run: start bars, log passes, and one timeline with readings and alarms. */
export default function RunRollingPage() {
  const { runId = '' } = useParams();
  const canWrite = useHasRole(...MILL_WRITERS);
  useMillRunLive(runId);
  const { data, isLoading, error } = useQuery(runLogQuery(runId));
  const timeline = useQuery(timelineQuery(runId));
  const [barId, setBarId] = useState<string | null>(null);
  const [view, setView] = useState<'bars' | 'timeline'>('bars');
  useEffect(() => {
    if (data && !barId && data.bars.length) setBarId(data.bars[data.bars.length - 1].id);
  }, [data, barId]);
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  const flagged = data.bars.flatMap((b) => b.passes).filter((p) => p.calc.warnings.length > 0).length;
  return (
    <Stack gap="lg">
      <PageHeader
        title={`Rolling log: ${data.run.title}`}
        subtitle={
          `${data.run.engineName}${data.mill ? ` driving ${data.mill.name}` : ''} · ${data.bars.length} bar(s), ` +
          `${data.bars.reduce((s, b) => s + b.passes.length, 0)} pass(es)${flagged ? `, ${flagged} flagged` : ''}`
        }
        state={<RunStateBadge state={data.run.state} />}
        action={
          <Button component={Link} to={`/runs/${data.run.id}`} variant="default" rightSection={<IconArrowRight size={18} />}>
            Open the run
          </Button>
        }
      />
      {!data.canLog && (
        <Alert color="gray" title="Passes cannot be logged now">
          {data.reasonNotLogging}
        </Alert>
      )}
      {data.canLog && canWrite && data.mill && (
        <Grid gap="md">
          <Grid.Col span={{ base: 12, lg: 5 }}>
            <StartBar runId={runId} millId={data.mill.id} bars={data.bars} onStarted={(b) => setBarId(b.id)} />
          </Grid.Col>
          <Grid.Col span={{ base: 12, lg: 7 }}>
            {data.bars.length ? (
              <LogPass runId={runId} bars={data.bars} stands={data.mill.stands} barId={barId} onBarChange={setBarId} />
            ) : (
              <Alert color="gray">Start a bar to log its passes.</Alert>
            )}
          </Grid.Col>
        </Grid>
      )}
      <Caution title="Hot steel and heavy rolls">{MILL_CAUTION}</Caution>
      <SegmentedControl
        w="fit-content"
        size="md"
        value={view}
        onChange={(v) => setView(v as 'bars' | 'timeline')}
        data={[
          { value: 'bars', label: 'Bars and passes' },
          { value: 'timeline', label: 'Timeline with readings and alarms' },
        ]}
      />
      {view === 'bars' &&
        (data.bars.length ? (
          [...data.bars]
            .reverse()
            .map((b, i) => (
              <BarCard
                key={b.id}
                bar={b}
                editable={canWrite && !['closed', 'abandoned'].includes(data.run.state)}
                defaultOpen={(i === 0 && data.canLog) || b.passes.some((p) => p.calc.warnings.length > 0)}
              />
            ))
        ) : (
          <Text c="dimmed">No bars rolled on this run.</Text>
        ))}
      {view === 'timeline' &&
        (timeline.isLoading ? (
          <Loader />
        ) : timeline.error ? (
          <Alert color="signal">{errorText(timeline.error)}</Alert>
        ) : (
          <Timeline items={timeline.data ?? []} />
        ))}
    </Stack>
  );
}
