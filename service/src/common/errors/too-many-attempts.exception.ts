import { HttpException } from '@nestjs/common';

/** 429 with the seconds to wait, which the error filter sends as Retry-After. */
export class TooManyAttemptsException extends HttpException {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super({ statusCode: 429, error: 'Too Many Requests', message }, 429);
  }
}
