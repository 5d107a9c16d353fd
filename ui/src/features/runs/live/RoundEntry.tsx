import { useMemo, useRef, useState } from 'react';
import { Alert, Box, Button, Group, Paper, Stack, Text, TextInput } from '@mantine/core';
import { IconAlertOctagon, IconAlertTriangle, IconArrowDown, IconArrowUp, IconDeviceFloppy } from '@tabler/icons-react';
import dayjs from 'dayjs';
import type { IngestResult, MeasurementPointDto, RoundRequest } from '@crankjournal/shared-types';
import { errorText, HttpError } from '../../../api/http';
import { newClientId, outbox, type Outbox, type SubmitOutcome } from '../../../api/outbox';
import { BottomBar } from './BottomBar';
import {
  limitsText,
  limitStanding,
  normalRangeText,
  parseEntered,
  STANDING_WORDS,
  unitLabel,
  type EngineCeilings,
  type LimitStanding,
} from './round-check';

export type RoundPoint = MeasurementPointDto & { id: string };
export interface PreviousValue {
  value: number | null;
  takenAt: string | null;
}

interface Props {
  runId: string;
  points: RoundPoint[];
  previous?: Record<string, PreviousValue | undefined>;
  engine?: EngineCeilings;
  /** Extra actions for the bottom bar (left of "Save round"). */
  secondaryActions?: React.ReactNode;
  onSaved?: (outcome: SubmitOutcome) => void;
  queue?: Outbox;
}

const fmt = (n: number) => String(Number(n.toFixed(3)));

function standingStyle(s: LimitStanding | null): { color: string | null; Icon: typeof IconAlertTriangle | null } {
  switch (s) {
    case 'high_high':
      return { color: 'signal', Icon: IconAlertOctagon };
    case 'high':
      return { color: 'amber', Icon: IconAlertTriangle };
    case 'low':
      return { color: 'amber', Icon: IconAlertTriangle };
    case 'above_normal':
      return { color: null, Icon: IconArrowUp };
    case 'below_normal':
      return { color: null, Icon: IconArrowDown };
    default:
      return { color: null, Icon: null };
  }
}

/**
 * A round of readings on the tablet: one big numeric field per measurement point in the engine's round order,
 * the last value and normal range beside it, out-of-range values marked before saving, one "Save round".
 */
export function RoundEntry({ runId, points, previous = {}, engine, secondaryActions, onSaved, queue = outbox() }: Props) {
  const ordered = useMemo(() => [...points].sort((a, b) => a.sequence - b.sequence), [points]);
  const [entered, setEntered] = useState<Record<string, string>>({});
  const [rowErrors, setRowErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const inputs = useRef<Record<string, HTMLInputElement | null>>({});

  const parsed = useMemo(() => {
    const out: Record<string, { value: number | null; invalid: boolean; standing: LimitStanding | null }> = {};
    for (const p of ordered) {
      const v = parseEntered(entered[p.id] ?? '');
      const invalid = v !== null && Number.isNaN(v);
      out[p.id] = { value: invalid ? null : v, invalid, standing: v === null || invalid ? null : limitStanding(p, v, engine) };
    }
    return out;
  }, [ordered, entered, engine]);

  const filled = ordered.filter((p) => parsed[p.id].value !== null);
  const invalidCount = ordered.filter((p) => parsed[p.id].invalid).length;
  const alarming = ordered.filter((p) => ['high_high', 'high', 'low'].includes(parsed[p.id].standing ?? ''));

  const focusNext = (i: number) => {
    const next = ordered[i + 1];
    if (next) inputs.current[next.id]?.focus();
    else inputs.current[ordered[i].id]?.blur();
  };

  async function save() {
    if (filled.length === 0 || invalidCount > 0) return;
    const takenAt = new Date().toISOString();
    const round: RoundRequest = {
      takenAt,
      readings: filled.map((p) => ({ clientId: newClientId(), pointId: p.id, value: parsed[p.id].value!, unit: p.unit, takenAt })),
    };
    setSaving(true);
    setError(null);
    setRowErrors({});
    try {
      const outcome = await queue.submit(runId, round);
      setEntered({});
      onSaved?.(outcome);
    } catch (e) {
      // Some rows refused: the good ones are stored; keep the refused ones on screen to correct.
      const details = e instanceof HttpError ? (e.body?.details as IngestResult | undefined) : undefined;
      if (e instanceof HttpError && e.status === 400 && details && Array.isArray(details.rejected)) {
        const errs: Record<string, string> = {};
        for (const r of details.rejected) {
          const p = r.index !== undefined ? filled[r.index] : undefined;
          if (p) errs[p.id] = r.reason;
        }
        const keep = new Set(Object.keys(errs));
        setEntered((cur) => Object.fromEntries(Object.entries(cur).filter(([id]) => keep.has(id))));
        setRowErrors(errs);
        setError(`${details.stored} reading(s) stored; ${details.rejectedCount} refused — correct them below and save again.`);
      } else {
        setError(errorText(e));
      }
    } finally {
      setSaving(false);
    }
  }

  return (
    <>
      <Stack gap="sm">
        {ordered.map((p, i) => {
          const st = parsed[p.id];
          const { color, Icon } = standingStyle(st.standing);
          const prev = previous[p.id];
          const range = normalRangeText(p, fmt);
          const limits = limitsText(p, fmt);
          const u = unitLabel(p.unit);
          const inAlarm = color !== null;
          const fieldError = st.invalid ? 'Not a number — use digits and a decimal point.' : rowErrors[p.id];
          return (
            <Paper
              key={p.id}
              withBorder
              p="md"
              data-testid={`round-row-${p.code}`}
              data-standing={st.standing ?? 'empty'}
              style={
                inAlarm
                  ? {
                      borderColor: `var(--mantine-color-${color}-6)`,
                      borderWidth: 3,
                      background: `color-mix(in srgb, var(--mantine-color-${color}-6) 12%, transparent)`,
                    }
                  : undefined
              }
            >
              <Box style={{ display: 'grid', gridTemplateColumns: 'repeat(auto-fit, minmax(210px, 1fr))', gap: 16, alignItems: 'center' }}>
                <Stack gap={0}>
                  <Text fw={700} fz="lg" component="label" htmlFor={`round-${p.id}`}>
                    {p.label}
                  </Text>
                  <Text fz="sm" c="dimmed">
                    {p.code} · {u}
                  </Text>
                </Stack>
                <TextInput
                  id={`round-${p.id}`}
                  ref={(el) => {
                    inputs.current[p.id] = el;
                  }}
                  aria-label={`${p.label} (${u})`}
                  inputMode="decimal"
                  enterKeyHint={i === ordered.length - 1 ? 'done' : 'next'}
                  autoComplete="off"
                  value={entered[p.id] ?? ''}
                  onChange={(e) => {
                    const v = e.currentTarget.value;
                    setEntered((cur) => ({ ...cur, [p.id]: v }));
                    if (rowErrors[p.id]) setRowErrors(({ [p.id]: _gone, ...rest }) => rest);
                  }}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter') {
                      e.preventDefault();
                      focusNext(i);
                    }
                  }}
                  rightSection={
                    <Text fz="lg" c="dimmed" pr="sm">
                      {u}
                    </Text>
                  }
                  rightSectionWidth={84}
                  error={fieldError}
                  inputWrapperOrder={['label', 'input', 'description', 'error']}
                  description={
                    st.standing && st.standing !== 'normal' && Icon ? (
                      <Group gap={6} mt={4} wrap="nowrap" component="span" aria-live="polite">
                        <Icon size={20} stroke={2} aria-hidden color={color ? `var(--mantine-color-${color}-6)` : undefined} />
                        <Text span fw={700} fz="md" c={color ? `${color}.6` : 'dimmed'} data-testid={`round-standing-${p.code}`}>
                          {STANDING_WORDS[st.standing]}
                          {st.standing === 'high_high' || st.standing === 'high' ? ' — check the gauge' : ''}
                        </Text>
                      </Group>
                    ) : undefined
                  }
                  styles={{
                    input: {
                      height: 64,
                      minHeight: 64,
                      fontSize: 30,
                      fontWeight: 600,
                      fontVariantNumeric: 'tabular-nums',
                      fontFamily: "'Barlow Semi Condensed', Barlow, sans-serif",
                      textAlign: 'right',
                      borderWidth: inAlarm ? 2 : undefined,
                      borderColor: inAlarm ? `var(--mantine-color-${color}-6)` : undefined,
                    },
                  }}
                />
                <Stack gap={2} id={`round-${p.id}-context`}>
                  <Text fz="sm">
                    <Text span c="dimmed" fz="sm">
                      Last{' '}
                    </Text>
                    {prev && prev.value !== null ? (
                      <>
                        <Text span className="cj-num" fw={600} fz="md">
                          {fmt(prev.value)} {u}
                        </Text>
                        {prev.takenAt && (
                          <Text span c="dimmed" fz="sm">
                            {' '}
                            at {dayjs(prev.takenAt).format('HH:mm')}
                          </Text>
                        )}
                      </>
                    ) : (
                      <Text span c="dimmed" fz="sm">
                        — none yet
                      </Text>
                    )}
                  </Text>
                  {range && (
                    <Text fz="sm" c="dimmed">
                      Normal {range}
                    </Text>
                  )}
                  {limits && (
                    <Text fz="xs" c="dimmed">
                      {limits}
                    </Text>
                  )}
                </Stack>
              </Box>
            </Paper>
          );
        })}
      </Stack>
      {error && (
        <Alert color="signal" variant="light" role="alert" mt="md" icon={<IconAlertOctagon />} title="Round not saved">
          {error}
        </Alert>
      )}
      <BottomBar label="Round actions">
        <Group gap="sm" wrap="nowrap">
          {secondaryActions}
        </Group>
        <Group gap="md" wrap="nowrap">
          <Stack gap={0} align="flex-end">
            <Text fz="sm" fw={600}>
              {filled.length} of {ordered.length} entered
            </Text>
            {alarming.length > 0 && (
              <Text fz="sm" c="var(--cj-signal)" fw={700}>
                {alarming.length === 1 ? '1 value beyond a limit' : `${alarming.length} values beyond a limit`}
              </Text>
            )}
            {invalidCount > 0 && (
              <Text fz="sm" c="var(--cj-signal)" fw={700}>
                Correct {invalidCount === 1 ? 'the value' : `${invalidCount} values`} that {invalidCount === 1 ? 'is' : 'are'} not a number
              </Text>
            )}
          </Stack>
          <Button
            size="xl"
            h={60}
            leftSection={<IconDeviceFloppy />}
            loading={saving}
            disabled={filled.length === 0 || invalidCount > 0}
            onClick={() => void save()}
          >
            Save round
          </Button>
        </Group>
      </BottomBar>
    </>
  );
}
