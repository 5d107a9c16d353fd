import { MONEY_READERS, MONEY_ROOM, type Role, ROLES } from '@crankjournal/shared-types';

const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';

/** Which roles may join which rooms of the live channel. One table; a room not listed is refused. */
export const ROOM_RULES: { pattern: RegExp; roles: readonly Role[]; what: string }[] = [
  { pattern: /^site$/, roles: ROLES, what: 'site-wide notices' },
  { pattern: new RegExp(`^run:${UUID}$`), roles: ROLES, what: 'one run: readings, alarms, state, card sets' },
  { pattern: new RegExp(`^engine:${UUID}$`), roles: ROLES, what: 'one engine: its runs and alarms' },
  { pattern: /^administration$/, roles: ['administrator'], what: 'account changes' },
  { pattern: new RegExp(`^${MONEY_ROOM}$`), roles: MONEY_READERS, what: "customer lots' money" },
];

export function canJoinRoom(role: Role, room: string): { ok: true } | { ok: false; reason: string; status: 403 | 404 } {
  const rule = ROOM_RULES.find((r) => r.pattern.test(room));
  if (!rule) return { ok: false, reason: `There is no room called "${room.slice(0, 60)}".`, status: 404 };
  if (!rule.roles.includes(role)) return { ok: false, reason: `Your role may not join ${rule.what}.`, status: 403 };
  return { ok: true };
}
