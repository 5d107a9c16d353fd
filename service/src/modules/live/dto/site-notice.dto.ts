import { ApiProperty } from '@nestjs/swagger';
import { IsString, MaxLength, MinLength } from 'class-validator';

export class SiteNoticeDto {
  @ApiProperty({ example: 'Engine house closes at four today.' })
  @IsString()
  @MinLength(1, { message: 'message must not be empty' })
  @MaxLength(500)
  message: string;
}
