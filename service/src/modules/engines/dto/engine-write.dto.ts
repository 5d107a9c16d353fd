import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
  Max,
} from 'class-validator';
import {
  BEARING_KINDS,
  CYLINDER_ROLES,
  ENGINE_TYPES,
  LUBRICATION_KINDS,
  MEASUREMENT_KINDS,
  MEASUREMENT_UNITS,
  RUN_STATES,
  type RunState,
  type BearingDto,
  type BearingKind,
  type CylinderDto,
  type CylinderRole,
  type EngineType,
  type EngineWriteRequest,
  type LubricationKind,
  type LubricationPointDto,
  type MeasurementKind,
  type MeasurementPointDto,
  type MeasurementUnit,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

const oneOf = (list: readonly string[]) => ({
  message: ({ property }: { property: string }) => `${property} must be one of: ${list.join(', ')}`,
});

export class CylinderWriteDto implements CylinderDto {
  @IsOptional() @IsUUID('all', { message: 'id must be a UUID' }) id?: string;
  @ApiProperty() @IsString() @MinLength(1) @MaxLength(40) label: string;
  @ApiProperty({ enum: CYLINDER_ROLES }) @IsIn(CYLINDER_ROLES, oneOf(CYLINDER_ROLES)) role: CylinderRole;
  @ApiProperty({ description: 'inches' }) @IsFiniteNumberIn(0.5, 200) boreIn: number;
  @ApiProperty({ description: 'inches' }) @IsFiniteNumberIn(0.5, 300) strokeIn: number;
  @ApiProperty({ description: 'inches' }) @IsFiniteNumberIn(0, 50) pistonRodIn: number;
  @ApiProperty({ description: 'inches, 0 if none' }) @IsFiniteNumberIn(0, 50) tailRodIn: number;
  @ApiProperty({ description: 'percent of swept volume' }) @IsFiniteNumberIn(0, 50) clearancePercent: number;
}

export class LubricationPointWriteDto implements LubricationPointDto {
  @IsOptional() @IsUUID('all', { message: 'id must be a UUID' }) id?: string;
  @ApiProperty() @IsString() @MinLength(1) @MaxLength(80) label: string;
  @ApiProperty({ enum: LUBRICATION_KINDS }) @IsIn(LUBRICATION_KINDS, oneOf(LUBRICATION_KINDS)) kind: LubricationKind;
  @ApiProperty() @IsString() @MaxLength(80) oilGrade: string;
}

export class BearingWriteDto implements BearingDto {
  @IsOptional() @IsUUID('all', { message: 'id must be a UUID' }) id?: string;
  @ApiProperty() @IsString() @MinLength(1) @MaxLength(80) label: string;
  @ApiProperty({ enum: BEARING_KINDS }) @IsIn(BEARING_KINDS, oneOf(BEARING_KINDS)) kind: BearingKind;
  @ApiProperty({ description: 'inches' }) @IsFiniteNumberIn(0.1, 100) journalDiameterIn: number;
  @ApiProperty({ description: 'inches' }) @IsFiniteNumberIn(0.1, 200) journalLengthIn: number;
  @ApiProperty({ description: 'percent' }) @IsFiniteNumberIn(0, 100) loadSharePercent: number;
  @ApiPropertyOptional({ description: 'inches' }) @IsOptional() @IsFiniteNumberIn(0.0001, 1) radialClearanceIn?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(80) lubricationPointLabel?: string | null;
  @IsOptional() @IsUUID('all', { message: 'lubricationPointId must be a UUID' }) lubricationPointId?: string | null;
}

export class MeasurementPointWriteDto implements MeasurementPointDto {
  @IsOptional() @IsUUID('all', { message: 'id must be a UUID' }) id?: string;
  @ApiProperty({ example: 'MB1-T' })
  @Matches(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,23}$/, { message: 'code must be 1 to 24 letters, digits, dot, dash or underscore' })
  code: string;
  @ApiProperty() @IsString() @MinLength(1) @MaxLength(120) label: string;
  @ApiProperty({ enum: MEASUREMENT_KINDS }) @IsIn(MEASUREMENT_KINDS, oneOf(MEASUREMENT_KINDS)) kind: MeasurementKind;
  @ApiProperty({ enum: MEASUREMENT_UNITS }) @IsIn(MEASUREMENT_UNITS, oneOf(MEASUREMENT_UNITS)) unit: MeasurementUnit;
  @ApiProperty() @IsInt() @Min(0) @Max(10000) sequence: number;
  @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) normalLow?: number | null;
  @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) normalHigh?: number | null;
  @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) lowLimit?: number | null;
  @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) highLimit?: number | null;
  @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) highHighLimit?: number | null;
  @IsOptional() @IsFiniteNumberIn(0, 1e6) maxRiseRatePerMin?: number | null;
  @IsOptional() @IsFiniteNumberIn(0, 1e6) maxRiseAboveAmbient?: number | null;
  @IsOptional() @IsFiniteNumberIn(0, 1e6) deadband?: number | null;
  @ApiPropertyOptional({ description: 'an absolute limit suppresses the rise-above-ambient and rate-of-rise alarms' })
  @IsOptional()
  @IsBoolean()
  relatedSuppression?: boolean;
  @ApiPropertyOptional({ enum: RUN_STATES, isArray: true, description: "run states in which the point's alarms are suppressed" })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(RUN_STATES.length)
  @IsIn(RUN_STATES, { each: true, message: `each of suppressedInStates must be one of: ${RUN_STATES.join(', ')}` })
  suppressedInStates?: RunState[];
  @IsOptional() @IsString() @MaxLength(80) bearingLabel?: string | null;
  @IsOptional() @IsUUID('all', { message: 'bearingId must be a UUID' }) bearingId?: string | null;
  @IsOptional() @IsString() @MaxLength(40) cylinderLabel?: string | null;
  @IsOptional() @IsUUID('all', { message: 'cylinderId must be a UUID' }) cylinderId?: string | null;
}

export class EngineWriteDto implements EngineWriteRequest {
  @ApiProperty({ example: 'No. 2 engine' }) @IsString() @MinLength(1) @MaxLength(120) name: string;
  @ApiProperty() @IsString() @MaxLength(200) builder: string;
  @ApiProperty() @IsString() @MaxLength(40) yearBuilt: string;
  @ApiProperty({ enum: ENGINE_TYPES }) @IsIn(ENGINE_TYPES, oneOf(ENGINE_TYPES)) type: EngineType;
  @ApiProperty() @IsFiniteNumberIn(1, 1000) ratedSpeedRpm: number;
  @ApiProperty() @IsFiniteNumberIn(1, 1000) overspeedRpm: number;
  @ApiProperty({ description: 'psig' }) @IsFiniteNumberIn(1, 3000) mawpPsig: number;
  @ApiProperty() @IsInt() @Min(1) @Max(24 * 60) preLubeFreshnessMinutes: number;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string;
  @ApiPropertyOptional({ description: 'minutes' }) @IsOptional() @IsInt() @Min(1) @Max(24 * 60) escalateAfterMinutes?: number;
  @ApiPropertyOptional({ type: [String], description: 'user ids, in the order to e-mail them' })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(20)
  @IsUUID('all', { each: true, message: 'each of callList must be a user id (UUID)' })
  callList?: string[];
  @IsOptional() @IsFiniteNumberIn(1, 1e7) flywheelMassLb?: number | null;
  @IsOptional() @IsFiniteNumberIn(0.1, 100) flywheelRadiusOfGyrationFt?: number | null;
  @IsOptional() @IsFiniteNumberIn(1, 1e7) rotatingWeightLb?: number | null;
  @ApiProperty({ type: [CylinderWriteDto] })
  @IsArray()
  @ArrayMaxSize(8)
  @ValidateNested({ each: true })
  @Type(() => CylinderWriteDto)
  cylinders: CylinderWriteDto[];
  @ApiProperty({ type: [LubricationPointWriteDto] })
  @IsArray()
  @ArrayMaxSize(200)
  @ValidateNested({ each: true })
  @Type(() => LubricationPointWriteDto)
  lubricationPoints: LubricationPointWriteDto[];
  @ApiProperty({ type: [BearingWriteDto] })
  @IsArray()
  @ArrayMaxSize(100)
  @ValidateNested({ each: true })
  @Type(() => BearingWriteDto)
  bearings: BearingWriteDto[];
  @ApiProperty({ type: [MeasurementPointWriteDto] })
  @IsArray()
  @ArrayMaxSize(500)
  @ValidateNested({ each: true })
  @Type(() => MeasurementPointWriteDto)
  measurementPoints: MeasurementPointWriteDto[];
}
