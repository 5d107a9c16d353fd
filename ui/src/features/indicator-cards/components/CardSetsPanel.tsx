import '@mantine/charts/styles.css';
import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Center, Group, Loader, Stack, Text } from '@mantine/core';
import { IconFileSpreadsheet } from '@tabler/icons-react';
import { RUN_STATES_TAKING_READINGS } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { engineDetailQuery } from '../../engines/api/engines.api';
import { runDetailQuery } from '../../runs/api/runs.api';
import { brakeFiguresQuery, cardSetsQuery } from '../api/indicator-cards.api';
import { useCardSetsLive } from '../api/useCardSetsLive';
import { BrakeFigures } from './BrakeFigures';
import { CardSetForm } from './CardSetForm';
import { CardSetView } from './CardSetView';
import { PowerOverRun } from './PowerOverRun';

/**
 * A run's indicator cards: indicated power over the run, each card set (newest first) with its summary and
 * p–V diagrams, brake figures, and — for operators and the chief engineer while the run is open — taking a
 * new set. Kept current live from the run's room. Usable on its own page (/runs/:id/cards) or inside the
 * live run page.
 */
export function CardSetsPanel({ runId }: { runId: string }) {
  const run = useQuery(runDetailQuery(runId));
  const engine = useQuery({ ...engineDetailQuery(run.data?.engineId ?? ''), enabled: !!run.data?.engineId });
  const sets = useQuery(cardSetsQuery(runId));
  const brakes = useQuery(brakeFiguresQuery(runId));
  useCardSetsLive(runId);
  const crew = useHasRole('operator', 'chief_engineer');
  const [taking, setTaking] = useState(false);

  if (run.isLoading || sets.isLoading)
    return (
      <Center h={200}>
        <Loader />
      </Center>
    );
  if (run.error || sets.error)
    return (
      <Alert color="signal" title="Cannot show the cards">
        {errorText(run.error ?? sets.error)}
      </Alert>
    );

  const state = run.data!.state;
  const finished = state === 'closed' || state === 'abandoned';
  const canTake = crew && RUN_STATES_TAKING_READINGS.includes(state);
  const canAmend = crew && !finished;
  const list = sets.data ?? [];
  const newestFirst = [...list].reverse();
  const cylinders = (engine.data?.cylinders ?? []).map((c) => ({ id: c.id, label: c.label }));

  if (taking && engine.data)
    return (
      <CardSetForm
        runId={runId}
        cylinders={cylinders}
        previous={list[list.length - 1]}
        onSaved={() => setTaking(false)}
        onCancel={() => setTaking(false)}
      />
    );

  return (
    <Stack gap="md" data-testid="card-sets-panel">
      <Group justify="space-between" wrap="wrap">
        <Text c="dimmed" data-testid="card-set-count">
          {list.length === 0 ? 'No card sets yet.' : `${list.length} card set${list.length === 1 ? '' : 's'}.`}
          {finished ? ' This run is a closed record: read-only.' : ''}
        </Text>
        {canTake && (
          <Button size="lg" h={56} leftSection={<IconFileSpreadsheet />} onClick={() => setTaking(true)} disabled={!engine.data}>
            Take a card set
          </Button>
        )}
        {crew && !canTake && !finished && (
          <Text fz="sm" c="dimmed">
            Card sets are taken once the run is being prepared.
          </Text>
        )}
      </Group>
      <PowerOverRun sets={list} />
      {newestFirst.map((s, i) => (
        <CardSetView key={s.id} set={s} canWrite={canAmend} defaultOpen={i === 0} />
      ))}
      <BrakeFigures runId={runId} figures={brakes.data ?? []} canWrite={canAmend} />
    </Stack>
  );
}
