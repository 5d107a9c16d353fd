import { Badge, Group, Paper, Stack, Text } from '@mantine/core';
import { IconGauge, IconTimeline } from '@tabler/icons-react';
import { ALARM_KIND_WORDS, UNIT_LABELS, type MillTimelineItem } from '@crankjournal/shared-types';
import { AlarmStateBadge } from '../../alarms/components/alarm-look';
import { fmt, sectionText } from '../model/format';
import { PassWarnings } from './PassWarnings';

const clock = (iso: string) => new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });

/** Passes, rounds of readings and alarms of one run, in time order. */
export function Timeline({ items }: { items: MillTimelineItem[] }) {
  if (!items.length)
    return (
      <Text c="dimmed" py="md">
        Nothing on this run yet.
      </Text>
    );
  return (
    <Stack gap={6} component="ol" style={{ listStyle: 'none', padding: 0, margin: 0 }} aria-label="Timeline of the run">
      {items.map((i, k) => (
        <Paper component="li" key={`${i.kind}-${k}`} withBorder={i.kind !== 'round'} p="xs" radius="sm" data-kind={i.kind}>
          <Group gap="md" wrap="nowrap" align="flex-start">
            <Text className="cj-num" fz="sm" c="dimmed" w={86} style={{ flexShrink: 0 }}>
              {clock(i.at)}
            </Text>
            {i.kind === 'pass' && (
              <Stack gap={4} style={{ flex: 1 }}>
                <Group gap="xs" wrap="wrap">
                  <IconTimeline size={18} aria-hidden />
                  <Text fw={600}>
                    {i.pass.barCode} pass {i.pass.passNumber}
                  </Text>
                  <Text fz="sm">
                    {i.pass.standName}: {sectionText(i.pass.entry)} → {sectionText(i.pass.exit)} at {fmt(i.pass.measuredTemperatureC, 0)} °C
                  </Text>
                  <Text className="cj-num" fz="sm" c="dimmed">
                    {fmt(i.pass.calc.forceKn, 0)} kN · {fmt(i.pass.calc.powerRollPairKw, 0)} kW
                    {i.pass.calc.flywheel
                      ? ` · ${fmt(i.pass.calc.flywheel.startSpeedRpm, 1)} → ${fmt(i.pass.calc.flywheel.endSpeedRpm, 1)} rpm`
                      : ''}
                  </Text>
                </Group>
                {i.pass.calc.warnings.length > 0 && (
                  <Group gap={4}>
                    <PassWarnings warnings={i.pass.calc.warnings} compact />
                  </Group>
                )}
              </Stack>
            )}
            {i.kind === 'round' && (
              <Group gap="xs" wrap="wrap" style={{ flex: 1 }}>
                <IconGauge size={18} aria-hidden />
                <Text fz="sm" c="dimmed">
                  Readings:
                </Text>
                {i.readings.map((r) => (
                  <Text key={r.pointId} fz="sm" className="cj-num" title={r.label}>
                    {r.code} {fmt(r.value, 1)} {UNIT_LABELS[r.unit] ?? r.unit}
                  </Text>
                ))}
              </Group>
            )}
            {i.kind === 'alarm' && (
              <Group gap="xs" wrap="wrap" style={{ flex: 1 }}>
                {i.alarm.state === 'normal' ? (
                  <Badge color="gray" variant="outline">
                    {ALARM_KIND_WORDS[i.alarm.kind]} (cleared)
                  </Badge>
                ) : (
                  <AlarmStateBadge state={i.alarm.state} priority={i.alarm.priority} size="md" />
                )}
                <Text fz="sm">
                  {ALARM_KIND_WORDS[i.alarm.kind]}: {i.alarm.message}
                </Text>
              </Group>
            )}
          </Group>
        </Paper>
      ))}
    </Stack>
  );
}
