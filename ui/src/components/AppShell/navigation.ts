import type { ComponentType } from 'react';
import type { Role } from '@crankjournal/shared-types';
import { ROLES } from '@crankjournal/shared-types';
import { IconHome, IconUsers, IconUserCircle } from '@tabler/icons-react';

export interface NavItem {
  label: string;
  path: string;
  icon: ComponentType<{ size?: number | string; stroke?: number }>;
  roles: readonly Role[];
}
export interface NavGroup {
  label: string;
  items: NavItem[];
}

/** The navigation rail, grouped by job. An item shows only to the roles that may use it. */
export const NAVIGATION: NavGroup[] = [
  { label: 'Today', items: [{ label: 'Today', path: '/', icon: IconHome, roles: ROLES }] },
  {
    label: 'Administration',
    items: [{ label: 'People and roles', path: '/admin/users', icon: IconUsers, roles: ['administrator'] }],
  },
  { label: 'You', items: [{ label: 'Your account', path: '/account', icon: IconUserCircle, roles: ROLES }] },
];

export function navigationFor(role: Role): NavGroup[] {
  return NAVIGATION.map((g) => ({ ...g, items: g.items.filter((i) => i.roles.includes(role)) })).filter((g) => g.items.length > 0);
}
