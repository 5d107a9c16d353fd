import { BadRequestException, ValidationPipe } from '@nestjs/common';
import type { ValidationError } from 'class-validator';

/** Flattens nested errors into "cylinders.0.boreIn must be a positive number" style sentences. */
export function flattenValidationErrors(errors: ValidationError[], prefix = ''): string[] {
  return errors.flatMap((e) => {
    const path = prefix ? `${prefix}.${e.property}` : e.property;
    const own = Object.values(e.constraints ?? {}).map((m) => (m.startsWith(e.property) && prefix ? `${prefix}.${m}` : m));
    return [...own, ...flattenValidationErrors(e.children ?? [], path)];
  });
}

/** The global edge: unknown fields refused, types converted, every message readable. */
export const validationPipe = new ValidationPipe({
  whitelist: true,
  forbidNonWhitelisted: true,
  transform: true,
  transformOptions: { enableImplicitConversion: false },
  stopAtFirstError: false,
  exceptionFactory: (errors) =>
    new BadRequestException({ statusCode: 400, error: 'Bad Request', message: flattenValidationErrors(errors) }),
});
