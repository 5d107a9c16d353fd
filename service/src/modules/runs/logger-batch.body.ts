import { BadRequestException, createParamDecorator, type ExecutionContext } from '@nestjs/common';
import { validateSync } from 'class-validator';
import { flattenValidationErrors } from '../../common/pipes/validation.pipe.js';
import { LoggerBatchDto } from './dto/reading.dto.js';

const bad = (message: string[]) => new BadRequestException({ statusCode: 400, error: 'Bad Request', message });

/**
 * The envelope of a logger batch checked as the global validation pipe would (same rules, same messages), without
 * its deep copy of every row: a batch holds up to 20,000 readings, and each is checked once, in the ingest path
 * (IngestService.check, which also refuses the keys the pipe looks for).
 */
export function checkLoggerBatch(body: unknown): LoggerBatchDto {
  if (typeof body !== 'object' || body === null || Array.isArray(body))
    throw bad(['the body must be a JSON object: { "runId"?: uuid, "readings": [...] }']);
  for (const key of Object.keys(body)) if (key === '__proto__' || key === 'constructor') throw bad([`property ${key} should not exist`]);
  const dto = Object.assign(new LoggerBatchDto(), body);
  const errors = validateSync(dto, { whitelist: true, forbidNonWhitelisted: true, stopAtFirstError: false });
  if (errors.length) throw bad(flattenValidationErrors(errors));
  return dto;
}

/**
 * The body of POST /api/logger/readings as a checked LoggerBatchDto. A parameter decorator of its own, so the global
 * validation pipe (which leaves custom parameters alone) does not walk and copy the rows first.
 */
export const LoggerBatchBody = createParamDecorator((_data: unknown, ctx: ExecutionContext): LoggerBatchDto =>
  checkLoggerBatch(ctx.switchToHttp().getRequest<{ body: unknown }>().body),
);
