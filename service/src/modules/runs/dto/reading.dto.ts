import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsDateString,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  MinLength,
  IsObject,
} from 'class-validator';
import type { AmendReadingRequest, LoggerBatchRequest, ReadingInput, RoundRequest } from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

/** One reading. Checked row by row by the ingest service, so one bad row does not lose the rest. */
export class ReadingInputDto implements ReadingInput {
  @ApiProperty() @IsUUID('all', { message: 'clientId must be a UUID' }) clientId: string;
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'pointId must be a UUID' }) pointId?: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(24) pointCode?: string;
  @ApiProperty() @IsFiniteNumberIn(-1e9, 1e9) value: number;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(16) unit?: string;
  @ApiProperty() @IsDateString({}, { message: 'takenAt must be an ISO date-time' }) takenAt: string;
}

const MAX_BATCH = 20_000;

export class RoundDto implements RoundRequest {
  @ApiProperty() @IsDateString({}, { message: 'takenAt must be an ISO date-time' }) takenAt: string;
  /** Rows are objects; their fields are checked one by one by the ingest service. */
  @ApiProperty({ type: [ReadingInputDto] })
  @IsArray({ message: 'readings must be a list' })
  @ArrayMinSize(1, { message: 'readings must hold at least one reading' })
  @ArrayMaxSize(500)
  @IsObject({ each: true, message: 'each reading must be an object' })
  readings: ReadingInputDto[];
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string;
}

export class LoggerBatchDto implements LoggerBatchRequest {
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'runId must be a UUID' }) runId?: string;
  @ApiProperty({ type: [ReadingInputDto] })
  @IsArray({ message: 'readings must be a list' })
  @ArrayMinSize(1, { message: 'readings must hold at least one reading' })
  @ArrayMaxSize(MAX_BATCH, { message: `at most ${MAX_BATCH} readings per batch` })
  @IsObject({ each: true, message: 'each reading must be an object' })
  readings: ReadingInputDto[];
}

export class AmendReadingDto implements AmendReadingRequest {
  @ApiProperty() @IsFiniteNumberIn(-1e9, 1e9) value: number;
  @ApiProperty() @IsString() @MinLength(3, { message: 'reason must say why (at least 3 characters)' }) @MaxLength(1000) reason: string;
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'clientId must be a UUID' }) clientId?: string;
}

export class ReadingIdParamDto {
  @Type(() => String)
  @IsString()
  @MinLength(1)
  @MaxLength(19)
  id: string;
}

export class CreateLoggerDto {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiProperty({ example: 'Bearing thermocouple logger' }) @IsString() @MinLength(1) @MaxLength(80) name: string;
}
