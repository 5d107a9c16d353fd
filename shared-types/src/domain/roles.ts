/** The people who use Crankjournal. Stored as these strings. */
export const ROLES = ['administrator', 'chief_engineer', 'operator', 'maintenance_lead', 'mill_lead', 'observer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  administrator: 'Administrator',
  chief_engineer: 'Chief engineer',
  operator: 'Engine operator',
  maintenance_lead: 'Maintenance lead',
  mill_lead: 'Mill lead',
  observer: 'Observer',
};

/** Roles that may write anything at all; observers only read. */
export const WRITING_ROLES: readonly Role[] = ROLES.filter((r) => r !== 'observer');

/** Who sees money (quotes, payments); operators and the maintenance lead do not. */
export const MONEY_READERS: readonly Role[] = ['administrator', 'chief_engineer', 'mill_lead', 'observer'];
/** Who asks a customer for money. */
export const MONEY_ASKERS: readonly Role[] = ['administrator', 'mill_lead'];
