import { ApiProperty } from '@nestjs/swagger';
import { IsString, MaxLength, MinLength } from 'class-validator';
import { MIN_PASSWORD_LENGTH, type AcceptInvitationRequest } from '@crankjournal/shared-types';

export class AcceptInvitationDto implements AcceptInvitationRequest {
  @ApiProperty()
  @IsString()
  @MinLength(10)
  @MaxLength(200)
  token: string;

  @ApiProperty({ minLength: MIN_PASSWORD_LENGTH })
  @IsString()
  @MinLength(MIN_PASSWORD_LENGTH, { message: `the password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  @MaxLength(200)
  password: string;
}
