import { Body, Controller, Param, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ReadingDto } from '@crankjournal/shared-types';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { ReadingsService } from './readings.service.js';
import { AmendReadingDto, ReadingIdParamDto } from './dto/reading.dto.js';

@ApiTags('readings')
@ApiBearerAuth()
@Controller('readings')
export class ReadingsController {
  constructor(private readonly readings: ReadingsService) {}

  /** Corrects a reading: the original stays visible beside the amendment. */
  @ApiAnswer('ReadingDto')
  @Post(':id/amendments')
  @Roles('chief_engineer', 'operator')
  amend(@Param() p: ReadingIdParamDto, @Body() dto: AmendReadingDto, @CurrentUser() me: AuthUser): Promise<ReadingDto> {
    return this.readings.amend(p.id, dto.value, dto.reason, me, dto.clientId);
  }
}
