import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsDateString,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  MinLength,
} from 'class-validator';
import {
  RUN_PURPOSES,
  RUN_STATES,
  type CreateRunRequest,
  type RunPurpose,
  type RunState,
  type RunTransitionRequest,
  type UpdateRunRequest,
} from '@crankjournal/shared-types';

export class CreateRunDto implements CreateRunRequest {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiProperty({ enum: RUN_PURPOSES })
  @IsIn(RUN_PURPOSES, { message: `purpose must be one of: ${RUN_PURPOSES.join(', ')}` })
  purpose: RunPurpose;
  @ApiProperty({ example: 'Open day demonstration' })
  @IsString()
  @MinLength(1, { message: 'title must not be empty' })
  @MaxLength(160)
  title: string;
  @ApiPropertyOptional({ example: '2026-12-05' })
  @IsOptional()
  @IsDateString({ strict: true }, { message: 'plannedFor must be a date like 2026-12-05' })
  plannedFor?: string | null;
  @ApiPropertyOptional()
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(30)
  @IsUUID('all', { each: true, message: 'crewIds must be user ids' })
  crewIds?: string[];
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string;
}

export class UpdateRunDto extends PartialType(CreateRunDto) implements UpdateRunRequest {}

const TARGETS = RUN_STATES.filter((s) => s !== 'planned');
export class RunTransitionDto implements RunTransitionRequest {
  @ApiProperty({ enum: TARGETS }) @IsIn(TARGETS, { message: `to must be one of: ${TARGETS.join(', ')}` }) to: Exclude<RunState, 'planned'>;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string;
  @ApiPropertyOptional({ description: 'password or signing PIN (to close)' }) @IsOptional() @IsString() @MaxLength(200) signature?: string;
}

export class RunQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the runs of this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ enum: RUN_STATES, description: 'Only the runs in this state' })
  @IsOptional()
  @IsIn(RUN_STATES, { message: `state must be one of: ${RUN_STATES.join(', ')}` })
  state?: RunState;
}

export class SeasonFiguresQueryDto {
  @ApiProperty({ format: 'uuid', description: 'The engine whose season it is' })
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId: string;
  @ApiProperty({ type: 'integer', example: 2026, description: 'The season: the runs opened in this calendar year' })
  @Type(() => Number)
  @IsInt({ message: 'year must be a whole number, e.g. 2026' })
  @Min(1900, { message: 'year must be 1900 or later' })
  @Max(2200, { message: 'year must be 2200 or earlier' })
  year: number;
}

export class ReadingsQueryDto {
  @ApiPropertyOptional({ format: 'date-time', description: 'Only readings taken at or after this time' })
  @IsOptional()
  @IsDateString({}, { message: 'since must be an ISO date-time' })
  since?: string;
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the readings of this measurement point' })
  @IsOptional()
  @IsUUID('all', { message: 'pointId must be a UUID' })
  pointId?: string;
}
