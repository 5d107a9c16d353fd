import type { ComponentType } from 'react';
import { type Role, ROLES } from '@crankjournal/shared-types';
import { TodayRuns } from '../../runs/components/TodayRuns';
import { TodayQualifications } from '../../qualifications/components/TodayQualifications';
import { MillToday } from '../../mill/components/MillToday';
import { TodayMaintenance } from '../../maintenance/components/TodayMaintenance';

/** Panels on the Today screen, by role. Each feature area registers its own here. */
export interface TodayPanel {
  key: string;
  roles: readonly Role[];
  Component: ComponentType;
}
export const todayPanels: TodayPanel[] = [];

// Runs now and next: everyone sees what the engine is doing today.
todayPanels.push({ key: 'runs', roles: ROLES, Component: TodayRuns });

// The mill lead's day: runs to log passes on and the open customer lots.
todayPanels.push({ key: 'mill', roles: ['mill_lead', 'chief_engineer'], Component: MillToday });

// Qualifications that have ended or end soon: everyone's own; the crew's for the chief engineer.
todayPanels.push({ key: 'qualifications', roles: ROLES, Component: TodayQualifications });

// What is due or overdue, and bearings that drifted: the maintenance lead's and the chief engineer's start screen.
todayPanels.push({ key: 'maintenance', roles: ['maintenance_lead', 'chief_engineer'], Component: TodayMaintenance });
