import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsDefined,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  PRODUCT_SHAPES,
  type ProductShape,
  type ScheduleCopyRequest,
  type SchedulePassInput,
  type ScheduleWriteRequest,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { SectionBodyDto, oneOf } from './section.dto.js';

export class SchedulePassBodyDto implements SchedulePassInput {
  @ApiProperty({ description: "the stand's position in the mill (1 = first)" })
  @IsInt({ message: 'standPosition must be a whole number' })
  @Min(1)
  @Max(12)
  standPosition: number;
  @ApiProperty({ type: SectionBodyDto })
  @IsDefined({ message: 'entry is required' })
  @ValidateNested()
  @Type(() => SectionBodyDto)
  entry: SectionBodyDto;
  @ApiProperty({ type: SectionBodyDto })
  @IsDefined({ message: 'exit is required' })
  @ValidateNested()
  @Type(() => SectionBodyDto)
  exit: SectionBodyDto;
  @ApiProperty({ description: '°C', example: 1100 }) @IsFiniteNumberIn(500, 1400) expectedTemperatureC: number;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(1000) notes?: string;
}

export class ScheduleWriteDto implements ScheduleWriteRequest {
  @ApiProperty() @IsUUID('all', { message: 'millId must be a UUID' }) millId: string;
  @ApiProperty({ example: '3 in square to 1½ in round' })
  @IsString()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(160)
  name: string;
  @ApiProperty() @IsBoolean({ message: 'isTemplate must be true or false' }) isTemplate: boolean;
  @ApiProperty({ enum: PRODUCT_SHAPES }) @IsIn(PRODUCT_SHAPES, oneOf(PRODUCT_SHAPES)) productShape: ProductShape;
  @ApiProperty({ description: 'product thickness, side or diameter, mm' }) @IsFiniteNumberIn(1, 1000) productHeightMm: number;
  @ApiProperty({ description: 'product width (= height for square and round), mm' }) @IsFiniteNumberIn(1, 2000) productWidthMm: number;
  @ApiProperty({ example: 'Mild steel, 0.20 % C' })
  @IsString()
  @MinLength(1, { message: 'steelGrade must not be empty' })
  @MaxLength(120)
  steelGrade: string;
  @ApiProperty({ description: 'carbon, weight % (for the flow stress)', example: 0.2 }) @IsFiniteNumberIn(0, 2.1) carbonPct: number;
  @ApiProperty({ type: SectionBodyDto })
  @IsDefined({ message: 'stock is required' })
  @ValidateNested()
  @Type(() => SectionBodyDto)
  stock: SectionBodyDto;
  @ApiProperty({ description: 'mm', example: 1500 }) @IsFiniteNumberIn(50, 30000) stockLengthMm: number;
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'lotId must be a UUID' }) lotId?: string | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string;
  @ApiPropertyOptional() @IsOptional() @IsBoolean({ message: 'archived must be true or false' }) archived?: boolean;
  @ApiProperty({ type: [SchedulePassBodyDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'a schedule needs at least one pass' })
  @ArrayMaxSize(40)
  @ValidateNested({ each: true })
  @Type(() => SchedulePassBodyDto)
  passes: SchedulePassBodyDto[];
}

export class ScheduleCopyDto implements ScheduleCopyRequest {
  @ApiProperty() @IsString() @MinLength(1, { message: 'name must not be empty' }) @MaxLength(160) name: string;
  @ApiPropertyOptional({ description: 'keep the copy as a template too (default false: a working schedule)' })
  @IsOptional()
  @IsBoolean({ message: 'isTemplate must be true or false' })
  isTemplate?: boolean;
  @ApiPropertyOptional({ description: 'the mill to plan on (default the template’s); stands are matched by position' })
  @IsOptional()
  @IsUUID('all', { message: 'millId must be a UUID' })
  millId?: string;
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'lotId must be a UUID' }) lotId?: string | null;
}

export class ScheduleQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the schedules of this mill' })
  @IsOptional()
  @IsUUID('all', { message: 'millId must be a UUID' })
  millId?: string;
  @ApiPropertyOptional({ description: 'true: templates only; false: working schedules only' })
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean({ message: 'templates must be true or false' })
  templates?: boolean;
}
