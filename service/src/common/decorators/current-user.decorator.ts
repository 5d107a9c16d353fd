import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { Role } from '@crankjournal/shared-types';

/** What the JWT strategy puts on the request after checking the user is still active. */
export interface AuthUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  /** The person's session version: a token or socket of another version has ended. */
  sessionVersion: number;
}

export const CurrentUser = createParamDecorator((_: unknown, ctx: ExecutionContext): AuthUser => {
  const req = ctx.switchToHttp().getRequest<{ user: AuthUser }>();
  return req.user;
});
