import { lazy, Suspense } from 'react';
import { Box, Group, Paper, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import dayjs from 'dayjs';
import { IconAlertOctagon, IconAlertTriangle } from '@tabler/icons-react';
import {
  ALARM_KIND_WORDS,
  type BoardPoint,
  type LimitForecastDto,
  type MeasurementKind,
  type MeasurementPointDto,
} from '@crankjournal/shared-types';
import { useUnits } from '../../units/useUnits';
import { AlarmStateBadge, alarmLook } from '../../alarms/components/alarm-look';
import { GaugeGlass, LIMIT_MARK_WORDS, limitMark } from './GaugeGlass';

/** The charts library (recharts) is loaded after the tiles are on screen: a tile shows its value first, its trend a moment later. */
const Sparkline = lazy(() => import('@mantine/charts').then((m) => ({ default: m.Sparkline })));

export type EnginePoint = MeasurementPointDto & { id: string };

export const BOARD_GROUPS: { key: string; title: string; kinds: MeasurementKind[] }[] = [
  { key: 'steam', title: 'Steam and speed', kinds: ['throttle_pressure', 'receiver_pressure', 'vacuum', 'speed'] },
  { key: 'bearings', title: 'Bearings', kinds: ['bearing_temperature'] },
  { key: 'oil', title: 'Oil', kinds: ['oil_pressure', 'oil_feed_rate'] },
  { key: 'other', title: 'Ambient and other', kinds: ['ambient_temperature', 'other'] },
];

/** Points grouped for the board, each group in round order; points the board knows but the engine no longer lists are left out. */
export function groupBoard(points: EnginePoint[], board: BoardPoint[]) {
  const byId = new Map(board.map((b) => [b.pointId, b]));
  return BOARD_GROUPS.map((g) => ({
    ...g,
    items: points
      .filter((p) => g.kinds.includes(p.kind))
      .sort((a, b) => a.sequence - b.sequence)
      .map((p) => ({ point: p, board: byId.get(p.id) ?? null })),
  })).filter((g) => g.items.length > 0);
}

function BoardTile({ point, board }: { point: EnginePoint; board: BoardPoint | null }) {
  const { display } = useUnits();
  const value = display(board?.value ?? null, point.unit);
  const look = board?.alarmState ? alarmLook(board.alarmState, board.alarmPriority) : null;
  const lo = point.normalLow ?? null;
  const hi = point.normalHigh ?? null;
  const range =
    lo !== null && hi !== null
      ? `${display(lo, point.unit).text}–${display(hi, point.unit).label}`
      : hi !== null
        ? `≤ ${display(hi, point.unit).label}`
        : lo !== null
          ? `≥ ${display(lo, point.unit).label}`
          : null;
  // Marked on every board (closed runs too), whether or not an alarm is open: the value against its limits.
  const mark = limitMark(board?.value ?? null, point);
  const border = look && !look.shelved ? `var(--mantine-color-${look.color}-${look.variant === 'outline' ? 5 : 6})` : undefined;
  const trend = board?.trend ?? [];
  return (
    <Paper
      withBorder
      p="sm"
      radius="md"
      className={look?.shelved ? 'cj-shelved' : undefined}
      data-testid={`board-${point.code}`}
      data-alarm={board?.alarmState ?? 'none'}
      data-limit={mark ?? 'within'}
      style={
        border
          ? { borderColor: border, borderWidth: look?.variant === 'filled' ? 3 : 2 }
          : mark
            ? { borderColor: mark === 'high_high' ? 'var(--cj-signal)' : 'var(--cj-amber)', borderWidth: 2 }
            : undefined
      }
    >
      <Stack gap={4}>
        <Group justify="space-between" wrap="nowrap" gap="xs" align="flex-start">
          <Text fw={600} fz="sm" lineClamp={2}>
            {point.label}
          </Text>
          <Text fz="xs" c="dimmed" style={{ flexShrink: 0 }}>
            {point.code}
          </Text>
        </Group>
        <Group justify="space-between" wrap="nowrap" align="flex-end" gap="xs">
          <Group gap={6} align="baseline" wrap="nowrap">
            <Text
              className="cj-num"
              fz={40}
              fw={600}
              lh={1}
              c={mark ? (mark === 'high_high' ? 'var(--cj-signal)' : 'var(--cj-amber)') : undefined}
            >
              {value.text}
            </Text>
            <Text fz="md" c="dimmed">
              {value.unitLabel}
            </Text>
          </Group>
          {trend.length > 1 && (
            <Box w={96} style={{ flexShrink: 0 }} aria-label={`Trend of the last ${trend.length} values`} role="img">
              <Suspense fallback={<Box h={40} />}>
                <Sparkline
                  h={40}
                  data={trend.map((v) => display(v, point.unit).value)}
                  color={look && !look.shelved ? `${look.color}.6` : 'gray.6'}
                  withGradient={false}
                  fillOpacity={0.15}
                  strokeWidth={2}
                  curveType="linear"
                />
              </Suspense>
            </Box>
          )}
        </Group>
        <GaugeGlass value={board?.value ?? null} point={point} mark={mark} />
        {mark && (
          <Group gap={4} wrap="nowrap" data-testid={`limit-mark-${point.code}`}>
            {mark === 'high_high' ? (
              <IconAlertOctagon size={16} color="var(--cj-signal)" aria-hidden />
            ) : (
              <IconAlertTriangle size={16} color="var(--cj-amber)" aria-hidden />
            )}
            <Text fz="sm" fw={700} c={mark === 'high_high' ? 'var(--cj-signal)' : 'var(--cj-amber)'}>
              {LIMIT_MARK_WORDS[mark]}
              {mark !== 'low' && point.highLimit != null
                ? ` (${display(mark === 'high_high' ? (point.highHighLimit ?? point.highLimit) : point.highLimit, point.unit).label})`
                : mark === 'low' && point.lowLimit != null
                  ? ` (${display(point.lowLimit, point.unit).label})`
                  : ''}
            </Text>
          </Group>
        )}
        <Text fz="xs" c="dimmed">
          {range ? `Normal ${range}` : 'No normal range set'}
          {board?.takenAt ? ` · at ${dayjs(board.takenAt).format('HH:mm')}` : ' · no reading yet'}
        </Text>
        {board?.alarmState && board.alarmState !== 'normal' && (
          <AlarmStateBadge state={board.alarmState} priority={board.alarmPriority} short size="md" />
        )}
        {board?.forecast && <ForecastLine forecast={board.forecast} />}
      </Stack>
    </Paper>
  );
}

/**
 * Time to the next limit at the present trend ("High-high in about 7 min"); under the setting it is an advisory
 * pre-alarm (the lowest priority: no banner, no acknowledgement). The method and window are stated with it.
 */
export function ForecastLine({ forecast: f }: { forecast: LimitForecastDto }) {
  const minutes = Math.max(1, Math.round(f.minutesToLimit));
  return (
    <Stack gap={0} data-testid="forecast" data-pre-alarm={f.preAlarm}>
      <Text fz="sm" fw={f.preAlarm ? 700 : 500}>
        {f.preAlarm ? 'Pre-alarm (advisory): ' : ''}
        {ALARM_KIND_WORDS[f.limitKind]} in about {minutes} min at the present trend
      </Text>
      <Text fz="xs" c="dimmed">
        {f.method}
        {f.preAlarm ? '' : ` Pre-alarm under ${f.preAlarmMinutes} min.`}
      </Text>
    </Stack>
  );
}

/** The current value of every measurement point, grouped by job: steam and speed, bearings, oil, ambient. */
export function Board({ points, board }: { points: EnginePoint[]; board: BoardPoint[] }) {
  const groups = groupBoard(points, board);
  return (
    <Stack gap="lg">
      {groups.map((g) => (
        <Box key={g.key} component="section" aria-labelledby={`board-${g.key}`}>
          <Title order={2} fz="lg" mb="xs" id={`board-${g.key}`}>
            {g.title}
          </Title>
          <SimpleGrid cols={{ base: 1, xs: 2, md: 3, xl: 4 }} spacing="sm">
            {g.items.map((i) => (
              <BoardTile key={i.point.id} point={i.point} board={i.board} />
            ))}
          </SimpleGrid>
        </Box>
      ))}
    </Stack>
  );
}
