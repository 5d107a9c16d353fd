import { Badge, Button, Group, List, Loader, Paper, Stack, Text } from '@mantine/core';
import { IconCheck, IconHandFinger, IconWand } from '@tabler/icons-react';
import { TRACE_ORIGIN_LABELS, type TraceOrigin } from '@crankjournal/shared-types';
import type { AutotraceState } from './card-draft';
import type { TraceDraft } from './trace-model';

/** Below this confidence the proposal is marked for a careful look and its reasons are listed. */
export const LOW_CONFIDENCE = 0.75;

export interface AutotracePanelProps {
  state: AutotraceState;
  origin: TraceOrigin | null;
  onAccept: () => void;
  onByHand: () => void;
  onBackToProposal: (proposal: TraceDraft) => void;
}

/**
 * What the automatic tracer made of the photo, above the tracer that shows it: the proposal with its confidence
 * (and why it is low), and the choices: accept it, drag its points to adjust it, or trace by hand.
 */
export function AutotracePanel({ state, origin, onAccept, onByHand, onBackToProposal }: AutotracePanelProps) {
  if (state.status === 'finding')
    return (
      <Group gap="xs" data-testid="autotrace-finding">
        <Loader size="sm" />
        <Text fz="sm">Finding the diagram on the photo…</Text>
      </Group>
    );
  if (state.status === 'failed')
    return (
      <Text fz="sm" c="dimmed" data-testid="autotrace-failed">
        No trace proposed (the photo could not be read here: {state.message}). Trace it by hand.
      </Text>
    );
  if (state.status === 'refused')
    return (
      <Paper withBorder p="sm" data-testid="autotrace-refused">
        <Text fw={600}>No trace proposed: trace it by hand.</Text>
        <List size="sm">
          {state.reasons.map((r) => (
            <List.Item key={r.code}>{r.message}</List.Item>
          ))}
        </List>
      </Paper>
    );

  const percent = Math.round(state.confidence * 100);
  const low = state.confidence < LOW_CONFIDENCE;
  return (
    <Paper withBorder p="sm" data-testid="autotrace-proposal">
      <Stack gap={6}>
        <Group gap="sm" wrap="wrap">
          <IconWand size={20} aria-hidden />
          <Text fw={600}>{origin === 'by-hand' ? 'A trace was proposed for this photo' : 'Proposed trace'}</Text>
          <Badge variant="outline" color={low ? 'amber' : 'gray'} data-testid="autotrace-confidence">
            confidence {percent} %{low ? ': check it' : ''}
          </Badge>
          {origin && origin !== 'by-hand' && (
            <Badge variant="outline" color="gray" data-testid="autotrace-origin">
              {TRACE_ORIGIN_LABELS[origin]}
            </Badge>
          )}
        </Group>
        {state.reasons.length > 0 && (
          <List size="sm" data-testid="autotrace-reasons">
            {state.reasons.map((r) => (
              <List.Item key={r.code}>{r.message}</List.Item>
            ))}
          </List>
        )}
        {origin === null && (
          <>
            <Text fz="sm">
              The atmospheric line, the two ends and the outline are drawn over the photo. Accept them, drag any point that is off, or trace
              by hand.
            </Text>
            <Group gap="sm">
              <Button leftSection={<IconCheck size={18} />} h={48} onClick={onAccept}>
                Accept the proposed trace
              </Button>
              <Button variant="default" leftSection={<IconHandFinger size={18} />} h={48} onClick={onByHand}>
                Trace by hand
              </Button>
            </Group>
          </>
        )}
        {origin === 'by-hand' && (
          <Group gap="sm">
            <Button variant="default" leftSection={<IconWand size={18} />} h={48} onClick={() => onBackToProposal(state.proposal)}>
              Use the proposed trace instead
            </Button>
          </Group>
        )}
        {(origin === 'proposed-accepted' || origin === 'adjusted') && (
          <Group gap="sm">
            <Button variant="default" leftSection={<IconHandFinger size={18} />} h={48} onClick={onByHand}>
              Trace by hand instead
            </Button>
          </Group>
        )}
      </Stack>
    </Paper>
  );
}
