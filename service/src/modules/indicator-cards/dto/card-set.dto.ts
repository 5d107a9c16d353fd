import { ApiProperty, ApiPropertyOptional, OmitType, PartialType } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsDateString,
  IsIn,
  IsNumber,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  BRAKE_METHODS,
  CYLINDER_ENDS,
  TRACE_ORIGINS,
  type AmendBrakeFigureRequest,
  type AmendCardRequest,
  type AmendCardSetRequest,
  type BrakeFigureInput,
  type BrakeMethod,
  type CardInput,
  type CreateCardSetRequest,
  type CylinderEnd,
  type TraceOrigin,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { IsPositiveNumberUpTo } from './validators.js';
import { CardTraceDto } from './calculations.dto.js';

const REASON = { message: 'reason must say why (at least 3 characters)' };

/** One card of a set: exactly one way to its mean height (checked by the service, which names the field). */
export class CardInputDto implements CardInput {
  @ApiProperty({ description: "The engine's cylinder" }) @IsUUID('all', { message: 'cylinderId must be a UUID' }) cylinderId: string;
  @ApiProperty({ enum: CYLINDER_ENDS })
  @IsIn(CYLINDER_ENDS, { message: `end must be one of: ${CYLINDER_ENDS.join(', ')}` })
  end: CylinderEnd;
  @ApiPropertyOptional({ description: 'Spring scale, psi per inch of height' }) @IsOptional() @IsPositiveNumberUpTo(2000) springPsiPerIn?:
    number | null;
  @ApiPropertyOptional({ description: 'Length of the diagram, in' }) @IsOptional() @IsPositiveNumberUpTo(20) lengthIn?: number | null;
  @ApiPropertyOptional({ description: 'Planimeter area, in² (one way)' }) @IsOptional() @IsFiniteNumberIn(0, 200) areaSqIn?: number | null;
  @ApiPropertyOptional({ description: 'Mid-ordinates, in (one way)', type: [Number] })
  @IsOptional()
  @IsArray({ message: 'ordinatesIn must be a list of numbers' })
  @ArrayMinSize(2, { message: 'ordinatesIn needs at least two ordinates' })
  @ArrayMaxSize(100)
  @IsNumber({ allowNaN: false, allowInfinity: false }, { each: true, message: 'ordinatesIn must hold only numbers' })
  ordinatesIn?: number[] | null;
  @ApiPropertyOptional({ description: 'Mean effective pressure, psi (one way)' })
  @IsOptional()
  @IsFiniteNumberIn(-500, 5000)
  meanEffectivePressurePsi?: number | null;
  @ApiPropertyOptional({ description: 'The uploaded image the trace was made on' })
  @IsOptional()
  @IsUUID('all', { message: 'imageId must be a UUID' })
  imageId?: string | null;
  @ApiPropertyOptional({ type: CardTraceDto, description: 'The trace (one way; with imageId and springPsiPerIn)' })
  @IsOptional()
  @ValidateNested()
  @Type(() => CardTraceDto)
  trace?: CardTraceDto | null;
  @ApiPropertyOptional({
    enum: TRACE_ORIGINS,
    description: "Where the trace came from: the automatic tracer's proposal accepted, the proposal adjusted, or traced by hand",
  })
  @IsOptional()
  @IsIn(TRACE_ORIGINS, { message: `traceOrigin must be one of: ${TRACE_ORIGINS.join(', ')}` })
  traceOrigin?: TraceOrigin | null;
  @ApiPropertyOptional({ description: "This end's cut-off where it differs from the set's, percent of stroke" })
  @IsOptional()
  @IsFiniteNumberIn(1, 100)
  cutOffPercent?: number | null;
  @ApiPropertyOptional({ description: 'Where compression begins, percent of stroke from the admission end' })
  @IsOptional()
  @IsFiniteNumberIn(0, 90)
  compressionPercent?: number | null;
  @ApiPropertyOptional({ description: 'Admission pressure read off the card, psig' })
  @IsOptional()
  @IsFiniteNumberIn(-15, 5000)
  admissionPressurePsig?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string | null;
}

export class CreateCardSetDto implements CreateCardSetRequest {
  @ApiProperty({ description: 'When the set was taken', example: '2026-06-13T11:30:00Z' })
  @IsDateString({}, { message: 'takenAt must be an ISO date-time' })
  takenAt: string;
  @ApiPropertyOptional({ description: 'rpm; leave out to use the nearest speed reading' })
  @IsOptional()
  @IsPositiveNumberUpTo(1000)
  speedRpm?: number | null;
  @ApiPropertyOptional({ description: 'Cut-off setting, percent of stroke' }) @IsOptional() @IsFiniteNumberIn(1, 100) cutOffPercent?:
    number | null;
  @ApiPropertyOptional({ description: 'psig; leave out to use the nearest reading' })
  @IsOptional()
  @IsFiniteNumberIn(-15, 5000)
  throttlePressurePsig?: number | null;
  @ApiPropertyOptional({ description: 'psig; leave out to use the nearest reading' })
  @IsOptional()
  @IsFiniteNumberIn(-15, 5000)
  receiverPressurePsig?: number | null;
  @ApiPropertyOptional({ description: 'inHg; leave out to use the nearest reading' }) @IsOptional() @IsFiniteNumberIn(0, 30) vacuumInHg?:
    number | null;
  @ApiPropertyOptional({
    description:
      "The site barometer, inHg absolute; leave out to use the run's nearest barometer reading, else the standard atmosphere (29.92 inHg)",
  })
  @IsOptional()
  @IsFiniteNumberIn(20, 32)
  barometerInHg?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string | null;
  @ApiProperty({ type: [CardInputDto], description: 'One card per cylinder end (more may be added later)' })
  @IsArray({ message: 'cards must be a list' })
  @ArrayMaxSize(16)
  @ValidateNested({ each: true })
  @Type(() => CardInputDto)
  cards: CardInputDto[];
}

export class AmendCardSetDto extends PartialType(OmitType(CreateCardSetDto, ['cards'] as const)) implements AmendCardSetRequest {
  @ApiProperty() @IsString() @MinLength(3, REASON) @MaxLength(1000) reason: string;
}

export class AmendCardDto extends OmitType(CardInputDto, ['cylinderId', 'end'] as const) implements AmendCardRequest {
  @ApiProperty() @IsString() @MinLength(3, REASON) @MaxLength(1000) reason: string;
}

export class CreateBrakeFigureDto implements BrakeFigureInput {
  @ApiProperty({ description: 'When the figure was measured' })
  @IsDateString({}, { message: 'measuredAt must be an ISO date-time' })
  measuredAt: string;
  @ApiProperty({ enum: BRAKE_METHODS })
  @IsIn(BRAKE_METHODS, { message: `method must be one of: ${BRAKE_METHODS.join(', ')}` })
  method: BrakeMethod;
  @ApiPropertyOptional({ description: 'direct: measured output, hp' }) @IsOptional() @IsPositiveNumberUpTo(100000) brakeHorsepower?:
    number | null;
  @ApiPropertyOptional({ description: 'rope_brake: dead load less spring balance, lbf' })
  @IsOptional()
  @IsPositiveNumberUpTo(10000000)
  netBrakeLoadLbf?: number | null;
  @ApiPropertyOptional({ description: 'rope_brake: drum diameter, ft' }) @IsOptional() @IsPositiveNumberUpTo(100) drumDiameterFt?:
    number | null;
  @ApiPropertyOptional({ description: 'rope_brake: rope diameter, ft' }) @IsOptional() @IsFiniteNumberIn(0, 5) ropeDiameterFt?:
    number | null;
  @ApiPropertyOptional({ description: 'torque: shaft torque, lbf·ft' }) @IsOptional() @IsPositiveNumberUpTo(100000000) torqueLbfFt?:
    number | null;
  @ApiPropertyOptional({ description: 'rope_brake and torque: shaft speed, rpm' }) @IsOptional() @IsPositiveNumberUpTo(1000) speedRpm?:
    number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string | null;
}

export class AmendBrakeFigureDto extends PartialType(CreateBrakeFigureDto) implements AmendBrakeFigureRequest {
  @ApiProperty() @IsString() @MinLength(3, REASON) @MaxLength(1000) reason: string;
}

export class RunIdParamDto {
  @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
}
