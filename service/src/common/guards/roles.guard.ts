import { CanActivate, ExecutionContext, ForbiddenException, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { ROLE_LABELS, type Role } from '@crankjournal/shared-types';
import { IS_PUBLIC_KEY } from '../decorators/public.decorator.js';
import { ROLES_KEY } from '../decorators/roles.decorator.js';
import type { AuthUser } from '../decorators/current-user.decorator.js';

/** Global guard after the JWT guard: the route's @Roles() must include the caller's role. */
@Injectable()
export class RolesGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}
  canActivate(context: ExecutionContext): boolean {
    if (context.getType() !== 'http') return true;
    const isPublic = this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [context.getHandler(), context.getClass()]);
    if (isPublic) return true;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, [context.getHandler(), context.getClass()]);
    const user = context.switchToHttp().getRequest<{ user?: AuthUser }>().user;
    if (!roles || !user) throw new ForbiddenException('This action is not open to any role.');
    if (!roles.includes(user.role)) {
      throw new ForbiddenException(
        `Your role (${ROLE_LABELS[user.role]}) may not do this. Allowed: ${roles.map((r) => ROLE_LABELS[r]).join(', ')}.`,
      );
    }
    return true;
  }
}
