import { HttpException, Injectable, type CanActivate, type ExecutionContext } from '@nestjs/common';
import { InjectThrottlerStorage, type ThrottlerStorage } from '@nestjs/throttler';
import { AppConfig } from '../../config/app-config.service.js';

const WINDOW_MS = 60_000;

/**
 * The public visitor routes' own limit (VISIT_RATE_LIMIT_PER_MINUTE per address), kept in the throttler's storage
 * under a name of its own so that it never adds to, or takes from, the sign-in limits. Answers 429 with Retry-After.
 */
@Injectable()
export class VisitRateLimit {
  constructor(
    @InjectThrottlerStorage() private readonly storage: ThrottlerStorage,
    private readonly config: AppConfig,
  ) {}

  /** Counts one request or connection from `address`; the seconds to wait when over the limit, else 0. */
  async take(address: string | undefined): Promise<number> {
    const limit = this.config.get('VISIT_RATE_LIMIT_PER_MINUTE');
    const r = await this.storage.increment(`visit|${address ?? 'unknown'}`, WINDOW_MS, limit, 0, 'visit');
    return r.isBlocked ? Math.max(1, Math.ceil(r.timeToBlockExpire)) : 0;
  }
}

@Injectable()
export class VisitRateLimitGuard implements CanActivate {
  constructor(private readonly limit: VisitRateLimit) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const http = context.switchToHttp();
    const wait = await this.limit.take(http.getRequest<{ ip?: string }>().ip);
    if (!wait) return true;
    http.getResponse<{ header(name: string, value: string): void }>().header('Retry-After', String(wait));
    throw new HttpException(
      { statusCode: 429, error: 'Too Many Requests', message: `Too many requests from your network. Try again in ${wait} seconds.` },
      429,
    );
  }
}
