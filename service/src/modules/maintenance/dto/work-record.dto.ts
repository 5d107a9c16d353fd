import { ApiProperty, ApiPropertyOptional, OmitType, PartialType } from '@nestjs/swagger';
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
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  WORK_HAZARDS,
  type CloseWorkRecordRequest,
  type PartUsed,
  type WorkHazard,
  type WorkRecordCreateRequest,
  type WorkRecordUpdateRequest,
  type WorkStatus,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

export class PartUsedDto implements PartUsed {
  @ApiProperty({ example: 'White metal, tin-based' })
  @IsString()
  @MinLength(1, { message: 'parts need a description' })
  @MaxLength(200)
  description: string;
  @ApiProperty({ example: 2 }) @IsFiniteNumberIn(0, 1_000_000) quantity: number;
  @ApiProperty({ example: 'kg' }) @IsString() @MaxLength(20) unit: string;
}

export class WorkRecordCreateDto implements WorkRecordCreateRequest {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiPropertyOptional({ nullable: true }) @IsOptional() @IsUUID('all', { message: 'bearingId must be a UUID' }) bearingId?: string | null;
  @ApiProperty() @IsString() @MinLength(1, { message: 'title must say what was done' }) @MaxLength(160) title: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(10_000) description?: string;
  @ApiProperty({ example: 'M. Quarrendon, T. Ashby' })
  @IsString()
  @MinLength(1, { message: 'performedBy must name who did the work' })
  @MaxLength(300)
  performedBy: string;
  @ApiPropertyOptional({ type: [PartUsedDto] })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(100)
  @ValidateNested({ each: true })
  @Type(() => PartUsedDto)
  parts?: PartUsedDto[];
  @ApiPropertyOptional({ description: 'labour hours' }) @IsOptional() @IsFiniteNumberIn(0, 100_000) labourHours?: number;
  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsUUID('all', { message: 'promptedByInspectionId must be a UUID' })
  promptedByInspectionId?: string | null;
  @ApiPropertyOptional({
    type: [Number],
    description: 'follow-up actions (by position) of the prompting inspection that this work carries out',
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @IsInt({ each: true, message: 'followUpActionIndexes must be whole numbers' })
  followUpActionIndexes?: number[];
  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsUUID('all', { message: 'promptedByAlarmId must be a UUID' })
  promptedByAlarmId?: string | null;
  @ApiPropertyOptional({ enum: WORK_HAZARDS, isArray: true })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(10)
  @IsIn(WORK_HAZARDS, { each: true, message: `hazards must be among: ${WORK_HAZARDS.join(', ')}` })
  hazards?: WorkHazard[];
  @ApiPropertyOptional() @IsOptional() @IsDateString({}, { message: 'startedAt must be an ISO date-time' }) startedAt?: string;
  @ApiPropertyOptional({ type: [String] })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @IsUUID('all', { each: true, message: 'satisfiesPlanIds must be plan ids' })
  satisfiesPlanIds?: string[];
}

export class WorkRecordUpdateDto
  extends PartialType(OmitType(WorkRecordCreateDto, ['engineId'] as const))
  implements WorkRecordUpdateRequest {}

export class CloseWorkRecordDto implements CloseWorkRecordRequest {
  @ApiPropertyOptional({ description: 'when the work was finished (ISO); defaults to now' })
  @IsOptional()
  @IsDateString({}, { message: 'completedAt must be an ISO date-time' })
  completedAt?: string;
  @ApiPropertyOptional({ type: [String], description: 'plans to reset; defaults to every plan the record satisfies; [] resets none' })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @IsUUID('all', { each: true, message: 'resetPlanIds must be plan ids' })
  resetPlanIds?: string[];
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string;
}

export class WorkRecordQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the work on this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the work on this bearing' })
  @IsOptional()
  @IsUUID('all', { message: 'bearingId must be a UUID' })
  bearingId?: string;
  @ApiPropertyOptional({ enum: ['open', 'closed'], description: 'Only open or only closed work' })
  @IsOptional()
  @IsIn(['open', 'closed'], { message: 'status must be open or closed' })
  status?: WorkStatus;
}
