import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsDateString,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  INSPECTION_KINDS,
  MAINTENANCE_UNITS,
  MEASUREMENT_ITEM_KINDS,
  type FollowUpAction,
  type InspectionCreateRequest,
  type InspectionKind,
  type MaintenanceUnit,
  type MeasurementItemInput,
  type MeasurementItemKind,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

const oneOf = (list: readonly string[]) => ({
  message: ({ property }: { property: string }) => `${property} must be one of: ${list.join(', ')}`,
});

export class MeasurementItemDto implements MeasurementItemInput {
  @ApiProperty({ enum: MEASUREMENT_ITEM_KINDS }) @IsIn(MEASUREMENT_ITEM_KINDS, oneOf(MEASUREMENT_ITEM_KINDS)) kind: MeasurementItemKind;
  @ApiProperty({ example: 'Top, crank end' })
  @IsString()
  @MinLength(1, { message: 'label must say where it was taken' })
  @MaxLength(120)
  label: string;
  @ApiPropertyOptional({ description: 'crank angle of a web deflection reading, degrees' })
  @IsOptional()
  @IsFiniteNumberIn(0, 360)
  crankAngleDeg?: number | null;
  @ApiProperty({ example: 0.026 }) @IsFiniteNumberIn(-1000, 1000) value: number;
  @ApiProperty({ enum: MAINTENANCE_UNITS }) @IsIn(MAINTENANCE_UNITS, oneOf(MAINTENANCE_UNITS)) unit: MaintenanceUnit;
  @ApiPropertyOptional() @IsOptional() @IsFiniteNumberIn(-1000, 1000) nominal?: number | null;
  @ApiPropertyOptional({ description: 'lowest acceptable value' }) @IsOptional() @IsFiniteNumberIn(-1000, 1000) toleranceMin?:
    number | null;
  @ApiPropertyOptional({ description: 'highest acceptable value' }) @IsOptional() @IsFiniteNumberIn(-1000, 1000) toleranceMax?:
    number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(1000) note?: string;
}

export class FollowUpActionDto implements FollowUpAction {
  @ApiProperty() @IsString() @MinLength(1, { message: 'a follow-up action must say what to do' }) @MaxLength(1000) text: string;
}

export class InspectionCreateDto implements InspectionCreateRequest {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiPropertyOptional({ nullable: true }) @IsOptional() @IsUUID('all', { message: 'bearingId must be a UUID' }) bearingId?: string | null;
  @ApiPropertyOptional({ nullable: true }) @IsOptional() @IsUUID('all', { message: 'planId must be a UUID' }) planId?: string | null;
  @ApiPropertyOptional({
    description: 'true when this inspection completes its plan: the plan is then reset to this date and the counters then',
  })
  @IsOptional()
  @IsBoolean({ message: 'completesPlan must be true or false' })
  completesPlan?: boolean;
  @ApiProperty({ enum: INSPECTION_KINDS }) @IsIn(INSPECTION_KINDS, oneOf(INSPECTION_KINDS)) kind: InspectionKind;
  @ApiProperty() @IsString() @MinLength(1, { message: 'title must not be empty' }) @MaxLength(160) title: string;
  @ApiProperty({ example: '2026-08-20T09:00:00Z' })
  @IsDateString({}, { message: 'inspectedAt must be an ISO date-time' })
  inspectedAt: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(160) inspectorName?: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(10_000) findings?: string;
  @ApiPropertyOptional({ type: [FollowUpActionDto] })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  @ValidateNested({ each: true })
  @Type(() => FollowUpActionDto)
  followUpActions?: FollowUpActionDto[];
  @ApiPropertyOptional({ type: [MeasurementItemDto] })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(200)
  @ValidateNested({ each: true })
  @Type(() => MeasurementItemDto)
  measurements?: MeasurementItemDto[];
  @ApiPropertyOptional({ nullable: true })
  @IsOptional()
  @IsUUID('all', { message: 'promptedByAlarmId must be a UUID' })
  promptedByAlarmId?: string | null;
  @ApiPropertyOptional({ nullable: true }) @IsOptional() @IsUUID('all', { message: 'promptedByRunId must be a UUID' }) promptedByRunId?:
    string | null;
}

export class InspectionQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the inspections of this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the inspections of this bearing' })
  @IsOptional()
  @IsUUID('all', { message: 'bearingId must be a UUID' })
  bearingId?: string;
}

export class AttachmentUploadDto {
  @ApiPropertyOptional({ description: 'what the photo or document shows' }) @IsOptional() @IsString() @MaxLength(300) caption?: string;
}
