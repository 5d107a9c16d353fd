import { Box, Button, Group, Stack, Text } from '@mantine/core';
import { ALARM_KIND_WORDS, ALARM_PRIORITY_WORDS, type AlarmDto } from '@crankjournal/shared-types';
import { alarmLook, alarmTime, isUnacknowledged } from './alarm-look';

/** Most urgent first: high-high before high before an advisory pre-alarm, active before returned, newest first. */
export function bannerOrder(a: AlarmDto, b: AlarmDto): number {
  const p = (x: AlarmDto) => (x.priority === 'high_high' ? 0 : x.priority === 'high' ? 1 : 2);
  const s = (x: AlarmDto) => (x.state === 'active_unacknowledged' ? 0 : 1);
  return p(a) - p(b) || s(a) - s(b) || b.raisedAt.localeCompare(a.raisedAt);
}

/**
 * Pinned under the app header whenever an alarm waits for acknowledgement: point, message, state (icon + word)
 * and an "Acknowledge" button for those who may. Shows the most urgent ones and counts the rest.
 */
export function AlarmBanner({
  alarms,
  canAcknowledge,
  onAcknowledge,
  acknowledging,
  max = 3,
}: {
  alarms: AlarmDto[];
  canAcknowledge: boolean;
  onAcknowledge: (a: AlarmDto) => void;
  acknowledging: string | null;
  max?: number;
}) {
  // Suppressed alarms (by a higher alarm of the point, or by the run state) are recorded but not annunciated.
  const waiting = alarms.filter((a) => isUnacknowledged(a.state) && !a.suppression).sort(bannerOrder);
  if (waiting.length === 0) return null;
  const shown = waiting.slice(0, max);
  const more = waiting.length - shown.length;
  return (
    <Box
      role="alert"
      aria-label="Alarms waiting for acknowledgement"
      data-testid="alarm-banner"
      style={{
        position: 'sticky',
        top: 'calc(var(--app-shell-header-offset, 60px))',
        zIndex: 120,
        marginInline: 'calc(var(--app-shell-padding, 16px) * -1)',
        marginTop: 'calc(var(--app-shell-padding, 16px) * -1)',
      }}
      mb="md"
    >
      <Stack gap={0}>
        {shown.map((a) => {
          const look = alarmLook(a.state, a.priority)!;
          const filled = look.variant === 'filled';
          const fg = filled ? (a.priority === 'high_high' ? 'white' : 'black') : undefined;
          return (
            <Group
              key={a.id}
              justify="space-between"
              wrap="nowrap"
              px="md"
              py={8}
              gap="md"
              style={{
                background: filled
                  ? `var(--mantine-color-${look.color}-${a.priority === 'high_high' ? 7 : 5})`
                  : 'var(--mantine-color-body)',
                border: filled ? undefined : `3px solid var(--mantine-color-${look.color}-5)`,
                borderBottom: '1px solid rgba(0,0,0,.25)',
                color: fg,
              }}
              data-priority={a.priority}
              data-state={a.state}
            >
              <Group gap="sm" wrap="nowrap" style={{ minWidth: 0 }}>
                <look.Icon size={30} stroke={2} aria-hidden />
                <Stack gap={0} style={{ minWidth: 0 }}>
                  <Text fw={800} fz="md" c={fg} lh={1.2}>
                    {ALARM_PRIORITY_WORDS[a.priority].toUpperCase()} · {a.pointLabel} · {ALARM_KIND_WORDS[a.kind]}
                  </Text>
                  <Text fz="sm" c={fg} lh={1.25} lineClamp={2} style={{ overflowWrap: 'anywhere' }}>
                    {a.message}
                  </Text>
                  <Text fz="xs" c={fg} fw={700} lh={1.3}>
                    {look.word} · raised {alarmTime(a.raisedAt)}
                    {a.returnedAt ? ` · returned ${alarmTime(a.returnedAt)}` : ''}
                  </Text>
                </Stack>
              </Group>
              {canAcknowledge && (
                <Button
                  size="lg"
                  h={48}
                  variant={filled ? 'white' : 'filled'}
                  color={filled ? 'dark' : 'amber'}
                  c={filled ? 'black' : 'black'}
                  loading={acknowledging === a.id}
                  onClick={() => onAcknowledge(a)}
                  style={{ flexShrink: 0 }}
                  aria-label={`Acknowledge ${a.pointLabel} alarm`}
                >
                  Acknowledge
                </Button>
              )}
            </Group>
          );
        })}
        {more > 0 && (
          <Text
            fz="sm"
            fw={700}
            px="md"
            py={6}
            bg="var(--mantine-color-default)"
            style={{ borderBottom: '1px solid var(--mantine-color-default-border)' }}
          >
            and {more} more waiting — see the alarm list below
          </Text>
        )}
      </Stack>
    </Box>
  );
}
