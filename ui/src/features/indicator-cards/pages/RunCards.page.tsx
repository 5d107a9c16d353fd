import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Button } from '@mantine/core';
import { IconArrowLeft } from '@tabler/icons-react';
import { PageHeader } from '../../../components/PageHeader';
import { runDetailQuery } from '../../runs/api/runs.api';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { CardSetsPanel } from '../components/CardSetsPanel';

/** A run's indicator cards on their own page: /runs/:id/cards. */
export default function RunCardsPage() {
  const { id = '' } = useParams();
  const run = useQuery(runDetailQuery(id));
  return (
    <>
      <PageHeader
        title="Indicator cards"
        subtitle={run.data ? `${run.data.title} · ${run.data.engineName}` : undefined}
        state={run.data ? <RunStateBadge state={run.data.state} /> : undefined}
        action={
          <Button component={Link} to={`/runs/${id}`} variant="default" leftSection={<IconArrowLeft size={18} />}>
            Back to the run
          </Button>
        }
      />
      <CardSetsPanel runId={id} />
    </>
  );
}
