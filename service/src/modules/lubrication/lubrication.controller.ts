import { Body, Controller, Get, Param, Post, Put, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type {
  BearingLubricationAnalysis,
  ConsumptionEntryDto as ConsumptionEntryOut,
  EngineLubrication,
  LubricationPointOilDto,
  OilDto,
} from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { LubricationService } from './lubrication.service.js';
import { AnalysisQueryDto, AssignPointOilDto, ConsumptionEntryDto, OilWriteDto } from './dto/lubrication.dto.js';

@ApiTags('lubrication')
@ApiBearerAuth()
@Controller('lubrication')
export class LubricationController {
  constructor(private readonly lube: LubricationService) {}

  @ApiAnswer('OilDto', { array: true })
  @Get('oils')
  @AnyRole()
  oils(): Promise<OilDto[]> {
    return this.lube.oils();
  }

  @ApiAnswer('OilDto')
  @Post('oils')
  @Roles('maintenance_lead', 'chief_engineer')
  @ApiOperation({ summary: 'Add an oil with its grade and its viscosity at 40 °C and 100 °C' })
  createOil(@Body() dto: OilWriteDto): Promise<OilDto> {
    return this.lube.createOil(dto);
  }

  @ApiAnswer('OilDto')
  @Put('oils/:id')
  @Roles('maintenance_lead', 'chief_engineer')
  updateOil(@Param() p: IdParamDto, @Body() dto: OilWriteDto): Promise<OilDto> {
    return this.lube.updateOil(p.id, dto);
  }

  @ApiAnswer('LubricationPointOilDto')
  @Put('points/:id/oil')
  @Roles('maintenance_lead', 'chief_engineer')
  @ApiOperation({ summary: 'Say which oil a lubrication point takes (null: match its grade text again)' })
  assignOil(@Param() p: IdParamDto, @Body() dto: AssignPointOilDto, @CurrentUser() me: AuthUser): Promise<LubricationPointOilDto> {
    return this.lube.assignOil(p.id, dto.oilId, me.id);
  }

  @ApiAnswer('ConsumptionEntryDto')
  @Post('consumption')
  @Roles('operator', 'maintenance_lead', 'chief_engineer')
  @ApiOperation({ summary: 'Log oil used by a lubrication point in a run: a quantity added, or the levels before and after' })
  addConsumption(@Body() dto: ConsumptionEntryDto, @CurrentUser() me: AuthUser): Promise<ConsumptionEntryOut> {
    return this.lube.addConsumption(dto, me.id);
  }

  @ApiAnswer('EngineLubrication')
  @Get('engines/:id')
  @AnyRole()
  @ApiOperation({ summary: 'Points and their oils; oil used per run, per run-hour and per thousand revolutions with a trend per point' })
  engine(@Param() p: IdParamDto): Promise<EngineLubrication> {
    return this.lube.engineLubrication(p.id);
  }

  @ApiAnswer('BearingLubricationAnalysis')
  @Get('engines/:id/bearings')
  @AnyRole()
  @ApiOperation({
    summary:
      'Each bearing at a run (default the latest): viscosity at its temperature, unit load, Petroff friction and power, Sommerfeld number',
  })
  bearings(@Param() p: IdParamDto, @Query() q: AnalysisQueryDto): Promise<BearingLubricationAnalysis> {
    return this.lube.bearingAnalysis(p.id, q.runId);
  }
}
