import type { ReactNode } from 'react';
import { Alert } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';

/** A caution that sits beside the work it concerns (never a pop-up). */
export function Caution({ title = 'Caution', children }: { title?: string; children: ReactNode }) {
  return (
    <Alert variant="outline" color="amber" icon={<IconAlertTriangle />} title={title} role="note">
      {children}
    </Alert>
  );
}

export const SAFETY_NOTE =
  'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, the ' +
  'insurer’s inspections or licensed practice.';
