import { Body, Controller, Get, Param, Post, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { EngineDetail, EngineSummary, LimitChangeDto } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { EnginesService } from './engines.service.js';
import { EngineWriteDto } from './dto/engine-write.dto.js';

@ApiTags('engines')
@ApiBearerAuth()
@Controller('engines')
export class EnginesController {
  constructor(private readonly engines: EnginesService) {}

  @ApiAnswer('EngineSummary', { array: true })
  @Get()
  @AnyRole()
  list(): Promise<EngineSummary[]> {
    return this.engines.list();
  }

  @ApiAnswer('EngineDetail')
  @Get(':id')
  @AnyRole()
  detail(@Param() p: IdParamDto): Promise<EngineDetail> {
    return this.engines.detail(p.id);
  }

  @ApiAnswer('LimitChangeDto', { array: true })
  @Get(':id/limit-changes')
  @AnyRole()
  limitChanges(@Param() p: IdParamDto): Promise<LimitChangeDto[]> {
    return this.engines.limitChanges(p.id);
  }

  @ApiAnswer('EngineDetail')
  @Post()
  @Roles('chief_engineer')
  create(@Body() dto: EngineWriteDto, @CurrentUser() me: AuthUser): Promise<EngineDetail> {
    return this.engines.create(dto, me.id);
  }

  @ApiAnswer('EngineDetail')
  @Put(':id')
  @Roles('chief_engineer')
  update(@Param() p: IdParamDto, @Body() dto: EngineWriteDto, @CurrentUser() me: AuthUser): Promise<EngineDetail> {
    return this.engines.update(p.id, dto, me.id);
  }
}
