import { Body, Controller, Get, HttpCode, Param, Patch, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  MILL_WRITERS,
  type BarDto,
  type LoggedPassDto,
  type MillRunLog,
  type MillRunSummary,
  type MillTimelineItem,
} from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { RollingLogService } from './rolling-log.service.js';
import { CreateBarDto, LogPassDto, UpdateBarDto } from './dto/bar.dto.js';
import { MillRunIdParamDto } from './dto/lot.dto.js';

/** The rolling log of a run: bars, their passes, and one timeline with the run's readings and alarms. */
@ApiTags('mill')
@ApiBearerAuth()
@Controller('mill')
export class RollingLogController {
  constructor(private readonly log: RollingLogService) {}

  @ApiAnswer('MillRunSummary', { array: true })
  @Get('runs')
  @AnyRole()
  runs(): Promise<MillRunSummary[]> {
    return this.log.runsList();
  }

  @ApiAnswer('MillRunLog')
  @Get('runs/:runId')
  @AnyRole()
  runLog(@Param() p: MillRunIdParamDto): Promise<MillRunLog> {
    return this.log.runLog(p.runId);
  }

  @ApiAnswer('MillTimelineItem', { array: true })
  @Get('runs/:runId/timeline')
  @AnyRole()
  @ApiOperation({ summary: 'Passes, rounds of readings and alarms of a run, in time order' })
  timeline(@Param() p: MillRunIdParamDto): Promise<MillTimelineItem[]> {
    return this.log.timeline(p.runId);
  }

  @ApiAnswer('BarDto')
  @Post('runs/:runId/bars')
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: 'Start a bar on a running (or stopped, not closed) run' })
  createBar(@Param() p: MillRunIdParamDto, @Body() dto: CreateBarDto, @CurrentUser() me: AuthUser): Promise<BarDto> {
    return this.log.createBar(p.runId, dto, me);
  }

  @ApiAnswer('BarDto')
  @Patch('bars/:id')
  @Roles(...MILL_WRITERS)
  updateBar(@Param() p: IdParamDto, @Body() dto: UpdateBarDto, @CurrentUser() me: AuthUser): Promise<BarDto> {
    return this.log.updateBar(p.id, dto, me);
  }

  @ApiAnswer('LoggedPassDto')
  @Post('bars/:id/passes')
  @HttpCode(201)
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: 'Log a pass of a bar; its calculation and warnings are stored with it' })
  logPass(@Param() p: IdParamDto, @Body() dto: LogPassDto, @CurrentUser() me: AuthUser): Promise<LoggedPassDto> {
    return this.log.logPass(p.id, dto, me);
  }
}
