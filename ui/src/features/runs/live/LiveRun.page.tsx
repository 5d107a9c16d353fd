import '@mantine/charts/styles.css';
import { lazy, Suspense, useCallback, useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams, useParams } from 'react-router-dom';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Alert, Badge, Button, Center, Group, Loader, Stack, Tabs, Text } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconClipboardList, IconCloudOff, IconFileTypeCsv, IconFileTypePdf, IconPlugConnectedX } from '@tabler/icons-react';
import { RUN_STATES_TAKING_READINGS, type AlarmDto, type ReadingDto } from '@crankjournal/shared-types';
import { RunChecklistsLink } from '../../checklists/components/RunChecklistsLink';
import { PreLubeCountdown } from '../../checklists/components/PreLubeCountdown';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { engineDetailQuery } from '../../engines/api/engines.api';
import {
  downloadLogSheet,
  downloadReadingsCsv,
  runAlarmsQuery,
  runBoardQuery,
  runDetailQuery,
  runKeys,
  runReadingsQuery,
} from '../api/runs.api';
import { RunHeader } from '../components/RunHeader';
import { AlarmBanner } from '../../alarms/components/AlarmBanner';
import { AlarmList, ShelveModal } from '../../alarms/components/AlarmList';
import { highestPriority, isUnacknowledged, priorityColor } from '../../alarms/components/alarm-look';
import { mergeAlarms, openEngineAlarmsQuery, useAlarmAction } from '../../alarms/api/alarms.api';
import { useOutbox } from '../../../api/useOutbox';
import type { OutboxItem } from '../../../api/outbox';
import { Board } from './Board';
import { BottomBar } from './BottomBar';
import { useAmendReading } from './live-actions.api';
import { QueueStatus, waitingText } from './QueueStatus';
import { AmendModal, ReadingsTable } from './ReadingsTable';
import { useLiveRun } from './useLiveRun';

/** The trend charts (and the charts library) load after the board's tiles and the run are on screen. */
const TrendCharts = lazy(() => import('./TrendCharts').then((m) => ({ default: m.TrendCharts })));
/** The indicator cards (and the charts library they draw with) load only when their tab is opened. */
const CardSetsPanel = lazy(() => import('../../indicator-cards').then((m) => ({ default: m.CardSetsPanel })));
/** The logger-file import (and its CSV parser) loads only when its tab is opened. */
const CsvImport = lazy(() => import('./CsvImport').then((m) => ({ default: m.CsvImport })));

const TABS = ['board', 'alarms', 'readings', 'cards', 'import'] as const;
type Tab = (typeof TABS)[number];

/** A run while it happens (and afterwards, as a record): /runs/:id. */
export default function LiveRunPage() {
  const { id = '' } = useParams();
  const qc = useQueryClient();
  const [params, setParams] = useSearchParams();
  const canWrite = useHasRole('operator', 'chief_engineer');

  // The run's answer carries its engine's detail and leaves it in the engine's cache entry: no second request. Each
  // read of the run (on every live change, on focus) renews it, so the page never reads the engine on its own.
  const run = useQuery(runDetailQuery(id));
  const engineId = run.data?.engineId;
  const engine = useQuery({ ...engineDetailQuery(engineId ?? ''), enabled: !!engineId, staleTime: Infinity });
  const board = useQuery(runBoardQuery(id));
  const readings = useQuery(runReadingsQuery(id));
  const alarms = useQuery(runAlarmsQuery(id));
  const finishedRun = run.data?.state === 'closed' || run.data?.state === 'abandoned';
  const engineAlarms = useQuery({ ...openEngineAlarmsQuery(engineId ?? ''), enabled: !!engineId && !finishedRun });
  const { connected } = useLiveRun(id, engineId);
  const onSent = useCallback((item: OutboxItem) => item.runId && void qc.invalidateQueries({ queryKey: runKeys.run(item.runId) }), [qc]);
  const q = useOutbox(id, { onSent });

  const alarmAction = useAlarmAction(id);
  const amend = useAmendReading(id);
  const [shelving, setShelving] = useState<AlarmDto | null>(null);
  const [amending, setAmending] = useState<ReadingDto | null>(null);
  const [downloading, setDownloading] = useState<'csv' | 'pdf' | null>(null);

  // Load the round screen's code now, so "Record round" opens even if the server goes away meanwhile.
  useEffect(() => {
    void import('./RoundEntry.page');
    window.scrollTo(0, 0);
  }, []);

  const tabParam = params.get('tab') as Tab | null;
  const tab: Tab = tabParam && TABS.includes(tabParam) ? tabParam : 'board';
  const setTab = (t: string | null) =>
    setParams(
      (p) => {
        const n = new URLSearchParams(p);
        if (!t || t === 'board') n.delete('tab');
        else n.set('tab', t);
        return n;
      },
      { replace: true },
    );

  const points = useMemo(() => engine.data?.measurementPoints ?? [], [engine.data]);
  // While the run is live, alarms still open on the engine from an earlier run belong on this screen too.
  const alarmList = useMemo(
    () =>
      finishedRun
        ? (alarms.data ?? [])
        : mergeAlarms(
            alarms.data,
            engineAlarms.data?.filter((a) => a.runId === id || a.state !== 'normal'),
          ),
    [finishedRun, alarms.data, engineAlarms.data, id],
  );
  const waitingAlarms = alarmList.filter((a) => isUnacknowledged(a.state));
  const waiting = waitingAlarms.length;
  // The counter takes the colour of the highest priority waiting: red only when a high-high waits.
  const waitingColor = priorityColor(highestPriority(waitingAlarms.map((a) => a.priority)));
  const open = alarmList.filter((a) => a.state !== 'normal').length;

  if (run.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  // A failed refetch keeps the data already shown; only a screen with nothing to show says so.
  if (!run.data)
    return (
      <Alert color="signal" title="Cannot open this run">
        {errorText(run.error)}
      </Alert>
    );

  const r = run.data;
  const finished = r.state === 'closed' || r.state === 'abandoned';
  const takingReadings = RUN_STATES_TAKING_READINGS.includes(r.state);
  const mayWrite = canWrite && !finished;

  const ack = (a: AlarmDto) =>
    alarmAction.mutate(
      { kind: 'acknowledge', alarm: a },
      {
        onSuccess: (r) =>
          r === null &&
          notifications.show({
            color: 'amber',
            title: 'No connection — acknowledgement kept on this tablet',
            message: 'It is sent as soon as the server answers.',
          }),
        onError: (e) => notifications.show({ color: 'signal', title: 'Not acknowledged', message: errorText(e) }),
      },
    );
  const unshelve = (a: AlarmDto) =>
    alarmAction.mutate(
      { kind: 'unshelve', alarm: a },
      { onError: (e) => notifications.show({ color: 'signal', title: 'Not unshelved', message: errorText(e) }) },
    );
  const busyAlarm = alarmAction.isPending && alarmAction.variables?.kind !== 'shelve' ? (alarmAction.variables?.alarm.id ?? null) : null;

  const exportFile = async (kind: 'csv' | 'pdf') => {
    setDownloading(kind);
    try {
      await (kind === 'csv' ? downloadReadingsCsv(id) : downloadLogSheet(id));
    } catch (e) {
      notifications.show({ color: 'signal', title: 'Not downloaded', message: errorText(e) });
    } finally {
      setDownloading(null);
    }
  };

  return (
    <>
      <AlarmBanner alarms={alarmList} canAcknowledge={canWrite} onAcknowledge={ack} acknowledging={busyAlarm} max={2} />
      <RunHeader run={r} />
      <Group gap="sm" wrap="wrap">
        <RunChecklistsLink runId={id} />
        {(r.state === 'preparing' || r.state === 'cleared') && <PreLubeCountdown runId={id} />}
      </Group>
      {!connected && !finished && (
        <Alert color="amber" variant="outline" icon={<IconPlugConnectedX />} mb="md" role="status" title="Live updates not connected">
          Reconnecting… Values on this screen may be out of date; they are refreshed as soon as the connection is back.
        </Alert>
      )}
      <QueueStatus pending={q.pending} failed={q.failed} sending={q.sending} queue={q.queue} />

      <Tabs value={tab} onChange={setTab} keepMounted={false}>
        <Tabs.List mb="md">
          <Tabs.Tab value="board" fz="md" h={52}>
            Board and trends
          </Tabs.Tab>
          <Tabs.Tab
            value="alarms"
            fz="md"
            h={52}
            rightSection={
              waiting > 0 ? (
                <Badge color={waitingColor} size="md" circle data-testid="alarm-tab-count">
                  {waiting}
                </Badge>
              ) : open > 0 ? (
                <Badge color="gray" variant="outline" size="md" circle>
                  {open}
                </Badge>
              ) : undefined
            }
          >
            Alarms
          </Tabs.Tab>
          <Tabs.Tab value="readings" fz="md" h={52}>
            Readings
          </Tabs.Tab>
          <Tabs.Tab value="cards" fz="md" h={52}>
            Indicator cards
          </Tabs.Tab>
          {mayWrite && takingReadings && (
            <Tabs.Tab value="import" fz="md" h={52}>
              Import logger file
            </Tabs.Tab>
          )}
        </Tabs.List>

        <Tabs.Panel value="board">
          {engine.isLoading || board.isLoading ? (
            <Center h={200}>
              <Loader />
            </Center>
          ) : !engine.data || !board.data ? (
            <Alert color="signal">{errorText(engine.error ?? board.error)}</Alert>
          ) : (
            <Stack gap="xl">
              <Board points={points} board={board.data ?? []} />
              {engine.data &&
                (readings.isLoading ? (
                  <Loader />
                ) : !readings.data ? (
                  <Alert color="signal">{errorText(readings.error)}</Alert>
                ) : (
                  <Suspense fallback={<Loader />}>
                    <TrendCharts points={points} readings={readings.data ?? []} alarms={alarmList} engine={engine.data} />
                  </Suspense>
                ))}
            </Stack>
          )}
        </Tabs.Panel>

        <Tabs.Panel value="alarms">
          {alarms.isLoading ? (
            <Loader />
          ) : !alarms.data ? (
            <Alert color="signal">{errorText(alarms.error)}</Alert>
          ) : (
            <AlarmList
              alarms={alarmList}
              actions={{
                canAcknowledge: canWrite,
                canShelve: mayWrite,
                busy: busyAlarm,
                onAcknowledge: ack,
                onShelve: setShelving,
                onUnshelve: unshelve,
              }}
            />
          )}
        </Tabs.Panel>

        <Tabs.Panel value="readings">
          {readings.isLoading ? (
            <Loader />
          ) : !readings.data ? (
            <Alert color="signal">{errorText(readings.error)}</Alert>
          ) : (
            <>
              {finished && (
                <Text fz="sm" c="dimmed" mb="sm">
                  This run is {r.state}; its log is read-only.
                </Text>
              )}
              <ReadingsTable readings={readings.data ?? []} points={points} canAmend={mayWrite} onAmend={setAmending} />
            </>
          )}
        </Tabs.Panel>

        <Tabs.Panel value="cards">
          <Suspense fallback={<Loader />}>
            <CardSetsPanel runId={id} />
          </Suspense>
        </Tabs.Panel>

        {mayWrite && takingReadings && (
          <Tabs.Panel value="import">
            <Suspense fallback={<Loader />}>
              <CsvImport runId={id} onImported={() => void qc.invalidateQueries({ queryKey: runKeys.run(id) })} />
            </Suspense>
          </Tabs.Panel>
        )}
      </Tabs>

      <ShelveModal
        alarm={shelving}
        onClose={() => {
          setShelving(null);
          alarmAction.reset();
        }}
        busy={alarmAction.isPending && alarmAction.variables?.kind === 'shelve'}
        error={alarmAction.error && alarmAction.variables?.kind === 'shelve' ? errorText(alarmAction.error) : null}
        onShelve={(a, reason, minutes) =>
          alarmAction.mutate({ kind: 'shelve', alarm: a, reason, minutes }, { onSuccess: () => setShelving(null) })
        }
      />
      <AmendModal
        reading={amending}
        point={points.find((p) => p.id === amending?.pointId)}
        onClose={() => {
          setAmending(null);
          amend.reset();
        }}
        busy={amend.isPending}
        error={amend.error ? errorText(amend.error) : null}
        onAmend={(reading, value, reason) =>
          amend.mutate(
            { reading, pointLabel: points.find((p) => p.id === reading.pointId)?.label ?? 'reading', value, reason },
            { onSuccess: () => setAmending(null) },
          )
        }
      />

      <BottomBar label="Run actions">
        <Group gap="sm" wrap="nowrap">
          <Button
            size="lg"
            h={56}
            variant="default"
            leftSection={<IconFileTypeCsv />}
            loading={downloading === 'csv'}
            onClick={() => void exportFile('csv')}
          >
            Readings CSV
          </Button>
          <Button
            size="lg"
            h={56}
            variant="default"
            leftSection={<IconFileTypePdf />}
            loading={downloading === 'pdf'}
            onClick={() => void exportFile('pdf')}
          >
            Log sheet PDF
          </Button>
        </Group>
        {q.pending.length > 0 && (
          <Badge
            size="xl"
            color="amber"
            variant="light"
            leftSection={<IconCloudOff size={18} />}
            style={{ textTransform: 'none', flexShrink: 0 }}
            role="status"
          >
            {waitingText(q.pending.length)}
          </Badge>
        )}
        {mayWrite && takingReadings ? (
          <Button component={Link} to={`/runs/${id}/round`} size="xl" h={60} leftSection={<IconClipboardList />}>
            Record round
          </Button>
        ) : (
          <Text fz="sm" c="dimmed">
            {finished
              ? 'This log is a record: read-only.'
              : !canWrite
                ? 'Read only.'
                : 'Readings are recorded once the run is being prepared.'}
          </Text>
        )}
      </BottomBar>
    </>
  );
}
