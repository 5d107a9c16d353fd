import type { ComponentType, ReactNode } from 'react';
import { Group, Paper, Stack, Text } from '@mantine/core';
import { IconAlertTriangle, IconBolt, IconFlame, IconGauge, IconRotate360, IconShieldCheck } from '@tabler/icons-react';

type Icon = ComponentType<{ size?: number | string; stroke?: number; color?: string; 'aria-hidden'?: boolean }>;

export type Hazard = 'pressure' | 'heat' | 'moving' | 'electric' | 'safety' | 'general';

const HAZARD_ICONS: Record<Hazard, Icon> = {
  pressure: IconGauge,
  heat: IconFlame,
  moving: IconRotate360,
  electric: IconBolt,
  safety: IconShieldCheck,
  general: IconAlertTriangle,
};

/** The hazard a caution concerns, from its title when not given (pressure, heat, moving parts, …). */
export function hazardOf(title: string): Hazard {
  const t = title.toLowerCase();
  if (/pressure|steam|boiler|valve/.test(t)) return 'pressure';
  if (/hot|heat|burn|temperature|fire/.test(t)) return 'heat';
  if (/rotat|moving|turning|crank|flywheel|barring|roll/.test(t)) return 'moving';
  if (/electric|current|voltage/.test(t)) return 'electric';
  if (/safety/.test(t)) return 'safety';
  return 'general';
}

/**
 * A caution that sits beside the work it concerns (never a pop-up): a neutral panel with a brass rule and the
 * hazard's icon, so that amber stays for a live abnormal state.
 */
export function Caution({ title = 'Caution', hazard, children }: { title?: string; hazard?: Hazard; children: ReactNode }) {
  const HazardIcon = HAZARD_ICONS[hazard ?? hazardOf(title)];
  return (
    <Paper className="cj-caution" p="md" role="note" aria-label={title} data-hazard={hazard ?? hazardOf(title)}>
      <Group gap="sm" wrap="nowrap" align="flex-start">
        <HazardIcon size={24} stroke={1.7} color="var(--cj-brass)" aria-hidden />
        <Stack gap={4}>
          <Text fw={700}>{title}</Text>
          <div>{children}</div>
        </Stack>
      </Group>
    </Paper>
  );
}

export const SAFETY_NOTE =
  'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, the ' +
  'insurer’s inspections or licensed practice.';
