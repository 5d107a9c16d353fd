import { randomUUID } from 'node:crypto';
import { Injectable, UnauthorizedException, BadRequestException } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectRepository } from '@nestjs/typeorm';
import { IsNull, Repository } from 'typeorm';
import type { SessionUser, TokenPair } from '@crankjournal/shared-types';
import { AppConfig } from '../../config/app-config.service.js';
import { UsersService, type UserRecord, type UserWithSecrets } from '../users/users.service.js';
import { hashPassword, newSecret, sha256, verifyPassword } from '../../common/util/password.util.js';
import { RefreshToken } from './refresh-token.entity.js';
import { SecretAttemptsService } from './secret-attempts.service.js';

const BAD_SIGN_IN = 'The e-mail or password is not right.';

/** A sign-in as issued: the answer's body, and the refresh token for the cookie with the family's absolute end. */
export interface Issued {
  pair: TokenPair;
  refresh: { token: string; expiresAt: Date };
}

@Injectable()
export class AuthService {
  constructor(
    private readonly users: UsersService,
    private readonly jwt: JwtService,
    private readonly config: AppConfig,
    @InjectRepository(RefreshToken) private readonly refreshTokens: Repository<RefreshToken>,
    private readonly attempts: SecretAttemptsService,
  ) {}

  async login(email: string, password: string): Promise<Issued> {
    const user = await this.users.findByEmailWithSecrets(email);
    // Verify even for unknown users so timing does not reveal who has an account.
    const ok = await verifyPassword(user?.passwordHash ?? DUMMY_HASH, password);
    // A deactivated account gets the same answer whether the password was right or not: the answer confirms nothing.
    if (!user || !ok || !user.passwordHash || !user.active) throw new UnauthorizedException(BAD_SIGN_IN);
    return this.issue(user, randomUUID());
  }

  async refresh(token: string | undefined): Promise<Issued> {
    // Nothing to refresh with (a missing input, like a missing field): 400, kept apart from a token that is refused.
    if (!token) throw new BadRequestException('No sign-in to refresh: the request carries no refresh cookie. Please sign in.');
    const [id] = token.split('.');
    const row = /^[0-9a-f-]{36}$/.test(id ?? '') ? await this.refreshTokens.findOne({ where: { id } }) : null;
    if (!row || row.tokenHash !== sha256(token)) throw new UnauthorizedException('Please sign in again.');
    if (row.revokedAt) {
      // A used token presented again: someone may hold a copy. End the whole family.
      await this.refreshTokens.update({ familyId: row.familyId, revokedAt: IsNull() }, { revokedAt: new Date() });
      throw new UnauthorizedException('This sign-in has ended. Please sign in again.');
    }
    if (row.expiresAt.getTime() < Date.now()) throw new UnauthorizedException('Your sign-in has expired. Please sign in again.');
    const claimed = await this.refreshTokens.update({ id: row.id, revokedAt: IsNull() }, { revokedAt: new Date() });
    if (!claimed.affected) throw new UnauthorizedException('This sign-in has ended. Please sign in again.');
    const user = await this.users.findByIdWithSecrets(row.userId);
    if (!user || !user.active) throw new UnauthorizedException('This account has been deactivated. Ask an administrator.');
    // The family keeps the end of its first sign-in: rotation never stretches a sign-in beyond REFRESH_TOKEN_TTL_DAYS.
    return this.issue(user, row.familyId, row.expiresAt);
  }

  async logout(token: string | undefined, userId: string): Promise<void> {
    if (token) {
      const [id] = token.split('.');
      if (/^[0-9a-f-]{36}$/.test(id ?? '')) {
        const row = await this.refreshTokens.findOne({ where: { id, userId } });
        if (row) await this.refreshTokens.update({ familyId: row.familyId, revokedAt: IsNull() }, { revokedAt: new Date() });
      }
    }
  }

  /** The person's current password, re-entered: refused while locked; a wrong one counts towards the lock. */
  private async assertCurrentPassword(userId: string, current: string, what: string): Promise<void> {
    this.attempts.assertNotLocked(userId);
    const user = await this.users.findByIdWithSecrets(userId);
    if (user && (await verifyPassword(user.passwordHash, current))) return;
    await this.attempts.failed(userId, what);
    throw new BadRequestException('Your current password is not right.');
  }

  async changePassword(userId: string, current: string, next: string): Promise<void> {
    await this.assertCurrentPassword(userId, current, 'a password change');
    await this.users.setPasswordHash(userId, await hashPassword(next));
    // End every sign-in of this person, this one included: access tokens, refresh tokens and live connections.
    await this.endEverySession(userId);
  }

  /** Sign-out everywhere: every refresh token revoked, the session version raised (access tokens and sockets end at once). */
  async endEverySession(userId: string): Promise<void> {
    await this.refreshTokens.update({ userId, revokedAt: IsNull() }, { revokedAt: new Date() });
    await this.users.endSessions(userId);
  }

  async setPin(userId: string, current: string, pin: string): Promise<void> {
    await this.assertCurrentPassword(userId, current, 'setting a signing PIN');
    await this.users.setPinHash(userId, await hashPassword(pin));
  }

  /**
   * Re-authentication when signing a record: the person's password or signing PIN. A wrong one counts towards the
   * lock; while locked this answers 429 (TooManyAttemptsException) whatever is given.
   */
  async verifySigner(userId: string, secret: string): Promise<boolean> {
    this.attempts.assertNotLocked(userId);
    const user = await this.users.findByIdWithSecrets(userId);
    if (!user || !user.active) return false;
    if ((await verifyPassword(user.passwordHash, secret)) || (await verifyPassword(user.pinHash, secret))) return true;
    await this.attempts.failed(userId, 'signing');
    return false;
  }

  async acceptInvitation(token: string, password: string): Promise<Issued> {
    const user = await this.users.consumeInvitation(token);
    await this.users.setPasswordHash(user.id, await hashPassword(password));
    const fresh = await this.users.findByIdWithSecrets(user.id);
    return this.issue(fresh!, randomUUID());
  }

  sessionUser(u: UserRecord): SessionUser {
    return { id: u.id, email: u.email, displayName: u.displayName, role: u.role, unitSystem: u.unitSystem };
  }

  private async issue(user: UserWithSecrets, familyId: string, familyEnds?: Date): Promise<Issued> {
    const ttl = this.config.get('ACCESS_TOKEN_TTL_SECONDS');
    const accessToken = await this.jwt.signAsync({ sub: user.id, role: user.role, sv: user.sessionVersion }, { expiresIn: ttl });
    const id = randomUUID();
    const { secret } = newSecret();
    const refreshToken = `${id}.${secret}`;
    const expiresAt = familyEnds ?? new Date(Date.now() + this.config.get('REFRESH_TOKEN_TTL_DAYS') * 86400_000);
    await this.refreshTokens.insert({
      id,
      userId: user.id,
      familyId,
      tokenHash: sha256(refreshToken),
      expiresAt,
      revokedAt: null,
    });
    return {
      pair: { accessToken, accessExpiresInSeconds: ttl, user: this.sessionUser(user) },
      refresh: { token: refreshToken, expiresAt },
    };
  }
}

/** A valid argon2id hash of a random string, verified against when the user is unknown. */
const DUMMY_HASH = '$argon2id$v=19$m=19456,t=2,p=1$JfobwwZyQK5/ITBd3F1sjA$vDLyyBzF343uo3qWWczR0eQh+l6ueAelDM0S+d8VoF0';
