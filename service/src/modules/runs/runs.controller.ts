import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpException,
  Param,
  Patch,
  Post,
  Query,
  Req,
  Res,
  StreamableFile,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { ApiBearerAuth, ApiConsumes, ApiTags, ApiBody } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type {
  AlarmDto,
  AlarmFiguresDto,
  BoardPoint,
  IngestResult,
  ReadingDto,
  RunDetail,
  RunDetailWithEngine,
  RunSummary,
  StartGateVerdict,
} from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { AppConfig } from '../../config/app-config.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { ApiAnswer, ApiErrors, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { RunsService } from './runs.service.js';
import { ReadingsService } from './readings.service.js';
import { IngestService } from './ingest.service.js';
import { CsvImportService } from './csv-import.service.js';
import { RunExportsService } from './run-exports.service.js';
import { CreateRunDto, ReadingsQueryDto, RunQueryDto, RunTransitionDto, SeasonFiguresQueryDto, UpdateRunDto } from './dto/run.dto.js';
import type { Run } from './run.entity.js';
import { RoundDto } from './dto/reading.dto.js';

/** A batch with rejected rows answers 400 with the full report; its good rows are kept. */
export function answerIngest(r: IngestResult): IngestResult {
  if (r.rejectedCount > 0) {
    throw new HttpException(
      {
        statusCode: 400,
        error: 'Bad Request',
        message: r.rejected
          .slice(0, 20)
          .map((x) => `${x.line !== undefined ? `line ${x.line}` : `reading ${x.index}`}${x.column ? `, ${x.column}` : ''}: ${x.reason}`),
        details: r,
      },
      400,
    );
  }
  return r;
}

@ApiTags('runs')
@ApiBearerAuth()
@Controller('runs')
export class RunsController {
  constructor(
    private readonly runs: RunsService,
    private readonly readings: ReadingsService,
    private readonly ingest: IngestService,
    private readonly csv: CsvImportService,
    private readonly exports: RunExportsService,
    private readonly alarms: AlarmsService,
    private readonly config: AppConfig,
  ) {}

  @ApiAnswer('RunSummary', { array: true })
  @Get()
  @AnyRole()
  list(@Query() q: RunQueryDto): Promise<RunSummary[]> {
    return this.runs.list(q);
  }

  /** The alarm system's own figures for an engine's season (its runs of a calendar year). */
  @ApiAnswer('AlarmFiguresDto')
  @Get('alarm-figures')
  @Roles('chief_engineer', 'maintenance_lead')
  async seasonAlarmFigures(@Query() q: SeasonFiguresQueryDto): Promise<AlarmFiguresDto> {
    const runs = await this.runs.season(q.engineId, q.year);
    return this.alarms.figures(
      runs.map((r) => this.runSpan(r)),
      (pointId, at) => this.readings.valuesAt(pointId, at),
    );
  }

  @ApiAnswer('RunDetail')
  @Post()
  @Roles('chief_engineer', 'operator')
  create(@Body() dto: CreateRunDto, @CurrentUser() me: AuthUser): Promise<RunDetail> {
    return this.runs.create(dto, me);
  }

  /** The run with its engine's detail: whoever may read the run may read its engine (both any role). */
  @ApiAnswer('RunDetailWithEngine')
  @Get(':id')
  @AnyRole()
  detail(@Param() p: IdParamDto): Promise<RunDetailWithEngine> {
    return this.runs.detailWithEngine(p.id);
  }

  @ApiAnswer('RunDetail')
  @Patch(':id')
  @Roles('chief_engineer', 'operator')
  update(@Param() p: IdParamDto, @Body() dto: UpdateRunDto, @CurrentUser() me: AuthUser): Promise<RunDetail> {
    return this.runs.update(p.id, dto, me);
  }

  /** Moves the run on; to running only through the start gate (409 with reasons when refused). */
  @ApiAnswer('RunDetail')
  @ApiErrors(429)
  @Post(':id/transitions')
  @HttpCode(200)
  @Roles('chief_engineer', 'operator')
  transition(@Param() p: IdParamDto, @Body() dto: RunTransitionDto, @CurrentUser() me: AuthUser): Promise<RunDetail> {
    return this.runs.transition(p.id, dto, me);
  }

  @ApiAnswer('StartGateVerdict')
  @Get(':id/start-gate')
  @AnyRole()
  startGate(@Param() p: IdParamDto, @CurrentUser() me: AuthUser): Promise<StartGateVerdict> {
    return this.runs.startGate(p.id, me);
  }

  @ApiAnswer('ReadingDto', { array: true })
  @Get(':id/readings')
  @AnyRole()
  readingsList(@Param() p: IdParamDto, @Query() q: ReadingsQueryDto): Promise<ReadingDto[]> {
    return this.readings.list(p.id, q);
  }

  @ApiAnswer('BoardPoint', { array: true })
  @Get(':id/board')
  @AnyRole()
  board(@Param() p: IdParamDto): Promise<BoardPoint[]> {
    return this.readings.board(p.id);
  }

  /** The alarm system's own figures for this run, against the standards' targets. */
  @ApiAnswer('AlarmFiguresDto')
  @Get(':id/alarm-figures')
  @Roles('chief_engineer', 'maintenance_lead')
  async runAlarmFigures(@Param() p: IdParamDto): Promise<AlarmFiguresDto> {
    const run = await this.runs.get(p.id);
    return this.alarms.figures([this.runSpan(run)], (pointId, at) => this.readings.valuesAt(pointId, at));
  }

  private runSpan(run: Run) {
    return { id: run.id, from: run.createdAt, to: run.closedAt ?? run.stoppedAt ?? new Date(), startedAt: run.startedAt };
  }

  @ApiAnswer('AlarmDto', { array: true })
  @Get(':id/alarms')
  @AnyRole()
  async runAlarms(@Param() p: IdParamDto): Promise<AlarmDto[]> {
    await this.runs.get(p.id);
    return this.alarms.list({ runId: p.id });
  }

  /** A round of readings from the tablet. */
  @ApiAnswer('IngestResult')
  @ApiBody({
    type: RoundDto,
    examples: {
      round: {
        summary: 'A round from the tablet: speed and a bearing temperature',
        value: {
          takenAt: '2026-06-13T10:30:00Z',
          note: 'All steady',
          readings: [
            { clientId: '0b5e7d2c-3f0a-4e8e-8f7e-3d9b1c2a4f10', pointCode: 'SPD', value: 64, takenAt: '2026-06-13T10:30:00Z' },
            { clientId: '0b5e7d2c-3f0a-4e8e-8f7e-3d9b1c2a4f11', pointCode: 'MB1-T', value: 119, takenAt: '2026-06-13T10:30:00Z' },
          ],
        },
      },
    },
  })
  @Post(':id/rounds')
  @Roles('chief_engineer', 'operator')
  async round(@Param() p: IdParamDto, @Body() dto: RoundDto, @CurrentUser() me: AuthUser): Promise<IngestResult> {
    const run = await this.runs.get(p.id);
    return answerIngest(await this.ingest.ingest({ run, source: 'round', enteredBy: me.id }, dto.readings));
  }

  /** A logger's CSV file, sent as the raw body (text/csv), streamed. */
  @ApiAnswer('IngestResult')
  @Post(':id/imports')
  @ApiConsumes('text/csv')
  @ApiBody({ description: 'The CSV file as the body: a header row, then one reading a row', schema: { type: 'string' } })
  @Roles('chief_engineer', 'operator')
  async importCsv(@Param() p: IdParamDto, @Req() req: Request, @CurrentUser() me: AuthUser): Promise<IngestResult> {
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim();
    if (!['text/csv', 'text/plain', 'application/csv'].includes(type)) {
      req.resume();
      throw new UnsupportedMediaTypeException('Send the CSV file itself as the body, with Content-Type text/csv.');
    }
    const max = this.config.get('CSV_IMPORT_MAX_BYTES');
    if (Number(req.headers['content-length'] ?? 0) > max) {
      req.resume();
      const mb = Math.round(max / (1024 * 1024));
      throw new HttpException({ statusCode: 413, error: 'Payload Too Large', message: `The file is larger than ${mb} MB; split it.` }, 413);
    }
    const run = await this.runs.get(p.id);
    const result = await this.csv.import(run, req, me.id);
    // A file of which no line could be taken is refused (400 with the report); a partly good one is kept and reported.
    if (result.rejectedCount > 0 && result.stored + result.duplicates === 0) return answerIngest(result);
    return result;
  }

  @ApiFileAnswer('text/csv', "The run's readings as CSV")
  @Get(':id/readings.csv')
  @AnyRole()
  async csvExport(@Param() p: IdParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { filename, stream } = await this.exports.readingsCsv(p.id);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(stream, { type: 'text/csv; charset=utf-8' });
  }
}
