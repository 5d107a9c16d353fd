import { ValidationPipe, type ArgumentMetadata } from '@nestjs/common';
import { WsException } from '@nestjs/websockets';
import type { ValidationError } from 'class-validator';
import { hiddenKeyPath } from '../pipes/validation.pipe.js';

function flatten(errors: ValidationError[], prefix = ''): string[] {
  return errors.flatMap((e) => [
    ...Object.values(e.constraints ?? {}).map((m) => (prefix ? `${prefix}.${m}` : m)),
    ...flatten(e.children ?? [], prefix ? `${prefix}.${e.property}` : e.property),
  ]);
}

class StrictWsValidationPipe extends ValidationPipe {
  override async transform(value: unknown, metadata: ArgumentMetadata) {
    const hidden = hiddenKeyPath(value);
    if (hidden) throw new WsException([`property ${hidden} should not exist`]);
    return super.transform(value, metadata);
  }
}

/** The same validation as the HTTP edge, answered on the socket as a `live:error` event. */
export const wsValidationPipe = new StrictWsValidationPipe({
  whitelist: true,
  forbidNonWhitelisted: true,
  transform: true,
  exceptionFactory: (errors) => new WsException(flatten(errors)),
});
