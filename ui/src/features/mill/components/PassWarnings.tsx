import { Alert, Badge, Group, Stack, Text } from '@mantine/core';
import { IconAlertOctagon, IconAlertTriangle, IconInfoCircle } from '@tabler/icons-react';
import type { FlowStressDto, PassWarningCode, PassWarningDto } from '@crankjournal/shared-types';

/** The warning's short name, so that shape and words carry it as well as colour. */
export const PASS_WARNING_TITLES: Record<PassWarningCode, string> = {
  bite: 'The rolls will not bite',
  stand_force: 'Stand overloaded',
  speed_drop: 'Flywheel speed drop',
  stall: 'Engine would stall',
  no_surplus_power: 'No power to spare',
};
const DANGER: PassWarningCode[] = ['stand_force', 'speed_drop', 'stall'];

/** The warnings of a pass, each beside the pass it concerns. */
export function PassWarnings({ warnings, compact = false }: { warnings: PassWarningDto[]; compact?: boolean }) {
  if (!warnings.length) return null;
  if (compact)
    return (
      <Stack gap={4}>
        {warnings.map((w) => (
          <Badge
            key={w.code}
            color={DANGER.includes(w.code) ? 'signal' : 'amber'}
            variant="filled"
            size="md"
            leftSection={DANGER.includes(w.code) ? <IconAlertOctagon size={14} /> : <IconAlertTriangle size={14} />}
            title={w.message}
            data-testid={`pass-warning-${w.code}`}
            styles={{ root: { minWidth: 'max-content', overflow: 'visible' }, label: { overflow: 'visible' } }}
          >
            {PASS_WARNING_TITLES[w.code]}
          </Badge>
        ))}
      </Stack>
    );
  return (
    <Stack gap="xs">
      {warnings.map((w) => (
        <Alert
          key={w.code}
          color={DANGER.includes(w.code) ? 'signal' : 'amber'}
          variant="light"
          icon={DANGER.includes(w.code) ? <IconAlertOctagon /> : <IconAlertTriangle />}
          title={PASS_WARNING_TITLES[w.code]}
          role="alert"
          data-testid={`pass-warning-${w.code}`}
        >
          {w.message}
        </Alert>
      ))}
    </Stack>
  );
}

/** "Extrapolated": the hot flow stress equation was used outside the range it was fitted over. */
export function ExtrapolatedBadge({ flowStress }: { flowStress: FlowStressDto }) {
  if (!flowStress.extrapolated) return null;
  return (
    <Group
      component="span"
      gap={3}
      wrap="nowrap"
      display="inline-flex"
      title={flowStress.outOfRange.join('; ')}
      data-testid="flow-stress-extrapolated"
    >
      <IconInfoCircle size={14} aria-hidden />
      <Text component="span" fz="xs" c="dimmed">
        extrapolated
      </Text>
    </Group>
  );
}

/** The flow stress model named, with what is out of its range, in words. */
export function FlowStressNote({ flowStress }: { flowStress: FlowStressDto }) {
  return (
    <Text fz="sm" c="dimmed">
      {flowStress.citation}
      {flowStress.extrapolated && ` Outside that range here (${flowStress.outOfRange.join('; ')}): the figure is an extrapolation.`}
    </Text>
  );
}
