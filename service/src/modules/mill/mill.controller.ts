import { Body, Controller, Get, HttpCode, Param, Post, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { MILL_WRITERS, type MillDto, type ScheduleDetail, type ScheduleSummary } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { MillService } from './mill.service.js';
import { SchedulesService } from './schedules.service.js';
import { MillWriteDto } from './dto/mill-write.dto.js';
import { ScheduleCopyDto, ScheduleQueryDto, ScheduleWriteDto } from './dto/schedule.dto.js';

/** The mill described per site, and its pass schedules and templates. */
@ApiTags('mill')
@ApiBearerAuth()
@Controller('mill')
export class MillController {
  constructor(
    private readonly mills: MillService,
    private readonly schedules: SchedulesService,
  ) {}

  @ApiAnswer('MillDto', { array: true })
  @Get('mills')
  @AnyRole()
  list(): Promise<MillDto[]> {
    return this.mills.list();
  }

  @ApiAnswer('MillDto')
  @Get('mills/:id')
  @AnyRole()
  detail(@Param() p: IdParamDto): Promise<MillDto> {
    return this.mills.detail(p.id);
  }

  @ApiAnswer('MillDto')
  @Post('mills')
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: 'Describe a mill: stands, driving engine, pass-check settings and quote rates' })
  create(@Body() dto: MillWriteDto): Promise<MillDto> {
    return this.mills.create(dto);
  }

  @ApiAnswer('MillDto')
  @Put('mills/:id')
  @Roles(...MILL_WRITERS)
  update(@Param() p: IdParamDto, @Body() dto: MillWriteDto): Promise<MillDto> {
    return this.mills.update(p.id, dto);
  }

  @ApiAnswer('ScheduleSummary', { array: true })
  @Get('schedules')
  @AnyRole()
  schedulesList(@Query() q: ScheduleQueryDto): Promise<ScheduleSummary[]> {
    return this.schedules.list(q);
  }

  @ApiAnswer('ScheduleDetail')
  @Get('schedules/:id')
  @AnyRole()
  @ApiOperation({
    summary:
      'A pass schedule with each pass calculated (reduction, elongation, contact length, flow stress, force, torque, power, flywheel)',
  })
  scheduleDetail(@Param() p: IdParamDto): Promise<ScheduleDetail> {
    return this.schedules.detail(p.id);
  }

  @ApiAnswer('ScheduleDetail')
  @Post('schedules')
  @Roles(...MILL_WRITERS)
  createSchedule(@Body() dto: ScheduleWriteDto, @CurrentUser() me: AuthUser): Promise<ScheduleDetail> {
    return this.schedules.create(dto, me);
  }

  @ApiAnswer('ScheduleDetail')
  @Put('schedules/:id')
  @Roles(...MILL_WRITERS)
  updateSchedule(@Param() p: IdParamDto, @Body() dto: ScheduleWriteDto): Promise<ScheduleDetail> {
    return this.schedules.update(p.id, dto);
  }

  @ApiAnswer('ScheduleDetail')
  @Post('schedules/:id/copies')
  @HttpCode(201)
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: 'Plan a new schedule from a template (or any schedule)' })
  copySchedule(@Param() p: IdParamDto, @Body() dto: ScheduleCopyDto, @CurrentUser() me: AuthUser): Promise<ScheduleDetail> {
    return this.schedules.copy(p.id, dto, me);
  }
}
