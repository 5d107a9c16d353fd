import { useSyncExternalStore } from 'react';
import type { Role } from '@crankjournal/shared-types';
import { sessionStore } from '../../api/session';

export function useSession() {
  return useSyncExternalStore(sessionStore.subscribe, sessionStore.get, sessionStore.get);
}

/** True when the signed-in person's role is one of `roles`. */
export function useHasRole(...roles: Role[]): boolean {
  const s = useSession();
  return !!s && roles.includes(s.user.role);
}
