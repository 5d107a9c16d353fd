import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { UNIT_SYSTEMS, type UnitSystem, type UpdateMyPreferencesRequest } from '@crankjournal/shared-types';

export class UpdatePreferencesDto implements UpdateMyPreferencesRequest {
  @ApiPropertyOptional({ enum: UNIT_SYSTEMS })
  @IsOptional()
  @IsIn(UNIT_SYSTEMS, { message: `unitSystem must be one of: ${UNIT_SYSTEMS.join(', ')}` })
  unitSystem?: UnitSystem;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  displayName?: string;
}
