import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Badge, Button } from '@mantine/core';
import { IconChecklist } from '@tabler/icons-react';
import type { ChecklistRequiredWhen, RunState } from '@crankjournal/shared-types';
import { runChecklistsQuery } from '../api/checklists.api';

/** Which checklists matter in each state of a run. */
function due(state: RunState): ChecklistRequiredWhen | null {
  if (state === 'preparing' || state === 'cleared') return 'before_start';
  if (state === 'stopped') return 'after_stop';
  return null;
}

/**
 * A button to a run's checklists (/runs/:id/checklists) with how many of the checklists due now are signed,
 * e.g. "Checklists · 1 of 2 signed". For the live run page.
 */
export function RunChecklistsLink({ runId, size = 'lg' }: { runId: string; size?: 'md' | 'lg' | 'xl' }) {
  const { data } = useQuery(runChecklistsQuery(runId));
  const when = data ? due(data.runState) : null;
  const required = data && when ? data.templates.filter((t) => t.template.requiredWhen === when) : [];
  const signed = required.filter((t) => t.progress === 'signed').length;
  const complete = required.length > 0 && signed === required.length;
  return (
    <Button
      component={Link}
      to={`/runs/${runId}/checklists`}
      size={size}
      h={size === 'xl' ? 60 : 52}
      variant={when && !complete ? 'filled' : 'default'}
      leftSection={<IconChecklist />}
      rightSection={
        required.length > 0 ? (
          <Badge variant={complete ? 'outline' : 'white'} color={complete ? 'gray' : 'dark'} size="lg" data-testid="checklists-link-count">
            {signed} of {required.length} signed
          </Badge>
        ) : undefined
      }
    >
      Checklists
    </Button>
  );
}
