import { useEffect, useState } from 'react';
import { Alert, Button, Chip, Group, Modal, NumberInput, Paper, Stack, Text, Textarea } from '@mantine/core';
import { IconBellCheck, IconClockPause, IconClockPlay } from '@tabler/icons-react';
import dayjs from 'dayjs';
import { ALARM_KIND_WORDS, ALARM_PRIORITY_WORDS, type AlarmDto } from '@crankjournal/shared-types';
import { useUnits } from '../../units/useUnits';
import { AlarmStateBadge, alarmTime, isUnacknowledged, priorityColor } from './alarm-look';

export const MAX_SHELVE_MINUTES = 24 * 60;
const STATE_ORDER = ['active_unacknowledged', 'returned_unacknowledged', 'active_acknowledged', 'shelved', 'normal'];

export function alarmListOrder(a: AlarmDto, b: AlarmDto) {
  return STATE_ORDER.indexOf(a.state) - STATE_ORDER.indexOf(b.state) || b.raisedAt.localeCompare(a.raisedAt);
}

const t = alarmTime;

export interface AlarmActions {
  /** May acknowledge (operators, chief engineer). */
  canAcknowledge: boolean;
  /** May shelve and unshelve (as above, and the run is not finished). */
  canShelve: boolean;
  busy: string | null;
  onAcknowledge: (a: AlarmDto) => void;
  onShelve: (a: AlarmDto) => void;
  onUnshelve: (a: AlarmDto) => void;
}

const priorityWords = (a: AlarmDto) =>
  a.priority === 'advisory' ? ALARM_PRIORITY_WORDS.advisory : `${ALARM_PRIORITY_WORDS[a.priority]} priority`;

function AlarmRow({ alarm: a, actions }: { alarm: AlarmDto; actions: AlarmActions }) {
  const { display } = useUnits();
  const shelved = a.state === 'shelved';
  const cleared = a.state === 'normal';
  const value = a.value !== null ? display(a.value, a.unit, a.kind === 'rate_of_rise' ? { delta: true } : undefined) : null;
  const limit = a.limit !== null ? display(a.limit, a.unit, a.kind === 'rate_of_rise' ? { delta: true } : undefined) : null;
  return (
    <Paper
      withBorder
      p="sm"
      radius="md"
      className={shelved ? 'cj-shelved' : undefined}
      data-testid={`alarm-${a.id}`}
      data-state={a.state}
      style={
        !shelved && !cleared && isUnacknowledged(a.state)
          ? { borderColor: `var(--mantine-color-${priorityColor(a.priority)}-6)`, borderWidth: 2 }
          : undefined
      }
      opacity={cleared ? 0.8 : 1}
    >
      <Group justify="space-between" align="flex-start" wrap="wrap" gap="sm">
        <Stack gap={4} style={{ flex: '1 1 320px', minWidth: 0 }}>
          <Group gap="xs" wrap="wrap">
            {cleared ? (
              <Text fz="sm" fw={600} c="dimmed">
                Cleared
              </Text>
            ) : (
              <AlarmStateBadge state={a.state} priority={a.priority} size="md" />
            )}
            <Text fw={700}>
              {priorityWords(a)} · {a.pointLabel} · {ALARM_KIND_WORDS[a.kind]}
            </Text>
          </Group>
          <Text fz="sm">{a.message}</Text>
          <Text fz="xs" c="dimmed">
            {value && `Value ${value.label}`}
            {limit && ` · limit ${limit.label}`}
            {` · raised ${t(a.raisedAt)}`}
            {a.acknowledgedAt && ` · acknowledged ${t(a.acknowledgedAt)} by ${a.acknowledgedByName ?? '—'}`}
            {a.returnedAt && ` · returned to normal ${t(a.returnedAt)}`}
          </Text>
          {a.suppression && (
            <Text fz="sm" fw={600} data-testid="suppressed-by">
              Suppressed by {a.suppressedByLabel ?? (a.suppression === 'state' ? 'the run state' : 'a higher alarm')} — recorded, not
              annunciated
            </Text>
          )}
          {shelved && (
            <Text fz="sm" fw={600}>
              Shelved until {t(a.shelvedUntil)} by {a.shelvedByName ?? '—'}: {a.shelveReason}
            </Text>
          )}
        </Stack>
        {(actions.canAcknowledge || actions.canShelve) && !cleared && (
          <Group gap="xs" wrap="wrap">
            {actions.canAcknowledge && isUnacknowledged(a.state) && !a.suppression && (
              <Button
                size="md"
                h={48}
                leftSection={<IconBellCheck size={18} />}
                loading={actions.busy === a.id}
                onClick={() => actions.onAcknowledge(a)}
              >
                Acknowledge
              </Button>
            )}
            {!actions.canShelve ? null : shelved ? (
              <Button
                size="md"
                h={48}
                variant="default"
                leftSection={<IconClockPlay size={18} />}
                loading={actions.busy === a.id}
                onClick={() => actions.onUnshelve(a)}
              >
                Unshelve
              </Button>
            ) : (
              <Button size="md" h={48} variant="default" leftSection={<IconClockPause size={18} />} onClick={() => actions.onShelve(a)}>
                Shelve…
              </Button>
            )}
          </Group>
        )}
      </Group>
    </Paper>
  );
}

/**
 * The run's alarms: waiting ones first, then acknowledged, shelved (hatched) and cleared. Alarms suppressed by
 * design or by state are a click away ("Show suppressed").
 */
export function AlarmList({ alarms, actions }: { alarms: AlarmDto[]; actions: AlarmActions }) {
  const [showSuppressed, setShowSuppressed] = useState(false);
  if (alarms.length === 0) return <Text c="dimmed">No alarms on this run.</Text>;
  const suppressed = alarms.filter((a) => a.suppression && a.state !== 'normal');
  const shown = showSuppressed ? alarms : alarms.filter((a) => !(a.suppression && a.state !== 'normal'));
  return (
    <Stack gap="xs">
      {[...shown].sort(alarmListOrder).map((a) => (
        <AlarmRow key={a.id} alarm={a} actions={actions} />
      ))}
      {suppressed.length > 0 && (
        <Button variant="subtle" onClick={() => setShowSuppressed((v) => !v)} aria-expanded={showSuppressed}>
          {showSuppressed ? 'Hide suppressed alarms' : `Show ${suppressed.length} suppressed alarm${suppressed.length === 1 ? '' : 's'}`}
        </Button>
      )}
    </Stack>
  );
}

/** Asks why and for how long before shelving; says what is recorded. */
export function ShelveModal({
  alarm,
  onClose,
  onShelve,
  busy,
  error,
}: {
  alarm: AlarmDto | null;
  onClose: () => void;
  onShelve: (a: AlarmDto, reason: string, minutes: number) => void;
  busy: boolean;
  error: string | null;
}) {
  const [reason, setReason] = useState('');
  const [minutes, setMinutes] = useState<number | string>(60);
  useEffect(() => {
    setReason('');
    setMinutes(60);
  }, [alarm?.id]);
  const m = typeof minutes === 'number' ? minutes : Number(minutes);
  const minutesOk = Number.isInteger(m) && m >= 1 && m <= MAX_SHELVE_MINUTES;
  const ready = reason.trim().length > 0 && minutesOk;
  return (
    <Modal
      opened={!!alarm}
      onClose={onClose}
      centered
      size="lg"
      title={
        <Text fw={700} fz="lg">
          Shelve this alarm?
        </Text>
      }
    >
      {alarm && (
        <form
          onSubmit={(e) => {
            e.preventDefault();
            if (ready) onShelve(alarm, reason.trim(), m);
          }}
        >
          <Stack>
            <Text>
              <b>{alarm.pointLabel}</b> — {alarm.message}
            </Text>
            <Text fz="sm">
              A shelved alarm leaves the banner until the time runs out, then comes back if its condition is still there. Your name, the
              time, the reason and the length are recorded with the alarm.
            </Text>
            {error && (
              <Alert color="signal" role="alert">
                {error}
              </Alert>
            )}
            <Textarea
              label="Reason"
              required
              rows={2}
              value={reason}
              onChange={(e) => setReason(e.currentTarget.value)}
              data-autofocus
              placeholder="e.g. thermometer on MB2 being replaced"
            />
            <Stack gap={6}>
              <NumberInput
                label="For how many minutes"
                description="At most 24 hours (1440 minutes)."
                min={1}
                max={MAX_SHELVE_MINUTES}
                clampBehavior="none"
                allowDecimal={false}
                value={minutes}
                onChange={setMinutes}
                error={minutes !== '' && !minutesOk ? 'Between 1 minute and 24 hours (1440 minutes).' : undefined}
                inputMode="numeric"
                styles={{ input: { height: 52, fontSize: 22 } }}
              />
              <Chip.Group value={String(m)} onChange={(v) => setMinutes(Number(v))}>
                <Group gap="xs">
                  {[15, 30, 60, 120, 480, 1440].map((x) => (
                    <Chip key={x} value={String(x)} size="lg">
                      {x < 60 ? `${x} min` : `${x / 60} h`}
                    </Chip>
                  ))}
                </Group>
              </Chip.Group>
              {minutesOk && (
                <Text fz="sm" c="dimmed">
                  Until {dayjs().add(m, 'minute').format('ddd HH:mm')}
                </Text>
              )}
            </Stack>
            <Group justify="flex-end">
              <Button variant="default" size="lg" onClick={onClose}>
                Cancel
              </Button>
              <Button type="submit" size="lg" disabled={!ready} loading={busy} leftSection={<IconClockPause size={18} />}>
                Shelve alarm
              </Button>
            </Group>
          </Stack>
        </form>
      )}
    </Modal>
  );
}
