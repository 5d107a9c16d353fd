import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { AlarmDto } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { AlarmsService } from './alarms.service.js';
import { ShelveAlarmDto } from './dto/shelve-alarm.dto.js';
import { AlarmQueryDto } from './dto/alarm-query.dto.js';

@ApiTags('alarms')
@ApiBearerAuth()
@Controller('alarms')
export class AlarmsController {
  constructor(private readonly alarms: AlarmsService) {}

  @ApiAnswer('AlarmDto', { array: true })
  @Get()
  @AnyRole()
  list(@Query() q: AlarmQueryDto): Promise<AlarmDto[]> {
    return this.alarms.list({ engineId: q.engineId, open: q.open });
  }

  @ApiAnswer('AlarmDto')
  @Post(':id/acknowledge')
  @HttpCode(200)
  @Roles('operator', 'chief_engineer')
  acknowledge(@Param() p: IdParamDto, @CurrentUser() me: AuthUser): Promise<AlarmDto> {
    return this.alarms.acknowledge(p.id, me);
  }

  @ApiAnswer('AlarmDto')
  @Post(':id/shelve')
  @HttpCode(200)
  @Roles('operator', 'chief_engineer')
  shelve(@Param() p: IdParamDto, @Body() dto: ShelveAlarmDto, @CurrentUser() me: AuthUser): Promise<AlarmDto> {
    return this.alarms.shelve(p.id, me, dto.reason, dto.minutes);
  }

  @ApiAnswer('AlarmDto')
  @Post(':id/unshelve')
  @HttpCode(200)
  @Roles('operator', 'chief_engineer')
  unshelve(@Param() p: IdParamDto, @CurrentUser() me: AuthUser): Promise<AlarmDto> {
    return this.alarms.unshelve(p.id, me);
  }
}
