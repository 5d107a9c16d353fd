import { ApiProperty, ApiPropertyOptional, OmitType, PartialType } from '@nestjs/swagger';
import { ArrayMaxSize, IsArray, IsBoolean, IsDateString, IsIn, IsOptional, IsString, IsUUID, MaxLength, MinLength } from 'class-validator';
import {
  COMPONENT_KINDS,
  INSPECTION_KINDS,
  WORK_HAZARDS,
  type ComponentKind,
  type InspectionKind,
  type InspectionPlanUpdateRequest,
  type InspectionPlanWriteRequest,
  type WorkHazard,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

const oneOf = (list: readonly string[]) => ({
  message: ({ property }: { property: string }) => `${property} must be one of: ${list.join(', ')}`,
});

export class PlanWriteDto implements InspectionPlanWriteRequest {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiProperty({ enum: COMPONENT_KINDS }) @IsIn(COMPONENT_KINDS, oneOf(COMPONENT_KINDS)) componentKind: ComponentKind;
  @ApiPropertyOptional({ nullable: true }) @IsOptional() @IsUUID('all', { message: 'bearingId must be a UUID' }) bearingId?: string | null;
  @ApiPropertyOptional({ example: 'Crankshaft webs' }) @IsOptional() @IsString() @MaxLength(120) componentLabel?: string;
  @ApiProperty({ example: 'Main bearing clearance' })
  @IsString()
  @MinLength(1, { message: 'title must not be empty' })
  @MaxLength(160)
  title: string;
  @ApiProperty({ enum: INSPECTION_KINDS }) @IsIn(INSPECTION_KINDS, oneOf(INSPECTION_KINDS)) inspectionKind: InspectionKind;
  @ApiPropertyOptional({ description: 'running hours between inspections' })
  @IsOptional()
  @IsFiniteNumberIn(0.1, 1_000_000)
  intervalRunHours?: number | null;
  @ApiPropertyOptional({ description: 'revolutions between inspections' }) @IsOptional() @IsFiniteNumberIn(1, 1e12) intervalRevolutions?:
    number | null;
  @ApiPropertyOptional({ description: 'calendar days between inspections' }) @IsOptional() @IsFiniteNumberIn(1, 36_500) intervalDays?:
    number | null;
  @ApiPropertyOptional({ description: 'when it was last done (ISO); defaults to now' })
  @IsOptional()
  @IsDateString({}, { message: 'lastDoneAt must be an ISO date-time' })
  lastDoneAt?: string;
  @ApiPropertyOptional({ enum: WORK_HAZARDS, isArray: true })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(10)
  @IsIn(WORK_HAZARDS, { each: true, message: `hazards must be among: ${WORK_HAZARDS.join(', ')}` })
  hazards?: WorkHazard[];
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(4000) notes?: string;
  @ApiPropertyOptional() @IsOptional() @IsBoolean({ message: 'active must be true or false' }) active?: boolean;
}

export class PlanUpdateDto extends PartialType(OmitType(PlanWriteDto, ['engineId'] as const)) implements InspectionPlanUpdateRequest {}

export class PlanQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the plans of this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the plans of this bearing' })
  @IsOptional()
  @IsUUID('all', { message: 'bearingId must be a UUID' })
  bearingId?: string;
}
