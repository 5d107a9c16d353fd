import type { ComponentType } from 'react';
import { type Role, ROLES } from '@crankjournal/shared-types';
import { ShiftNow } from '../../runs/components/ShiftNow';
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

// The engine now, open alarms and what the next run needs before it may start: first, as the crew acts in that order.
todayPanels.push({ key: 'runs', roles: ROLES, Component: ShiftNow });

// The mill lead's day: runs to log passes on and the open customer lots.
todayPanels.push({ key: 'mill', roles: ['mill_lead', 'chief_engineer'], Component: MillToday });

// What is due or overrun, and bearings that drifted: the maintenance lead's and the chief engineer's start screen.
todayPanels.push({ key: 'maintenance', roles: ['maintenance_lead', 'chief_engineer'], Component: TodayMaintenance });

// Qualifications that have ended or end soon: everyone's own; the crew's for the chief engineer.
todayPanels.push({ key: 'qualifications', roles: ROLES, Component: TodayQualifications });
