import { ApiProperty, ApiPropertyOptional, PartialType } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsDateString,
  IsEmail,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  IsUUID,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import {
  LOT_STATUSES,
  PRODUCT_SHAPES,
  type LinkRunRequest,
  type LotStatus,
  type LotTransitionRequest,
  type LotUpdateRequest,
  type LotWriteRequest,
  type ProductShape,
  type QuoteRequest,
  type SendQuoteRequest,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { oneOf } from './section.dto.js';
import { FixedCostDto } from './mill-write.dto.js';

export class LotWriteDto implements LotWriteRequest {
  @ApiProperty({ example: 'The Guild of Forge Smiths' })
  @IsString()
  @MinLength(1, { message: 'customerName must not be empty' })
  @MaxLength(160)
  customerName: string;
  @ApiProperty({ example: 'orders@forge-guild.example' })
  @IsEmail({}, { message: 'customerEmail must be an e-mail address' })
  @MaxLength(254)
  customerEmail: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(160) customerContact?: string;
  @ApiProperty({ enum: PRODUCT_SHAPES }) @IsIn(PRODUCT_SHAPES, oneOf(PRODUCT_SHAPES)) productShape: ProductShape;
  @ApiProperty({ description: 'thickness, side or diameter, mm' }) @IsFiniteNumberIn(1, 1000) productHeightMm: number;
  @ApiProperty({ description: 'width (= height for square and round), mm' }) @IsFiniteNumberIn(1, 2000) productWidthMm: number;
  @ApiProperty({ example: 'Mild steel, 0.20 % C' })
  @IsString()
  @MinLength(1, { message: 'steelGrade must not be empty' })
  @MaxLength(120)
  steelGrade: string;
  @ApiPropertyOptional({ description: 'carbon, weight %' })
  @IsOptional()
  @ValidateIf((_, v) => v !== null)
  @IsFiniteNumberIn(0, 2.1)
  carbonPct?: number | null;
  @ApiProperty({ description: 'tonnes', example: 3.2 }) @IsFiniteNumberIn(0.01, 1000) quantityTonnes: number;
  @ApiProperty({ example: '2026-07-31' })
  @IsDateString({ strict: true }, { message: 'dueDate must be a date like 2026-07-31' })
  dueDate: string;
  @ApiPropertyOptional() @IsOptional() @IsUUID('all', { message: 'millId must be a UUID' }) millId?: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(5000) notes?: string;
}

export class LotUpdateDto extends PartialType(LotWriteDto) implements LotUpdateRequest {
  @ApiPropertyOptional({ description: 'tonnes produced' }) @IsOptional() @IsFiniteNumberIn(0, 1000) producedTonnes?: number;
  @ApiPropertyOptional({ description: 'tonnes scrapped' }) @IsOptional() @IsFiniteNumberIn(0, 1000) scrappedTonnes?: number;
}

export class LotTransitionDto implements LotTransitionRequest {
  @ApiProperty({ enum: LOT_STATUSES }) @IsIn(LOT_STATUSES, oneOf(LOT_STATUSES)) to: LotStatus;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) note?: string;
  @ApiPropertyOptional({ description: 'chief engineer: put an unpaid lot on the roll plan, with this reason' })
  @IsOptional()
  @IsString()
  @MinLength(3, { message: 'overrideReason must say why (at least 3 characters)' })
  @MaxLength(2000)
  overrideReason?: string;
}

export class LinkRunDto implements LinkRunRequest {
  @ApiProperty() @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
}

export class QuoteRequestDto implements QuoteRequest {
  @ApiProperty({ description: 'engine hours the lot needs', example: 5 }) @IsFiniteNumberIn(0, 1000) engineHours: number;
  @ApiProperty({ description: 'crew hours (each person)', example: 8 }) @IsFiniteNumberIn(0, 2000) crewHours: number;
  @ApiPropertyOptional({ description: "defaults to the site's crew size" })
  @IsOptional()
  @IsInt({ message: 'crewSize must be a whole number' })
  @Min(1)
  @Max(100)
  crewSize?: number;
  @ApiPropertyOptional({ description: "tonnes of product; defaults to the lot's quantity" })
  @IsOptional()
  @IsFiniteNumberIn(0.01, 1000)
  productTonnes?: number;
  @ApiPropertyOptional({ type: [FixedCostDto], description: "added to the site's fixed costs" })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(20)
  @ValidateNested({ each: true })
  @Type(() => FixedCostDto)
  extraFixedCosts?: FixedCostDto[];
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

export class SendQuoteDto implements SendQuoteRequest {
  @ApiPropertyOptional({ description: "defaults to the lot's customer e-mail" })
  @IsOptional()
  @IsEmail({}, { message: 'to must be an e-mail address' })
  @MaxLength(254)
  to?: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(4000) message?: string;
}

export class LotQueryDto {
  @ApiPropertyOptional({ enum: LOT_STATUSES, description: 'Only the lots in this state' })
  @IsOptional()
  @IsIn(LOT_STATUSES, oneOf(LOT_STATUSES))
  status?: LotStatus;
}

export class LotRunParamDto {
  @IsUUID('all', { message: 'id must be a UUID' }) id: string;
  @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
}

export class MillRunIdParamDto {
  @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
}
