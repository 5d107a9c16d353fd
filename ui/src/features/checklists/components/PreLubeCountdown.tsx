import { useEffect, useRef } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Group, Paper, Stack, Text } from '@mantine/core';
import { IconDroplet, IconDropletOff } from '@tabler/icons-react';
import { runKeys, startGateQuery } from '../../runs/api/runs.api';
import { countdown } from '../model/countdown';
import { useNow } from '../model/useNow';

/** Below this many minutes the countdown turns amber: time to start, or to pre-lube again. */
export const PRE_LUBE_WARNING_MINUTES = 5;

/**
 * The time left in the pre-lube window, ticking every second. Calm while plenty is left, amber near the end,
 * red with the words "pre-lube again" once it has passed (the server then refuses the start).
 */
export function PreLubeCountdownView({
  until,
  windowMinutes,
  onExpired,
}: {
  until: string;
  windowMinutes?: number;
  onExpired?: () => void;
}) {
  const now = useNow(1000);
  const c = countdown(until, now);
  // Called once when the window runs out, with the caller's latest callback (an inline function is new each render).
  const onExpiredRef = useRef(onExpired);
  useEffect(() => {
    onExpiredRef.current = onExpired;
  });
  useEffect(() => {
    if (c.expired) onExpiredRef.current?.();
  }, [c.expired]);
  const warn = !c.expired && c.remainingMs < PRE_LUBE_WARNING_MINUTES * 60_000;
  const color = c.expired ? 'signal' : warn ? 'amber' : undefined;
  return (
    <Paper
      withBorder
      p="md"
      radius="md"
      data-testid="pre-lube-countdown"
      role="timer"
      aria-live="off"
      style={color ? { borderColor: `var(--mantine-color-${color}-6)`, borderWidth: 2 } : undefined}
    >
      <Group gap="md" wrap="nowrap" align="center">
        {c.expired ? (
          <IconDropletOff size={36} color="var(--mantine-color-signal-6)" aria-hidden />
        ) : (
          <IconDroplet size={36} aria-hidden color={warn ? 'var(--mantine-color-amber-6)' : undefined} />
        )}
        <Stack gap={0}>
          <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
            {c.expired ? 'Pre-lube window has passed' : 'Pre-lube fresh for'}
          </Text>
          <Text className="cj-num" fz={40} fw={700} lh={1.1} c={color} data-testid="pre-lube-remaining">
            {c.text}
          </Text>
          <Text fz="sm" c={c.expired ? 'signal' : 'dimmed'}>
            {c.expired
              ? 'Oil has drained from under the journals: pre-lube again and sign a new pre-lube checklist before starting.'
              : `until ${new Date(until).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' })}` +
                (windowMinutes ? ` (window ${windowMinutes} min)` : '')}
          </Text>
        </Stack>
      </Group>
    </Paper>
  );
}

/** The countdown for a run, from its start gate; shows nothing while there is no pre-lube sign-off. */
export function PreLubeCountdown({ runId, windowMinutes }: { runId: string; windowMinutes?: number }) {
  const qc = useQueryClient();
  const gate = useQuery(startGateQuery(runId));
  const until = gate.data?.preLubeFreshUntil;
  if (!until) return null;
  return (
    <PreLubeCountdownView
      until={until}
      windowMinutes={windowMinutes}
      onExpired={() => void qc.invalidateQueries({ queryKey: runKeys.startGate(runId) })}
    />
  );
}
