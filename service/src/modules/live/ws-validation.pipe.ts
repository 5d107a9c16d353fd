import { ValidationPipe } from '@nestjs/common';
import { WsException } from '@nestjs/websockets';
import type { ValidationError } from 'class-validator';

function flatten(errors: ValidationError[], prefix = ''): string[] {
  return errors.flatMap((e) => [
    ...Object.values(e.constraints ?? {}).map((m) => (prefix ? `${prefix}.${m}` : m)),
    ...flatten(e.children ?? [], prefix ? `${prefix}.${e.property}` : e.property),
  ]);
}

/** The same validation as the HTTP edge, answered on the socket as a `live:error` event. */
export const wsValidationPipe = new ValidationPipe({
  whitelist: true,
  forbidNonWhitelisted: true,
  transform: true,
  exceptionFactory: (errors) => new WsException(flatten(errors)),
});
