import { ApiProperty } from '@nestjs/swagger';
import { IsString, MaxLength, MinLength } from 'class-validator';
import type { RefreshRequest } from '@crankjournal/shared-types';

export class RefreshDto implements RefreshRequest {
  @ApiProperty()
  @IsString()
  @MinLength(10)
  @MaxLength(200)
  refreshToken: string;
}
