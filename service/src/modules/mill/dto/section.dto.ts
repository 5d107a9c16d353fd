import { ApiProperty } from '@nestjs/swagger';
import { IsIn } from 'class-validator';
import { SECTION_SHAPES, type SectionDto, type SectionShape } from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

export const oneOf = (list: readonly string[]) => ({
  message: ({ property }: { property: string }) => `${property} must be one of: ${list.join(', ')}`,
});

/** A bar's cross-section in millimetres (a round: height = width = diameter). */
export class SectionBodyDto implements SectionDto {
  @ApiProperty({ enum: SECTION_SHAPES }) @IsIn(SECTION_SHAPES, oneOf(SECTION_SHAPES)) shape: SectionShape;
  @ApiProperty({ description: 'mm', example: 76.2 }) @IsFiniteNumberIn(1, 1000) heightMm: number;
  @ApiProperty({ description: 'mm', example: 76.2 }) @IsFiniteNumberIn(1, 2000) widthMm: number;
}
