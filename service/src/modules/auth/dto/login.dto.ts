import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import type { LoginRequest } from '@crankjournal/shared-types';

export class LoginDto implements LoginRequest {
  @ApiProperty({ example: 'operator@alderforge.example' })
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @ApiProperty({ example: 'crankjournal-demo' })
  @IsString()
  @MinLength(1, { message: 'password must not be empty' })
  @MaxLength(200)
  password: string;
}
