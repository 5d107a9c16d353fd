import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsIn, IsString, MaxLength, MinLength } from 'class-validator';
import { ROLES, type InviteUserRequest, type Role } from '@crankjournal/shared-types';

export class InviteUserDto implements InviteUserRequest {
  @ApiProperty({ example: 'new.stoker@alderforge.example' })
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @ApiProperty({ example: 'Ivy Tamsett' })
  @IsString()
  @MinLength(1, { message: 'displayName must not be empty' })
  @MaxLength(120)
  displayName: string;

  @ApiProperty({ enum: ROLES })
  @IsIn(ROLES, { message: `role must be one of: ${ROLES.join(', ')}` })
  role: Role;
}
