import type { ComponentType } from 'react';
import type { Role } from '@crankjournal/shared-types';

/** Panels on the Today screen, by role. Each feature area registers its own here. */
export interface TodayPanel {
  key: string;
  roles: readonly Role[];
  Component: ComponentType;
}
export const todayPanels: TodayPanel[] = [];
