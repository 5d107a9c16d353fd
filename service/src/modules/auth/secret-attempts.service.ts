import { Inject, Injectable, Logger } from '@nestjs/common';
import { ThrottlerStorage } from '@nestjs/throttler';
import { AppConfig } from '../../config/app-config.service.js';
import { TooManyAttemptsException } from '../../common/errors/too-many-attempts.exception.js';

/**
 * Wrong passwords and PINs given by a signed-in person (re-entering the password to change it or to set a PIN,
 * signing a checklist or a countersignature), counted per person in the sign-in limiter's store: after
 * SECRET_ATTEMPT_LIMIT wrong ones within SECRET_LOCK_MINUTES, all three are refused with 429 and Retry-After for
 * SECRET_LOCK_MINUTES, the right secret included. Every wrong attempt is written to the log.
 */
@Injectable()
export class SecretAttemptsService {
  private readonly logger = new Logger('SecretAttempts');
  /** Per person: when the lock the store reported ends (ms since the epoch). */
  private readonly lockedUntil = new Map<string, number>();

  constructor(
    @Inject(ThrottlerStorage) private readonly store: ThrottlerStorage,
    private readonly config: AppConfig,
  ) {}

  /** Refuses with 429 while the person's password and PIN are locked. */
  assertNotLocked(userId: string): void {
    const until = this.lockedUntil.get(userId);
    if (until === undefined) return;
    const seconds = Math.ceil((until - Date.now()) / 1000);
    if (seconds <= 0) {
      this.lockedUntil.delete(userId);
      return;
    }
    throw new TooManyAttemptsException(
      `Too many wrong passwords or PINs. Signing and password changes are locked; try again in ${seconds} seconds.`,
      seconds,
    );
  }

  /** Records a wrong password or PIN; the one that reaches the limit locks them. */
  async failed(userId: string, what: string): Promise<void> {
    const minutes = this.config.get('SECRET_LOCK_MINUTES');
    const r = await this.store.increment(
      `secret:${userId}`,
      minutes * 60_000,
      this.config.get('SECRET_ATTEMPT_LIMIT'),
      minutes * 60_000,
      'secret',
    );
    this.logger.warn(`wrong password or PIN for ${what} by user ${userId} (${r.totalHits} within ${minutes} min)`);
    if (r.isBlocked || r.totalHits >= this.config.get('SECRET_ATTEMPT_LIMIT'))
      this.lockedUntil.set(userId, Date.now() + Math.max(r.timeToBlockExpire, minutes * 60) * 1000);
  }
}
