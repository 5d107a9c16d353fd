import { HttpException, Injectable, type ExecutionContext } from '@nestjs/common';
import { ThrottlerGuard, type ThrottlerLimitDetail, type ThrottlerRequest } from '@nestjs/throttler';

interface SignInRequest {
  ip?: string;
  body?: { email?: unknown };
}
const emailOf = (req: SignInRequest) => (typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '');

/**
 * Limits sign-in attempts three ways (the throttlers named in app.module.ts): per address and e-mail, so one
 * person's typing cannot lock out the crew's tablet; per address across e-mails, against one password tried on
 * every account; per account across addresses, against one account tried from many. Each answers 429 with Retry-After.
 */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected override async handleRequest(r: ThrottlerRequest): Promise<boolean> {
    const tracker = (req: SignInRequest): string => {
      if (r.throttler.name === 'login-address') return `${req.ip}`;
      if (r.throttler.name === 'login-account') return emailOf(req);
      return `${req.ip}|${emailOf(req)}`;
    };
    return super.handleRequest({ ...r, getTracker: (req) => Promise.resolve(tracker(req as SignInRequest)) });
  }

  protected override async throwThrottlingException(context: ExecutionContext, detail: ThrottlerLimitDetail): Promise<void> {
    const seconds = Math.max(1, Math.ceil(detail.timeToBlockExpire));
    context.switchToHttp().getResponse<{ header(name: string, value: string): void }>().header('Retry-After', String(seconds));
    throw new HttpException(
      { statusCode: 429, error: 'Too Many Requests', message: `Too many sign-in attempts. Try again in ${seconds} seconds.` },
      429,
    );
  }
}
