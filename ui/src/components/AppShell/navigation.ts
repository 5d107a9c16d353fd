import type { ComponentType } from 'react';
import {
  IconHome,
  IconUsers,
  IconUserCircle,
  IconEngine,
  IconPlugConnected,
  IconTimeline,
  IconCertificate,
  IconChecklist,
  IconCalendarDue,
  IconCircleDot,
  IconClipboardCheck,
  IconDroplet,
  IconTool,
  IconBuildingFactory2,
  IconClipboardList,
  IconTimeline as IconRollingLog,
  IconTruckDelivery,
  IconQrcode,
  IconCashBanknote,
} from '@tabler/icons-react';
import { ROLES, type Role } from '@crankjournal/shared-types';
import { CALCULATORS } from '../../features/calculators/calculators';

export interface NavItem {
  label: string;
  path: string;
  icon: ComponentType<{ size?: number | string; stroke?: number }>;
  roles: readonly Role[];
  /** The rail's label under the icon (a word or two); the full label is the link's accessible name. */
  short?: string;
}
export interface NavGroup {
  label: string;
  items: NavItem[];
}

/** The navigation rail, grouped by job. An item shows only to the roles that may use it. */
export const NAVIGATION: NavGroup[] = [
  { label: 'Today', items: [{ label: 'Today', path: '/', icon: IconHome, roles: ROLES }] },
  { label: 'Runs', items: [{ label: 'Runs', path: '/runs', icon: IconTimeline, roles: ROLES }] },
  { label: 'Engines', items: [{ label: 'Engines', path: '/engines', icon: IconEngine, roles: ROLES }] },
  {
    label: 'Administration',
    items: [{ label: 'People and roles', path: '/admin/users', icon: IconUsers, roles: ['administrator'] }],
  },
  { label: 'You', items: [{ label: 'Your account', path: '/account', icon: IconUserCircle, roles: ROLES }] },
];

// Data loggers sit with the other administration screens.
NAVIGATION.find((g) => g.label === 'Administration')?.items.push({
  label: 'Data loggers',
  path: '/admin/loggers',
  icon: IconPlugConnected,
  roles: ['administrator'],
});

// The works' own settings (name, time zone of printed records) sit there too.
NAVIGATION.find((g) => g.label === 'Administration')?.items.push({
  label: 'Works settings',
  path: '/admin/site',
  icon: IconBuildingFactory2,
  roles: ['administrator'],
});

// Visitor boards (the public window on a run) sit with the runs; the chief engineer manages them.
NAVIGATION.find((g) => g.label === 'Runs')?.items.push({
  label: 'Visitor boards',
  path: '/visitor-boards',
  icon: IconQrcode,
  roles: ['chief_engineer'],
  short: 'Visitors',
});

// Checklist templates and crew qualifications sit with the engines they belong to.
NAVIGATION.find((g) => g.label === 'Engines')?.items.push(
  { label: 'Checklists', path: '/checklists', icon: IconChecklist, roles: ROLES },
  { label: 'Qualifications', path: '/qualifications', icon: IconCertificate, roles: ROLES },
);

// Calculators: one item per entry of the registry (features/calculators/calculators.ts), just before Administration.
NAVIGATION.splice(
  Math.max(
    0,
    NAVIGATION.findIndex((g) => g.label === 'Administration'),
  ),
  0,
  { label: 'Calculators', items: CALCULATORS.map((c) => ({ label: c.title, path: c.path, icon: c.icon, roles: c.roles })) },
);

// The mill: after the engines and maintenance, before the calculators.
NAVIGATION.splice(
  (() => {
    const at = NAVIGATION.findIndex((g) => g.label === 'Calculators' || g.label === 'Administration');
    return at < 0 ? NAVIGATION.length : at;
  })(),
  0,
  {
    label: 'Mill',
    items: [
      { label: 'Mill', path: '/mill', icon: IconBuildingFactory2, roles: ROLES },
      { label: 'Pass schedules', path: '/mill/schedules', icon: IconClipboardList, roles: ROLES },
      { label: 'Rolling log', path: '/mill/rolling', icon: IconRollingLog, roles: ROLES },
      { label: 'Customer lots', path: '/mill/lots', icon: IconTruckDelivery, roles: ROLES },
      // GET /api/payments/outstanding is the administrator's.
      { label: 'Money outstanding', path: '/payments/outstanding', icon: IconCashBanknote, roles: ['administrator'] },
    ],
  },
);

// Maintenance: bearings, what is due, inspections, work and lubrication, just after the engines.
NAVIGATION.splice(
  (() => {
    const at = NAVIGATION.findIndex((g) => g.label === 'Engines');
    return at < 0 ? NAVIGATION.length : at + 1;
  })(),
  0,
  {
    label: 'Maintenance',
    items: [
      { label: 'Due and plans', path: '/maintenance/due', icon: IconCalendarDue, roles: ROLES },
      { label: 'Bearings', path: '/maintenance/bearings', icon: IconCircleDot, roles: ROLES },
      { label: 'Inspections', path: '/maintenance/inspections', icon: IconClipboardCheck, roles: ROLES },
      { label: 'Work records', path: '/maintenance/work', icon: IconTool, roles: ROLES },
      { label: 'Lubrication', path: '/lubrication', icon: IconDroplet, roles: ROLES },
    ],
  },
);

/** Short rail labels by path; items not listed show their own label. */
const SHORT: Record<string, string> = {
  '/maintenance/due': 'Due',
  '/maintenance/inspections': 'Inspect',
  '/maintenance/work': 'Work',
  '/lubrication': 'Lube',
  '/qualifications': 'Quals',
  '/mill/schedules': 'Passes',
  '/mill/rolling': 'Rolling',
  '/mill/lots': 'Lots',
  '/payments/outstanding': 'Owed',
  '/admin/users': 'People',
  '/admin/loggers': 'Loggers',
  '/admin/site': 'Works',
  '/account': 'You',
  '/calculators/indicated-power': 'Power',
  '/calculators/rolling-pass': 'Pass',
  '/calculators/oil-viscosity': 'Oil',
  '/calculators/journal-friction': 'Friction',
  '/calculators/lift-and-jacks': 'Pre-lube',
};

export function shortLabel(item: NavItem): string {
  return item.short ?? SHORT[item.path] ?? item.label;
}

export function navigationFor(role: Role): NavGroup[] {
  return NAVIGATION.map((g) => ({ ...g, items: g.items.filter((i) => i.roles.includes(role)) })).filter((g) => g.items.length > 0);
}
