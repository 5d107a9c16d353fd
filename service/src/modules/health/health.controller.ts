import { Controller, Get, HttpException } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { HealthResponse } from '@crankjournal/shared-types';
import { Public } from '../../common/decorators/public.decorator.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(@InjectDataSource() private readonly db: DataSource) {}

  /** Answers 200 when the database answers, 503 when it does not. */
  @ApiAnswer('HealthResponse')
  @Public()
  @Get()
  async health(): Promise<HealthResponse> {
    let database: HealthResponse['database'] = 'up';
    try {
      await this.db.query('SELECT 1');
    } catch {
      database = 'down';
    }
    const body: HealthResponse = {
      status: database === 'up' ? 'ok' : 'degraded',
      database,
      version: '0.1.0',
      time: new Date().toISOString(),
    };
    if (database === 'down')
      throw new HttpException(
        { statusCode: 503, error: 'Service Unavailable', message: 'The database is not answering.', details: body },
        503,
      );
    return body;
  }
}
