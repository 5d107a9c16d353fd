import { Injectable } from '@nestjs/common';
import { ThrottlerGuard } from '@nestjs/throttler';

/** Limits sign-in attempts per address and e-mail, so one person's typing cannot lock out the crew's tablet. */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected async getTracker(req: { ip?: string; body?: { email?: unknown } }): Promise<string> {
    const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
    return `${req.ip}|${email}`;
  }
  protected async throwThrottlingException(): Promise<void> {
    const { HttpException } = await import('@nestjs/common');
    throw new HttpException(
      { statusCode: 429, error: 'Too Many Requests', message: 'Too many sign-in attempts. Wait a minute and try again.' },
      429,
    );
  }
}
