import { JwtService } from '@nestjs/jwt';
import type { DataSource } from 'typeorm';
import { ROLES, type Role } from '@crankjournal/shared-types';
import { createUser, type CreatedUser } from '../../factories/users.factory.js';

export interface RoleSession {
  user: CreatedUser;
  token: string;
}

/** The JWT secret the service under test signs with (ops/test.sh and the test-app defaults set it). */
const secret = () => {
  const s = process.env.JWT_SECRET;
  if (!s) throw new Error('JWT_SECRET is not set');
  return s;
};

/**
 * An access token signed the way the service signs them (HS256, sub + role). Minted here rather than
 * through the sign-in route, which is rate-limited and slow on purpose.
 */
export function accessToken(userId: string, role: Role, expiresInSeconds = 3600): Promise<string> {
  return new JwtService({ secret: secret(), signOptions: { algorithm: 'HS256' } }).signAsync(
    { sub: userId, role },
    { expiresIn: expiresInSeconds },
  );
}

/** A token that was valid once and expired a minute ago (exp in the past, signature good). */
export function expiredToken(userId: string, role: Role): Promise<string> {
  const now = Math.floor(Date.now() / 1000);
  return new JwtService({ secret: secret(), signOptions: { algorithm: 'HS256' } }).signAsync({
    sub: userId,
    role,
    iat: now - 3600,
    exp: now - 60,
  });
}

/** One fresh user of every role, each with an access token. */
export async function sessionsForEveryRole(db: DataSource): Promise<Record<Role, RoleSession>> {
  const out = {} as Record<Role, RoleSession>;
  for (const role of ROLES) {
    const user = await createUser(db, { role });
    out[role] = { user, token: await accessToken(user.id, role) };
  }
  return out;
}
