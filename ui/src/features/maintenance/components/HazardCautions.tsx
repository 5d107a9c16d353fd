import { Stack, Text } from '@mantine/core';
import { WORK_HAZARD_CAUTIONS, WORK_HAZARD_LABELS, type WorkHazard } from '@crankjournal/shared-types';
import { Caution } from '../../../components/Caution/Caution';

/** A caution beside the work for each of its hazards (lockout first), deferring to local codes and licensed practice. */
export function HazardCautions({ hazards }: { hazards: readonly WorkHazard[] }) {
  if (!hazards.length) return null;
  const order: WorkHazard[] = ['lockout', 'jacking', 'raised_load', 'lifting', 'hot_work', 'confined_space'];
  return (
    <Stack gap="xs" data-testid="hazard-cautions">
      {order
        .filter((h) => hazards.includes(h))
        .map((h) => (
          <Caution key={h} title={WORK_HAZARD_LABELS[h]}>
            <Text fz="sm">{WORK_HAZARD_CAUTIONS[h]}</Text>
          </Caution>
        ))}
    </Stack>
  );
}
