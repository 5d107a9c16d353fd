import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Button, Group, List, Modal, Paper, PasswordInput, SimpleGrid, Stack, Text, Textarea, Title } from '@mantine/core';
import { IconCircleCheck, IconHandStop, IconLock } from '@tabler/icons-react';
import { RUN_PURPOSE_LABELS, type RunDetail, type RunState, type StartGateVerdict } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useSession } from '../../auth/useSession';
import { formatNumber } from '../../units/units';
import { startGateQuery, startRefusal, useTransitionRun } from '../api/runs.api';
import {
  allowedTransitions,
  formatDuration,
  formatPlannedFor,
  transitionLabel,
  TRANSITION_ROLES,
  type TransitionTarget,
} from '../model/transitions';
import { OpenAlarmsBadge, RunStateBadge } from './RunStateBadge';

const when = (iso: string | null) =>
  iso
    ? new Date(iso).toLocaleString(undefined, { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' })
    : '—';

/** What a transition records, said before the person confirms it. */
function explanation(from: RunState, to: TransitionTarget): string {
  switch (to) {
    case 'preparing':
      return from === 'cleared'
        ? 'The clearance to start is withdrawn and the run goes back to preparing. Your name, the time and your note are recorded.'
        : 'The run moves to preparing: the pre-start checklists can be worked through and signed. Your name and the time are recorded.';
    case 'cleared':
      return (
        'Records that you cleared this run to start, with your name and the time. The server still checks ' +
        'every required checklist and the pre-lube sign-off before the engine may start.'
      );
    case 'running':
      return (
        'Records the start time and your name. The server first checks the start gate: every required ' +
        'checklist complete and signed by a qualified person, and the pre-lube sign-off still fresh.'
      );
    case 'stopped':
      return 'Records the stop time and your name. A stopped run cannot be started again; the next start needs a new run.';
    case 'closed':
      return (
        'Records your countersignature: your name, the time, and that you confirmed it with your password or ' +
        'signing PIN. The log then becomes read-only; nothing in it can be corrected afterwards.'
      );
    case 'abandoned':
      return 'Records the reason, your name and the time. The run cannot be resumed; anything already logged stays in the record.';
  }
}

function Stat({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <Stack gap={2}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      {children}
    </Stack>
  );
}

function useRunningSeconds(run: RunDetail): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (run.state !== 'running') return;
    const t = setInterval(() => setNow(Date.now()), 15_000);
    return () => clearInterval(t);
  }, [run.state]);
  if (run.state === 'running' && run.startedAt) return Math.max(run.runningSeconds, (now - Date.parse(run.startedAt)) / 1000);
  return run.runningSeconds;
}

/** Why the start gate refuses, as a list a person can act on. */
export function StartGateReasons({ verdict, refused }: { verdict: StartGateVerdict; refused: boolean }) {
  return (
    <Alert
      color={refused ? 'signal' : 'amber'}
      variant={refused ? 'light' : 'outline'}
      icon={<IconHandStop />}
      title={refused ? 'Start refused: the engine may not start yet' : 'The start gate will refuse a start until:'}
      role={refused ? 'alert' : 'status'}
    >
      <List spacing={4}>
        {verdict.reasons.map((r, i) => (
          <List.Item key={`${r.code}-${i}`}>
            {r.message}
            {r.subject ? (
              <Text span c="dimmed">
                {' '}
                — {r.subject}
              </Text>
            ) : null}
          </List.Item>
        ))}
      </List>
      {verdict.preLubeFreshUntil && (
        <Text fz="sm" mt="xs">
          Pre-lube sign-off fresh until {when(verdict.preLubeFreshUntil)}.
        </Text>
      )}
    </Alert>
  );
}

export interface RunHeaderProps {
  run: RunDetail;
  /** Called with the run as the server returns it after a transition. */
  onTransitioned?: (run: RunDetail) => void;
  /** Draw every transition as a secondary button, when the page already has its own primary action. */
  quietActions?: boolean;
}

/** A run's title, engine, state, running time and revolutions, and the state changes this person may make now. */
export function RunHeader({ run, onTransitioned, quietActions = false }: RunHeaderProps) {
  const session = useSession();
  const role = session?.user.role;
  const targets = allowedTransitions(run.state, role);
  const runningSeconds = useRunningSeconds(run);
  const [pending, setPending] = useState<TransitionTarget | null>(null);
  const [refusal, setRefusal] = useState<StartGateVerdict | null>(null);
  const canStart = targets.includes('running');
  const gate = useQuery({ ...startGateQuery(run.id), enabled: canStart });

  useEffect(() => {
    if (run.state !== 'cleared') setRefusal(null);
  }, [run.state]);

  const finished = run.state === 'closed' || run.state === 'abandoned';
  const waitingForCountersign = run.state === 'stopped' && role !== undefined && !TRANSITION_ROLES.closed.includes(role);

  return (
    <Paper withBorder p="md" mb="md" radius="md" bg={finished ? 'var(--mantine-color-default-hover)' : undefined} data-testid="run-header">
      <Stack gap="md">
        <Group justify="space-between" align="flex-start" wrap="wrap" gap="md">
          <Stack gap={4}>
            <Group gap="sm" wrap="wrap">
              {run.state === 'closed' && <IconLock size={24} aria-hidden />}
              <Title order={1} fz={28}>
                {run.title}
              </Title>
              <RunStateBadge state={run.state} />
              <OpenAlarmsBadge count={run.openAlarms} />
            </Group>
            <Text c="dimmed" fz="sm">
              <Anchor component={Link} to={`/engines/${run.engineId}`} inherit>
                {run.engineName}
              </Anchor>
              {' · '}
              {RUN_PURPOSE_LABELS[run.purpose]}
              {run.plannedFor && ` · planned for ${formatPlannedFor(run.plannedFor)}`}
              {run.crew.length > 0 && ` · crew: ${run.crew.map((c) => c.displayName).join(', ')}`}
            </Text>
          </Stack>
          {targets.length > 0 && (
            <Group gap="sm" wrap="wrap" aria-label="Run actions" role="group">
              {targets.map((t, i) => (
                <Button
                  key={t}
                  size="lg"
                  variant={i === 0 && t !== 'abandoned' && !quietActions ? 'filled' : t === 'abandoned' ? 'subtle' : 'default'}
                  color={t === 'abandoned' ? 'signal' : undefined}
                  onClick={() => setPending(t)}
                >
                  {transitionLabel(run.state, t)}
                </Button>
              ))}
            </Group>
          )}
        </Group>

        <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="md">
          <Stat label="Running time">
            <Text className="cj-num" fz={26} fw={600} lh={1.1} data-testid="running-time">
              {formatDuration(runningSeconds)}
            </Text>
          </Stat>
          <Stat label="Revolutions">
            <Group gap={4} align="baseline" wrap="nowrap">
              <Text className="cj-num" fz={26} fw={600} lh={1.1} data-testid="revolutions">
                {formatNumber(run.revolutions, 0)}
              </Text>
              <Text span fz="sm" c="dimmed">
                rev
              </Text>
            </Group>
          </Stat>
          <Stat label="Started">
            <Text className="cj-num" fz="lg">
              {when(run.startedAt)}
            </Text>
          </Stat>
          <Stat label="Stopped">
            <Text className="cj-num" fz="lg">
              {when(run.stoppedAt)}
            </Text>
          </Stat>
        </SimpleGrid>

        {run.state === 'closed' && run.countersignedByName && (
          <Group gap="xs">
            <IconCircleCheck size={20} color="var(--mantine-color-copper-5)" aria-hidden />
            <Text fz="sm">
              Closed and countersigned by <b>{run.countersignedByName}</b> on {when(run.countersignedAt)}. This log is read-only.
            </Text>
          </Group>
        )}
        {run.state === 'abandoned' && (
          <Text fz="sm">Abandoned{run.abandonedReason ? `: ${run.abandonedReason}` : '.'} Its log is kept as it was.</Text>
        )}
        {waitingForCountersign && (
          <Text fz="sm" c="dimmed">
            Stopped. Waiting for the chief engineer to close and countersign the log.
          </Text>
        )}
        {refusal ? (
          <StartGateReasons verdict={refusal} refused />
        ) : (
          canStart &&
          gate.data &&
          !gate.data.allowed &&
          gate.data.reasons.length > 0 && <StartGateReasons verdict={gate.data} refused={false} />
        )}
      </Stack>
      <TransitionModal
        run={run}
        target={pending}
        onClose={() => setPending(null)}
        onRefused={(v) => {
          setPending(null);
          setRefusal(v);
          void gate.refetch();
        }}
        onDone={(r) => {
          setPending(null);
          setRefusal(null);
          onTransitioned?.(r);
        }}
      />
    </Paper>
  );
}

function TransitionModal({
  run,
  target,
  onClose,
  onRefused,
  onDone,
}: {
  run: RunDetail;
  target: TransitionTarget | null;
  onClose: () => void;
  onRefused: (v: StartGateVerdict) => void;
  onDone: (r: RunDetail) => void;
}) {
  const transition = useTransitionRun(run.id);
  const { reset: resetTransition } = transition;
  const [note, setNote] = useState('');
  const [signature, setSignature] = useState('');
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    setNote('');
    setSignature('');
    setError(null);
    resetTransition();
  }, [target, resetTransition]);

  if (!target) return <Modal opened={false} onClose={onClose} title="" />;
  const label = transitionLabel(run.state, target);
  const needsReason = target === 'abandoned';
  const needsSignature = target === 'closed';
  const ready = (!needsReason || note.trim().length > 0) && (!needsSignature || signature.length > 0);

  const submit = () => {
    setError(null);
    transition.mutate(
      { to: target, note: note.trim() || undefined, signature: needsSignature ? signature : undefined },
      {
        onSuccess: onDone,
        onError: (e) => {
          const v = target === 'running' ? startRefusal(e) : null;
          if (v) onRefused(v);
          else setError(errorText(e));
        },
      },
    );
  };

  return (
    <Modal opened onClose={onClose} title={<Text fw={700} fz="lg">{`${label}?`}</Text>} centered size="lg">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (ready) submit();
        }}
      >
        <Stack>
          <Text>
            <b>{run.title}</b> — {run.engineName}
          </Text>
          <Text fz="sm">{explanation(run.state, target)}</Text>
          {error && (
            <Alert color="signal" role="alert">
              {error}
            </Alert>
          )}
          {needsSignature && (
            <PasswordInput
              label="Your password or signing PIN"
              description="Confirms that you, the chief engineer, countersign this log."
              autoComplete="current-password"
              value={signature}
              onChange={(e) => setSignature(e.currentTarget.value)}
              data-autofocus
            />
          )}
          <Textarea
            label={needsReason ? 'Reason for abandoning' : 'Note for the log (optional)'}
            required={needsReason}
            rows={3}
            value={note}
            onChange={(e) => setNote(e.currentTarget.value)}
            data-autofocus={needsSignature ? undefined : true}
          />
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={onClose}>
              Cancel
            </Button>
            <Button
              type="submit"
              size="lg"
              color={target === 'abandoned' ? 'signal' : undefined}
              disabled={!ready}
              loading={transition.isPending}
            >
              {target === 'abandoned' ? 'Abandon run' : label}
            </Button>
          </Group>
        </Stack>
      </form>
    </Modal>
  );
}
