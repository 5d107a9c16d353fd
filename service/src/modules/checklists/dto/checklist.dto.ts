import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsISO8601, IsOptional, IsString, IsUUID, Matches, MaxLength, MinLength } from 'class-validator';
import type {
  AmendChecklistRequest,
  FillChecklistItemRequest,
  OverrideChecklistItemRequest,
  SignChecklistRequest,
  StartChecklistRequest,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { KEY_PATTERN } from '../checklist-rules.js';

export class StartChecklistDto implements StartChecklistRequest {
  @ApiProperty() @IsUUID('all', { message: 'templateId must be a UUID' }) templateId: string;
}

/** Only the field of the item's kind may be given; null clears it. */
export class FillChecklistItemDto implements FillChecklistItemRequest {
  @ApiPropertyOptional() @IsOptional() @IsBoolean({ message: 'tick must be true or false' }) tick?: boolean | null;
  @ApiPropertyOptional() @IsOptional() @IsFiniteNumberIn(-1e9, 1e9) value?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(200) choice?: string | null;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(4000) text?: string | null;
}

export class OverrideChecklistItemDto implements OverrideChecklistItemRequest {
  @ApiProperty()
  @IsString()
  @MinLength(5, { message: 'reason must say why the value is acceptable today (at least 5 characters)' })
  @MaxLength(1000)
  reason: string;
}

export class SignChecklistDto implements SignChecklistRequest {
  @ApiProperty({ description: 'the signer’s password or signing PIN' })
  @IsString()
  @MinLength(1, { message: 'signature must be your password or signing PIN' })
  @MaxLength(200)
  signature: string;
  @ApiPropertyOptional({ description: 'when the signer signed on a tablet without a connection (ISO time)', format: 'date-time' })
  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'signedOnDeviceAt must be a time like 2026-12-05T10:15:00Z' })
  signedOnDeviceAt?: string;
}

export class AmendChecklistDto extends FillChecklistItemDto implements AmendChecklistRequest {
  @ApiProperty() @IsString() @Matches(KEY_PATTERN, { message: 'itemKey is not an item key' }) itemKey: string;
  @ApiProperty() @IsString() @MinLength(3, { message: 'reason must say why (at least 3 characters)' }) @MaxLength(1000) reason: string;
  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MinLength(5, { message: 'overrideReason must say why the value is acceptable (at least 5 characters)' })
  @MaxLength(1000)
  overrideReason?: string;
}

export class ChecklistItemParamDto {
  @IsUUID('all', { message: 'id must be a UUID' }) id: string;
  @IsString() @Matches(KEY_PATTERN, { message: 'itemKey is not an item key' }) itemKey: string;
}
