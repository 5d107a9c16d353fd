import { useCallback, useEffect, useMemo } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Alert, Button, Center, Loader, Text } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowLeft, IconCloudOff } from '@tabler/icons-react';
import { RUN_STATES_TAKING_READINGS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { engineDetailQuery } from '../../engines/api/engines.api';
import { runBoardQuery, runDetailQuery, runKeys } from '../api/runs.api';
import { RunStateBadge } from '../components/RunStateBadge';
import { useOutbox } from '../../../api/useOutbox';
import type { OutboxItem, SubmitOutcome } from '../../../api/outbox';
import { RoundEntry, type PreviousValue } from './RoundEntry';
import { QueueStatus, waitingText } from './QueueStatus';

/** The tablet screen for a round of readings: /runs/:id/round. */
export default function RoundEntryPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const canRecord = useHasRole('operator', 'chief_engineer');
  const run = useQuery(runDetailQuery(id));
  const engineId = run.data?.engineId;
  const engine = useQuery({ ...engineDetailQuery(engineId ?? ''), enabled: !!engineId });
  const board = useQuery(runBoardQuery(id));
  const onSent = useCallback((item: OutboxItem) => item.runId && void qc.invalidateQueries({ queryKey: runKeys.run(item.runId) }), [qc]);
  const q = useOutbox(id, { onSent });

  // Load the live page's code now: after "Save round" it must open even when the server cannot be reached.
  useEffect(() => {
    void import('./LiveRun.page');
    window.scrollTo(0, 0);
  }, []);

  const previous = useMemo(() => {
    const m: Record<string, PreviousValue> = {};
    for (const b of board.data ?? []) m[b.pointId] = { value: b.value, takenAt: b.takenAt };
    return m;
  }, [board.data]);

  if (run.isLoading || engine.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  if (!run.data || !engine.data)
    return (
      <Alert color="signal" title="Cannot open the round">
        {errorText(run.error ?? engine.error)}
      </Alert>
    );

  const back = (
    <Button component={Link} to={`/runs/${id}`} variant="default" size="lg" h={56} leftSection={<IconArrowLeft />}>
      Back to the run
    </Button>
  );
  const takingReadings = RUN_STATES_TAKING_READINGS.includes(run.data.state);

  const saved = (o: SubmitOutcome) => {
    if (o.kind === 'sent') {
      void qc.invalidateQueries({ queryKey: runKeys.run(id) });
      notifications.show({
        title: 'Round saved',
        message:
          `${o.result.stored} reading(s) stored${o.result.duplicates ? `, ${o.result.duplicates} already there` : ''}` +
          `${o.result.alarmsRaised ? ` — ${o.result.alarmsRaised} alarm(s) raised` : ''}.`,
        color: o.result.alarmsRaised ? 'signal' : 'copper',
      });
    } else {
      notifications.show({
        title: 'No connection — round kept on this tablet',
        message: `${waitingText(q.queue.pending(id).length)}. It goes as soon as the server answers.`,
        color: 'amber',
        icon: <IconCloudOff size={18} />,
        autoClose: 10_000,
      });
    }
    void navigate(`/runs/${id}`);
  };

  return (
    <>
      <PageHeader
        title="Round of readings"
        subtitle={`${run.data.title} · ${engine.data.name} · enter what the gauges show; leave a point empty to skip it`}
        state={<RunStateBadge state={run.data.state} />}
      />
      <QueueStatus pending={q.pending} failed={q.failed} sending={q.sending} queue={q.queue} />
      {!canRecord ? (
        <Alert color="gray" title="Read only">
          Only engine operators and the chief engineer record rounds.
        </Alert>
      ) : !takingReadings ? (
        <Alert color="gray" title="This run takes no readings">
          <Text>Readings are recorded while a run is preparing, cleared, running or stopped.</Text>
        </Alert>
      ) : (
        <RoundEntry
          runId={id}
          points={engine.data.measurementPoints}
          previous={previous}
          engine={{ mawpPsig: engine.data.mawpPsig, overspeedRpm: engine.data.overspeedRpm }}
          secondaryActions={back}
          onSaved={saved}
        />
      )}
      {(!canRecord || !takingReadings) && back}
    </>
  );
}
