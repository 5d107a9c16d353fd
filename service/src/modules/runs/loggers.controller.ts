import { Body, Controller, Get, HttpCode, Param, Post, Req, UseGuards, ConflictException, BadRequestException } from '@nestjs/common';
import { ApiBearerAuth, ApiHeader, ApiTags, ApiBody } from '@nestjs/swagger';
import type { IngestResult, IssuedLoggerKey, LoggerDto } from '@crankjournal/shared-types';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { Public } from '../../common/decorators/public.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { LoggersService } from './loggers.service.js';
import { LoggerKeyGuard } from './logger-key.guard.js';
import { LoggerBatchBody } from './logger-batch.body.js';
import { IngestService } from './ingest.service.js';
import { RunsService } from './runs.service.js';
import { CreateLoggerDto, LoggerBatchDto } from './dto/reading.dto.js';
import type { DataLogger } from './logger.entity.js';
import { answerIngest } from './runs.controller.js';

@ApiTags('loggers')
@Controller()
export class LoggersController {
  constructor(
    private readonly loggers: LoggersService,
    private readonly ingest: IngestService,
    private readonly runs: RunsService,
  ) {}

  @ApiAnswer('LoggerDto', { array: true })
  @Get('loggers')
  @ApiBearerAuth()
  @Roles('administrator', 'chief_engineer')
  list(): Promise<LoggerDto[]> {
    return this.loggers.list();
  }

  @ApiAnswer('IssuedLoggerKey')
  @Post('loggers')
  @ApiBearerAuth()
  @Roles('administrator')
  issue(@Body() dto: CreateLoggerDto, @CurrentUser() me: AuthUser): Promise<IssuedLoggerKey> {
    return this.loggers.issue(dto.engineId, dto.name, me.id);
  }

  @ApiAnswer('LoggerDto')
  @Post('loggers/:id/revoke')
  @HttpCode(200)
  @ApiBearerAuth()
  @Roles('administrator')
  revoke(@Param() p: IdParamDto): Promise<LoggerDto> {
    return this.loggers.revoke(p.id);
  }

  /** Batch push from a data logger, authenticated by its key (header x-logger-key), not a user token. */
  @ApiAnswer('IngestResult')
  @Post('logger/readings')
  @Public()
  @UseGuards(LoggerKeyGuard)
  @ApiBody({
    type: LoggerBatchDto,
    examples: {
      twoBearings: {
        summary: "Two bearing temperatures into the engine's current run",
        value: {
          readings: [
            { clientId: '6f1c2a54-0b7e-4d55-9a39-2f0f5d1e7a01', pointCode: 'MB1-T', value: 118.5, takenAt: '2026-06-13T10:15:00Z' },
            { clientId: '6f1c2a54-0b7e-4d55-9a39-2f0f5d1e7a02', pointCode: 'MB2-T', value: 121, takenAt: '2026-06-13T10:15:00Z' },
          ],
        },
      },
    },
  })
  @ApiHeader({ name: 'x-logger-key', required: true })
  async push(@LoggerBatchBody() dto: LoggerBatchDto, @Req() req: { logger: DataLogger }): Promise<IngestResult> {
    const logger = req.logger;
    const run = dto.runId ? await this.runs.get(dto.runId) : await this.runs.activeRunOf(logger.engineId);
    if (!run) throw new ConflictException('No run of this engine is taking readings now; start one first or name runId.');
    if (run.engineId !== logger.engineId) throw new BadRequestException('runId belongs to another engine than this logger.');
    return answerIngest(await this.ingest.ingest({ run, source: 'logger', loggerId: logger.id }, dto.readings));
  }
}
