import { SetMetadata } from '@nestjs/common';
import { ROLES, type Role } from '@crankjournal/shared-types';

export const ROLES_KEY = 'crankjournal:roles';
/** Who may call a route. A guarded route without this decorator is refused to everyone. */
export const Roles = (...roles: Role[]) => SetMetadata(ROLES_KEY, roles);
/** Every signed-in person, observers included (read-only routes). */
export const AnyRole = () => SetMetadata(ROLES_KEY, [...ROLES]);
