import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Alert, Anchor, Button, Group, List, Modal, Stack, Text } from '@mantine/core';
import { IconCircleCheck, IconHandStop, IconPlayerPlayFilled } from '@tabler/icons-react';
import {
  GATE_REASON_CODES,
  type RunChecklistsOverview,
  type RunDetail,
  type StartGateReason,
  type StartGateVerdict,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useFiguresAsOf, useOnline } from '../../../components/Offline/useOnline';
import { useHasRole } from '../../auth/useSession';
import { runKeys, startGateQuery, startRefusal, useTransitionRun } from '../../runs/api/runs.api';
import { PreLubeCountdownView } from './PreLubeCountdown';

const STARTER_CODES: string[] = [GATE_REASON_CODES.qualificationMissing, GATE_REASON_CODES.qualificationExpired];

/** Where a reason can be put right: the checklist it names, if any. */
function reasonLink(r: StartGateReason, overview: RunChecklistsOverview | undefined): string | null {
  const t = overview?.templates.find((x) => x.template.name === r.subject);
  if (!t) return null;
  const c = t.open ?? t.signed;
  return c ? `/runs/${overview!.runId}/checklists/${c.id}` : null;
}

export function GateReasons({
  verdict,
  refused,
  overview,
}: {
  verdict: StartGateVerdict;
  refused: boolean;
  overview?: RunChecklistsOverview;
}) {
  return (
    <Alert
      color={refused ? 'signal' : 'amber'}
      variant={refused ? 'light' : 'outline'}
      icon={<IconHandStop />}
      title={refused ? 'Start refused: the engine may not start yet' : 'The start gate will refuse a start until:'}
      role={refused ? 'alert' : 'status'}
      data-testid={refused ? 'start-refused' : 'gate-reasons'}
    >
      <List spacing={6}>
        {verdict.reasons.map((r, i) => {
          const to = reasonLink(r, overview);
          return (
            <List.Item key={`${r.code}-${i}`} data-code={r.code}>
              {r.message}
              {to && (
                <>
                  {' '}
                  <Anchor component={Link} to={to} fw={600}>
                    Open the checklist
                  </Anchor>
                </>
              )}
            </List.Item>
          );
        })}
      </List>
    </Alert>
  );
}

/**
 * The start gate as the server sees it for this person, with the pre-lube countdown and, once the run is
 * cleared, the one next step: start the engine. The server decides; this only explains.
 */
export function GatePanel({ run, overview }: { run: RunDetail; overview?: RunChecklistsOverview }) {
  const qc = useQueryClient();
  const navigate = useNavigate();
  const mayStart = useHasRole('operator', 'chief_engineer');
  const relevant = run.state === 'preparing' || run.state === 'cleared';
  const gate = useQuery({ ...startGateQuery(run.id), enabled: relevant, refetchInterval: relevant ? 20_000 : false });
  const [confirming, setConfirming] = useState(false);
  const [refusal, setRefusal] = useState<StartGateVerdict | null>(null);
  const transition = useTransitionRun(run.id);
  const online = useOnline();
  const asOf = useFiguresAsOf();
  if (!relevant) return null;
  // The server decides every start: without it (offline, or figures from the tablet's cache) there is no start.
  const noServer = !online || asOf !== null;

  const v = gate.data;
  const reasons = v ? v.reasons.filter((r) => mayStart || !STARTER_CODES.includes(r.code)) : [];
  const shown: StartGateVerdict | null = v ? { ...v, reasons } : null;

  const start = () => {
    setRefusal(null);
    transition.mutate(
      { to: 'running' },
      {
        onSuccess: (r) => {
          setConfirming(false);
          void navigate(`/runs/${r.id}`);
        },
        onError: (e) => {
          setConfirming(false);
          const refused = startRefusal(e);
          setRefusal(refused ?? { allowed: false, reasons: [{ code: 'error', message: errorText(e) }] });
          void qc.invalidateQueries({ queryKey: runKeys.startGate(run.id) });
        },
      },
    );
  };

  return (
    <Stack gap="md" mb="lg" data-testid="gate-panel">
      {v?.preLubeFreshUntil && (
        <PreLubeCountdownView
          until={v.preLubeFreshUntil}
          windowMinutes={overview?.preLubeFreshnessMinutes}
          onExpired={() => void qc.invalidateQueries({ queryKey: runKeys.startGate(run.id) })}
        />
      )}
      {refusal ? (
        <GateReasons verdict={refusal} refused overview={overview} />
      ) : shown && shown.reasons.length > 0 ? (
        <GateReasons verdict={shown} refused={false} overview={overview} />
      ) : shown ? (
        <Group gap="xs" data-testid="gate-clear">
          <IconCircleCheck size={22} color="var(--mantine-color-copper-5)" aria-hidden />
          <Text fz="md">
            Every condition of the start gate holds{run.state === 'preparing' ? '; the run is waiting to be cleared.' : '.'}
          </Text>
        </Group>
      ) : null}
      {run.state === 'cleared' && mayStart && (
        <Group justify="flex-end" align="center">
          {noServer && (
            <Text fz="md" fw={600} id="start-needs-server">
              Starting the engine needs the server: it checks the start gate at that moment. Wait for the connection.
            </Text>
          )}
          <Button
            size="xl"
            h={60}
            leftSection={<IconPlayerPlayFilled />}
            disabled={noServer}
            aria-describedby={noServer ? 'start-needs-server' : undefined}
            onClick={() => setConfirming(true)}
          >
            Start engine
          </Button>
        </Group>
      )}
      <Modal
        opened={confirming}
        onClose={() => setConfirming(false)}
        title={
          <Text fw={700} fz="lg">
            Start engine?
          </Text>
        }
        centered
        size="lg"
      >
        <Stack>
          <Text>
            <b>{run.title}</b> — {run.engineName}
          </Text>
          <Text fz="sm">
            Records the start time and your name. The server checks the start gate first: every required checklist signed by a qualified
            person, the pre-lube sign-off still fresh, your own start-and-run qualification, and no high-high alarm on the engine.
          </Text>
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
            <Button size="lg" loading={transition.isPending} onClick={start}>
              Start engine
            </Button>
          </Group>
        </Stack>
      </Modal>
    </Stack>
  );
}
