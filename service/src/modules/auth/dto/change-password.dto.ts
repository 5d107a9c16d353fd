import { ApiProperty } from '@nestjs/swagger';
import { IsString, Matches, MaxLength, MinLength } from 'class-validator';
import { MIN_PASSWORD_LENGTH, type ChangePasswordRequest, type SetSigningPinRequest } from '@crankjournal/shared-types';

export class ChangePasswordDto implements ChangePasswordRequest {
  @ApiProperty()
  @IsString()
  @MaxLength(200)
  currentPassword: string;

  @ApiProperty({ minLength: MIN_PASSWORD_LENGTH })
  @IsString()
  @MinLength(MIN_PASSWORD_LENGTH, { message: `the new password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  @MaxLength(200)
  newPassword: string;
}

export class SetSigningPinDto implements SetSigningPinRequest {
  @ApiProperty()
  @IsString()
  @MaxLength(200)
  currentPassword: string;

  @ApiProperty({ example: '482913' })
  @Matches(/^\d{4,8}$/, { message: 'the PIN must be 4 to 8 digits' })
  pin: string;
}
