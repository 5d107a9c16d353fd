import { ArgumentsHost, Catch, ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import type { Request, Response } from 'express';
import { QueryFailedError } from 'typeorm';
import type { ApiError } from '@crankjournal/shared-types';
import { TooManyAttemptsException } from '../errors/too-many-attempts.exception.js';

/** Postgres errors caused by the request's data, answered as 4xx rather than 500. */
const PG_CLIENT_ERRORS: Record<string, [number, string]> = {
  '22P02': [400, 'A value has the wrong form (for example an id that is not a UUID).'],
  '22003': [400, 'A number is out of the range that can be stored.'],
  '22001': [400, 'A text value is too long.'],
  '22007': [400, 'A date or time is not valid.'],
  '22008': [400, 'A date or time is out of range.'],
  '23505': [409, 'That already exists.'],
  '23503': [400, 'A referenced record does not exist.'],
};

/** One shape for every error; stack traces stay in the log, never in the answer. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');
  catch(exception: unknown, host: ArgumentsHost): void {
    if (host.getType() !== 'http') return;
    const ctx = host.switchToHttp();
    const res = ctx.getResponse<Response>();
    const req = ctx.getRequest<Request>();
    let body: ApiError;
    if (exception instanceof TooManyAttemptsException) res.header('Retry-After', String(exception.retryAfterSeconds));
    if (exception instanceof HttpException) {
      const status = exception.getStatus();
      const r = exception.getResponse();
      if (typeof r === 'string') body = { statusCode: status, error: exception.name, message: r };
      else {
        const o = r as Record<string, unknown>;
        body = {
          statusCode: status,
          error: (o.error as string) ?? exception.name,
          message: (o.message as string | string[]) ?? exception.message,
          ...(o.details !== undefined ? { details: o.details } : {}),
        };
      }
    } else if (exception instanceof QueryFailedError && PG_CLIENT_ERRORS[(exception as unknown as { code: string }).code]) {
      const [status, message] = PG_CLIENT_ERRORS[(exception as unknown as { code: string }).code];
      body = { statusCode: status, error: status === 409 ? 'Conflict' : 'Bad Request', message };
    } else if (isBodyParserError(exception)) {
      body = {
        statusCode: exception.status,
        error: 'Bad Request',
        message: exception.status === 413 ? 'The request is too large.' : 'The request body is not valid JSON.',
      };
    } else {
      this.logger.error(`${req.method} ${req.url} failed`, exception instanceof Error ? exception.stack : String(exception));
      body = {
        statusCode: HttpStatus.INTERNAL_SERVER_ERROR,
        error: 'Internal Server Error',
        message: 'Something went wrong on the server. It has been logged.',
      };
    }
    res.status(body.statusCode).json(body);
  }
}

function isBodyParserError(e: unknown): e is { status: number; type: string } {
  return (
    typeof e === 'object' &&
    e !== null &&
    typeof (e as { status?: unknown }).status === 'number' &&
    typeof (e as { type?: unknown }).type === 'string'
  );
}
