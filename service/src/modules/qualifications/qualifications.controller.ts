import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { QualificationDto, QualificationMatrix } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { QualificationsService } from './qualifications.service.js';
import {
  GrantQualificationDto,
  MatrixQueryDto,
  QualificationQueryDto,
  RenewQualificationDto,
  WithdrawQualificationDto,
} from './dto/qualification.dto.js';

/** Crew qualifications: everyone reads their own; the chief engineer grants, renews and withdraws. */
@ApiTags('qualifications')
@ApiBearerAuth()
@Controller('qualifications')
export class QualificationsController {
  constructor(private readonly quals: QualificationsService) {}

  @ApiAnswer('QualificationDto', { array: true })
  @Get('mine')
  @AnyRole()
  mine(@CurrentUser() me: AuthUser): Promise<QualificationDto[]> {
    return this.quals.mine(me.id);
  }

  @ApiAnswer('QualificationDto', { array: true })
  @Get()
  @Roles('chief_engineer', 'administrator')
  list(@Query() q: QualificationQueryDto): Promise<QualificationDto[]> {
    return this.quals.list(q);
  }

  /** The crew against the duties of one engine, with what is about to expire. */
  @ApiAnswer('QualificationMatrix')
  @Get('matrix')
  @Roles('chief_engineer', 'administrator')
  matrix(@Query() q: MatrixQueryDto): Promise<QualificationMatrix> {
    return this.quals.matrix(q.engineId);
  }

  @ApiAnswer('QualificationDto')
  @Post()
  @Roles('chief_engineer')
  grant(@Body() dto: GrantQualificationDto, @CurrentUser() me: AuthUser): Promise<QualificationDto> {
    return this.quals.grant(dto, me);
  }

  @ApiAnswer('QualificationDto')
  @Post(':id/renew')
  @Roles('chief_engineer')
  renew(@Param() p: IdParamDto, @Body() dto: RenewQualificationDto, @CurrentUser() me: AuthUser): Promise<QualificationDto> {
    return this.quals.renew(p.id, dto, me);
  }

  @ApiAnswer('QualificationDto')
  @Post(':id/withdraw')
  @HttpCode(200)
  @Roles('chief_engineer')
  withdraw(@Param() p: IdParamDto, @Body() dto: WithdrawQualificationDto, @CurrentUser() me: AuthUser): Promise<QualificationDto> {
    return this.quals.withdraw(p.id, dto.reason, me);
  }
}
