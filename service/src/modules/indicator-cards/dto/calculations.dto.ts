import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsIn,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  MaxLength,
  ValidateNested,
} from 'class-validator';
import {
  CYLINDER_ENDS,
  type CardTrace,
  type CylinderEnd,
  type IndicatedPowerCardInput,
  type IndicatedPowerCylinderInput,
  type IndicatedPowerEndResult,
  type IndicatedPowerCylinderResult,
  type IndicatedPowerRequest,
  type IndicatedPowerResponse,
  type TraceCalibrationRequest,
  type TraceCalibrationResponse,
  type TracePoint,
  type CardOutlinePointDto,
  type IndicatorAutotraceResponse,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { IsPositiveNumberUpTo } from './validators.js';

const endMessage = { message: `end must be one of: ${CYLINDER_ENDS.join(', ')}` };

/** One card: exactly one of meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ordinatesIn with springPsiPerIn. */
export class IndicatedPowerCardDto implements IndicatedPowerCardInput {
  @ApiProperty({ enum: CYLINDER_ENDS, description: 'head (less any tail rod) or crank (less the piston rod)' })
  @IsIn(CYLINDER_ENDS, endMessage)
  end: CylinderEnd;
  @ApiPropertyOptional({ description: 'Mean effective pressure, psi (one way)', example: 12.4 })
  @IsOptional()
  @IsFiniteNumberIn(-1000, 10000)
  meanEffectivePressurePsi?: number;
  @ApiPropertyOptional({ description: 'Planimeter area of the card, in² (one way; with lengthIn and springPsiPerIn)', example: 2.6 })
  @IsOptional()
  @IsFiniteNumberIn(0, 1000)
  areaSqIn?: number;
  @ApiPropertyOptional({ description: 'Length of the card, in', example: 3.6 })
  @IsOptional()
  @IsPositiveNumberUpTo(100)
  lengthIn?: number;
  @ApiPropertyOptional({ description: 'Spring scale, psi per inch of height', example: 60 })
  @IsOptional()
  @IsPositiveNumberUpTo(10000)
  springPsiPerIn?: number;
  @ApiPropertyOptional({
    description: 'Mid-ordinates, in (one way; with springPsiPerIn); ten is usual, any number of two or more',
    type: [Number],
  })
  @IsOptional()
  @IsArray({ message: 'ordinatesIn must be a list of numbers' })
  @ArrayMinSize(2, { message: 'ordinatesIn needs at least two ordinates' })
  @ArrayMaxSize(200)
  @IsNumber({ allowNaN: false, allowInfinity: false }, { each: true, message: 'ordinatesIn must hold only numbers' })
  ordinatesIn?: number[];
}

export class IndicatedPowerCylinderDto implements IndicatedPowerCylinderInput {
  @ApiProperty({ example: 'HP' }) @IsString({ message: 'label must be text' }) @MaxLength(40) label: string;
  @ApiProperty({ description: 'in', example: 22.57 }) @IsPositiveNumberUpTo(500) boreIn: number;
  @ApiProperty({ description: 'Piston rod (crank end), in; 0 if none', example: 4 }) @IsFiniteNumberIn(0, 500) pistonRodIn: number;
  @ApiProperty({ description: 'Tail rod (head end), in; 0 if none', example: 0 }) @IsFiniteNumberIn(0, 500) tailRodIn: number;
  @ApiPropertyOptional({ description: "This cylinder's stroke where it differs from the engine's, in" })
  @IsOptional()
  @IsPositiveNumberUpTo(1000)
  strokeIn?: number;
  @ApiProperty({ type: [IndicatedPowerCardDto], description: 'One card per end it reports (head, crank or both)' })
  @IsArray({ message: 'cards must be a list' })
  @ArrayMinSize(1, { message: 'cards needs at least one card' })
  @ArrayMaxSize(2, { message: 'cards holds at most two cards (head and crank)' })
  @ValidateNested({ each: true })
  @Type(() => IndicatedPowerCardDto)
  cards: IndicatedPowerCardDto[];
}

export class IndicatedPowerRequestDto implements IndicatedPowerRequest {
  @ApiProperty({ description: 'Engine speed, rpm', example: 40 }) @IsPositiveNumberUpTo(10000) rpm: number;
  @ApiProperty({ description: 'Stroke, in', example: 66 }) @IsPositiveNumberUpTo(1000) strokeIn: number;
  @ApiProperty({ type: [IndicatedPowerCylinderDto] })
  @IsArray({ message: 'cylinders must be a list' })
  @ArrayMinSize(1, { message: 'cylinders needs at least one cylinder' })
  @ArrayMaxSize(8)
  @ValidateNested({ each: true })
  @Type(() => IndicatedPowerCylinderDto)
  cylinders: IndicatedPowerCylinderDto[];
}

export class IndicatedPowerEndResultDto implements IndicatedPowerEndResult {
  @ApiProperty({ enum: CYLINDER_ENDS }) end: CylinderEnd;
  @ApiProperty({ description: 'psi' }) meanEffectivePressurePsi: number;
  @ApiProperty({ description: 'in²' }) effectiveAreaSqIn: number;
  @ApiProperty({ description: 'hp' }) indicatedHorsepower: number;
}
export class IndicatedPowerCylinderResultDto implements IndicatedPowerCylinderResult {
  @ApiProperty() label: string;
  @ApiProperty({ description: 'hp' }) indicatedHorsepower: number;
  @ApiProperty({ type: [IndicatedPowerEndResultDto] }) ends: IndicatedPowerEndResultDto[];
}
export class MissingEndDto {
  @ApiProperty() cylinderLabel: string;
  @ApiProperty({ enum: CYLINDER_ENDS }) end: CylinderEnd;
}

export class IndicatedPowerResponseDto implements IndicatedPowerResponse {
  @ApiProperty({ type: [IndicatedPowerCylinderResultDto] }) cylinders: IndicatedPowerCylinderResultDto[];
  @ApiProperty({ description: 'Every end of every cylinder has a card; when false the totals are the sum of the cards present' })
  complete: boolean;
  @ApiProperty({ type: [MissingEndDto], description: 'The ends without a card' }) missingEnds: MissingEndDto[];
  @ApiProperty({ description: 'hp (the sum of the cards present when the set is not complete)' }) totalIndicatedHorsepower: number;
  @ApiProperty({ description: 'kW (the sum of the cards present when the set is not complete)' }) totalIndicatedKilowatts: number;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: "Every cylinder's work referred to the largest cylinder's area, psi; null for an incomplete set",
  })
  referredMeanEffectivePressurePsi: number | null;
  @ApiProperty({ type: String, nullable: true, description: 'Why the referred MEP is absent' })
  referredMeanEffectivePressureMissing: string | null;
}

// ---------------------------------------------------------------------------------------------
// Traces
// ---------------------------------------------------------------------------------------------

export class TracePointDto implements TracePoint {
  @ApiProperty({ description: 'image pixels, to the right' }) @IsFiniteNumberIn(-100000, 100000) x: number;
  @ApiProperty({ description: 'image pixels, downward' }) @IsFiniteNumberIn(-100000, 100000) y: number;
}

export class CardTraceDto implements CardTrace {
  @ApiProperty({ type: [TracePointDto], description: 'Two points on the atmospheric line' })
  @IsArray({ message: 'atmosphericLine must be a list of two points' })
  @ArrayMinSize(2, { message: 'atmosphericLine needs two points' })
  @ArrayMaxSize(2, { message: 'atmosphericLine needs two points' })
  @ValidateNested({ each: true })
  @Type(() => TracePointDto)
  atmosphericLine: [TracePointDto, TracePointDto];
  @ApiProperty({ type: TracePointDto, description: 'The admission end of the diagram (stroke 0)' })
  @IsObject({ message: 'admissionEndPx must be a point { x, y }' })
  @ValidateNested()
  @Type(() => TracePointDto)
  admissionEndPx: TracePointDto;
  @ApiProperty({ type: TracePointDto, description: 'The release end of the diagram (stroke 1)' })
  @IsObject({ message: 'releaseEndPx must be a point { x, y }' })
  @ValidateNested()
  @Type(() => TracePointDto)
  releaseEndPx: TracePointDto;
  @ApiProperty({ type: [TracePointDto], description: 'The outline in drawing order (closed implicitly)' })
  @IsArray({ message: 'pointsPx must be a list of points' })
  @ArrayMinSize(3, { message: 'pointsPx needs at least three points' })
  @ArrayMaxSize(2000)
  @ValidateNested({ each: true })
  @Type(() => TracePointDto)
  pointsPx: TracePointDto[];
  @ApiPropertyOptional({ description: 'Known image scale, pixels per inch' }) @IsOptional() @IsPositiveNumberUpTo(100000) pixelsPerInch?:
    number | null;
}

export class TraceCalibrationRequestDto implements TraceCalibrationRequest {
  @ApiProperty({ type: CardTraceDto })
  @IsObject({ message: 'trace must be an object (the traced points and the frame)' })
  @ValidateNested()
  @Type(() => CardTraceDto)
  trace: CardTraceDto;
  @ApiProperty({ description: 'psi per inch of height', example: 60 }) @IsPositiveNumberUpTo(10000) springPsiPerIn: number;
  @ApiPropertyOptional({ description: 'Length of the diagram on the card, in', example: 3.5 })
  @IsOptional()
  @IsPositiveNumberUpTo(100)
  lengthIn?: number;
}

export class CardOutlinePointResponseDto implements CardOutlinePointDto {
  @ApiProperty() strokeFraction: number;
  @ApiProperty({ description: 'psig' }) pressurePsig: number;
}
export class TraceCalibrationResponseDto implements TraceCalibrationResponse {
  @ApiProperty({ description: 'in²' }) areaSqIn: number;
  @ApiProperty({ description: 'in' }) lengthIn: number;
  @ApiProperty({ description: 'in' }) meanHeightIn: number;
  @ApiProperty({ description: 'psi' }) meanEffectivePressurePsi: number;
  @ApiProperty({ description: 'psig' }) admissionPressurePsig: number;
  @ApiProperty() horizontalPixelsPerInch: number;
  @ApiProperty() verticalPixelsPerInch: number;
  @ApiProperty() atmosphericLineTiltDeg: number;
  @ApiProperty({ type: [CardOutlinePointResponseDto] }) outline: CardOutlinePointResponseDto[];
}

/** Query of POST /api/calculations/indicator-autotrace: the scale of the card in the photo. */
export class IndicatorAutotraceQueryDto {
  @ApiProperty({ description: 'Length of the diagram on the card, in', example: 3.5 })
  @Type(() => Number)
  @IsPositiveNumberUpTo(20)
  lengthIn: number;
  @ApiProperty({ description: 'Spring scale, psi per inch of pen height', example: 60 })
  @Type(() => Number)
  @IsPositiveNumberUpTo(1000)
  springPsiPerIn: number;
}

export class IndicatorAutotraceResponseDto implements IndicatorAutotraceResponse {
  @ApiProperty({ description: 'The proposed trace, image pixels' }) trace: CardTrace;
  @ApiProperty({ description: 'Enclosed (net) area of the diagram, in²' }) areaIn2: number;
  @ApiProperty({ description: 'Mean effective pressure, psi' }) meanEffectivePressurePsi: number;
  @ApiProperty({ description: '0 (nothing to go on) to 1 (a clean card)' }) confidence: number;
  @ApiProperty({ description: 'Why the confidence is below 1', type: [String] }) warnings: string[];
}
