import { BadRequestException, ValidationPipe, type ArgumentMetadata } from '@nestjs/common';
import type { ValidationError } from 'class-validator';

/**
 * Keys class-transformer drops without a word (its guard against prototype pollution), so the whitelist
 * never sees them. Refused here like any other unknown field. Returns the path of the first one, or null.
 */
export function hiddenKeyPath(value: unknown, prefix = '', depth = 0): string | null {
  if (depth > 64 || value === null || typeof value !== 'object') return null;
  // Only what JSON.parse makes (plain objects and arrays); never a socket, request or class instance.
  const proto = Object.getPrototypeOf(value);
  if (proto !== Object.prototype && proto !== null && !Array.isArray(value)) return null;
  for (const key of Object.keys(value)) {
    const path = prefix ? `${prefix}.${key}` : key;
    if (key === '__proto__' || key === 'constructor') return path;
    const inner = hiddenKeyPath((value as Record<string, unknown>)[key], path, depth + 1);
    if (inner) return inner;
  }
  return null;
}

/** Flattens nested errors into "cylinders.0.boreIn must be a positive number" style sentences. */
export function flattenValidationErrors(errors: ValidationError[], prefix = ''): string[] {
  return errors.flatMap((e) => {
    const path = prefix ? `${prefix}.${e.property}` : e.property;
    const own = Object.values(e.constraints ?? {}).map((m) => (m.startsWith(e.property) && prefix ? `${prefix}.${m}` : m));
    return [...own, ...flattenValidationErrors(e.children ?? [], path)];
  });
}

class StrictValidationPipe extends ValidationPipe {
  override async transform(value: unknown, metadata: ArgumentMetadata) {
    const hidden = ['body', 'query', 'param'].includes(metadata.type) ? hiddenKeyPath(value) : null;
    if (hidden) throw new BadRequestException({ statusCode: 400, error: 'Bad Request', message: [`property ${hidden} should not exist`] });
    return super.transform(value, metadata);
  }
}

/** The global edge: unknown fields refused, types converted, every message readable. */
export const validationPipe = new StrictValidationPipe({
  whitelist: true,
  forbidNonWhitelisted: true,
  transform: true,
  transformOptions: { enableImplicitConversion: false },
  stopAtFirstError: false,
  exceptionFactory: (errors) =>
    new BadRequestException({ statusCode: 400, error: 'Bad Request', message: flattenValidationErrors(errors) }),
});
