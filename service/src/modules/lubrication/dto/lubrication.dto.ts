import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, IsUUID, MaxLength, MinLength, ValidateIf } from 'class-validator';
import {
  CONSUMPTION_METHODS,
  type AssignPointOilRequest,
  type ConsumptionEntryRequest,
  type ConsumptionMethod,
  type OilWriteRequest,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

export class OilWriteDto implements OilWriteRequest {
  @ApiProperty({ example: 'Engine oil ISO VG 150' })
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  name: string;
  @ApiProperty({ example: 'ISO VG 150' }) @IsString() @MinLength(1, { message: 'grade must not be empty' }) @MaxLength(60) grade: string;
  @ApiProperty({ description: 'cSt at 40 °C', example: 150 }) @IsFiniteNumberIn(0.5, 100_000) viscosity40cSt: number;
  @ApiProperty({ description: 'cSt at 100 °C', example: 14.5 }) @IsFiniteNumberIn(0.5, 10_000) viscosity100cSt: number;
  @ApiPropertyOptional({ description: 'kg/m³ at 15 °C' }) @IsOptional() @IsFiniteNumberIn(500, 1500) densityKgM3At15C?: number | null;
  @ApiProperty({ example: 'Typical of the grade, not a data sheet' })
  @IsString()
  @MinLength(1, { message: 'figuresSource must say where the figures come from' })
  @MaxLength(300)
  figuresSource: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

export class AssignPointOilDto implements AssignPointOilRequest {
  @ApiProperty({ nullable: true, description: 'null clears the assignment' })
  @ValidateIf((o) => o.oilId !== null)
  @IsUUID('all', { message: 'oilId must be a UUID or null' })
  oilId: string | null;
}

export class ConsumptionEntryDto implements ConsumptionEntryRequest {
  @ApiProperty() @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
  @ApiProperty() @IsUUID('all', { message: 'lubricationPointId must be a UUID' }) lubricationPointId: string;
  @ApiProperty({ enum: CONSUMPTION_METHODS, description: 'added: quantity put in; levels: reservoir contents before and after' })
  @IsIn(CONSUMPTION_METHODS, { message: `method must be one of: ${CONSUMPTION_METHODS.join(', ')}` })
  method: ConsumptionMethod;
  @ApiPropertyOptional({ description: 'litres added (method added)' }) @IsOptional() @IsFiniteNumberIn(0, 10_000) quantityLitres?:
    number | null;
  @ApiPropertyOptional({ description: 'litres in the reservoir before the run (method levels)' })
  @IsOptional()
  @IsFiniteNumberIn(0, 100_000)
  levelStartLitres?: number | null;
  @ApiPropertyOptional({ description: 'litres in the reservoir after the run (method levels)' })
  @IsOptional()
  @IsFiniteNumberIn(0, 100_000)
  levelEndLitres?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string;
}

export class AnalysisQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Judge the bearings at the conditions of this run (default: the latest run)' })
  @IsOptional()
  @IsUUID('all', { message: 'runId must be a UUID' })
  runId?: string;
}
