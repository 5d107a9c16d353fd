import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsDefined,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import type { MillSettings, MillStandDto, MillWriteRequest, QuoteRates } from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

export class MillStandWriteDto implements MillStandDto {
  @IsOptional() @IsUUID('all', { message: 'id must be a UUID' }) id?: string;
  @ApiProperty({ description: '1 = the first stand the bar meets' })
  @IsInt({ message: 'position must be a whole number' })
  @Min(1)
  @Max(12)
  position: number;
  @ApiProperty({ example: 'Roughing stand' }) @IsString() @MinLength(1, { message: 'name must not be empty' }) @MaxLength(80) name: string;
  @ApiProperty({ description: 'mm', example: 406.4 }) @IsFiniteNumberIn(50, 2000) rollDiameterMm: number;
  @ApiProperty({ description: 'mm', example: 762 }) @IsFiniteNumberIn(50, 5000) barrelLengthMm: number;
  @ApiProperty({ description: 'roll speed ÷ engine speed', example: 1 }) @IsFiniteNumberIn(0.05, 20) rollSpeedRatio: number;
  @ApiProperty({ description: 'kN', example: 1200 }) @IsFiniteNumberIn(1, 100000) maxSeparatingForceKn: number;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

export class MillSettingsDto implements MillSettings {
  @ApiProperty({ description: 'fraction of rated speed, e.g. 0.9' }) @IsFiniteNumberIn(0.5, 1) minSpeedFraction: number;
  @ApiProperty({ description: 'fraction, e.g. 0.88' }) @IsFiniteNumberIn(0.3, 1) mechanicalEfficiency: number;
  @ApiProperty({ description: 'hp' }) @IsFiniteNumberIn(0, 20000) baseLoadHp: number;
  @ApiProperty({ description: 'hp, used when the run has no indicator card figure' })
  @IsFiniteNumberIn(1, 20000)
  defaultIndicatedHp: number;
  @ApiProperty({ description: '1 = frictionless; 1.2 allows about 20 % for friction' }) @IsFiniteNumberIn(1, 2) frictionFactor: number;
}

export class FixedCostDto {
  @ApiProperty() @IsString() @MinLength(1, { message: 'a fixed cost needs a label' }) @MaxLength(120) label: string;
  @ApiProperty() @IsFiniteNumberIn(0, 1e7) amount: number;
}

export class QuoteRatesDto implements QuoteRates {
  @ApiProperty({ example: 'GBP' }) @Matches(/^[A-Z]{3}$/, { message: 'currency must be a three-letter code such as GBP' }) currency: string;
  @ApiProperty({ description: 'per tonne of stock' }) @IsFiniteNumberIn(0, 1e6) stockRatePerTonne: number;
  @ApiProperty({ description: 'percent of the stock weight lost' }) @IsFiniteNumberIn(0, 60) yieldLossPct: number;
  @ApiProperty({ description: 'per engine hour' }) @IsFiniteNumberIn(0, 1e6) engineRatePerHour: number;
  @ApiProperty({ description: 'per person-hour' }) @IsFiniteNumberIn(0, 1e5) crewRatePerPersonHour: number;
  @ApiProperty() @IsInt({ message: 'crewSize must be a whole number' }) @Min(1) @Max(100) crewSize: number;
  @ApiProperty({ type: [FixedCostDto] })
  @IsArray()
  @ArrayMaxSize(20)
  @ValidateNested({ each: true })
  @Type(() => FixedCostDto)
  fixedCosts: FixedCostDto[];
  @ApiProperty({ description: 'percent' }) @IsFiniteNumberIn(0, 100) contingencyPct: number;
  @ApiProperty({ description: 'percent' }) @IsFiniteNumberIn(0, 200) marginPct: number;
}

export class MillWriteDto implements MillWriteRequest {
  @ApiProperty({ example: 'Bar mill' }) @IsString() @MinLength(1, { message: 'name must not be empty' }) @MaxLength(120) name: string;
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string;
  @ApiProperty({ type: [MillStandWriteDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'a mill needs at least one stand' })
  @ArrayMaxSize(12)
  @ValidateNested({ each: true })
  @Type(() => MillStandWriteDto)
  stands: MillStandWriteDto[];
  @ApiProperty({ type: MillSettingsDto })
  @IsDefined({ message: 'settings is required' })
  @ValidateNested()
  @Type(() => MillSettingsDto)
  settings: MillSettingsDto;
  @ApiProperty({ type: QuoteRatesDto })
  @IsDefined({ message: 'quoteRates is required' })
  @ValidateNested()
  @Type(() => QuoteRatesDto)
  quoteRates: QuoteRatesDto;
}
