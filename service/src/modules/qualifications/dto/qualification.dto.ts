import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  MaxLength,
  MinLength,
  Validate,
  ValidatorConstraint,
  type ValidationArguments,
  type ValidatorConstraintInterface,
} from 'class-validator';
import {
  DUTIES,
  type Duty,
  type GrantQualificationRequest,
  type RenewQualificationRequest,
  type WithdrawQualificationRequest,
} from '@crankjournal/shared-types';
import { isCalendarDate } from '../qualification-rules.js';

@ValidatorConstraint({ name: 'calendarDate' })
export class CalendarDateConstraint implements ValidatorConstraintInterface {
  validate(v: unknown) {
    return typeof v === 'string' && isCalendarDate(v);
  }
  defaultMessage(args?: ValidationArguments) {
    return `${args?.property ?? 'date'} must be a date like 2026-12-05`;
  }
}

export class GrantQualificationDto implements GrantQualificationRequest {
  @ApiProperty() @IsUUID('all', { message: 'userId must be a UUID' }) userId: string;
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiProperty({ enum: DUTIES }) @IsIn(DUTIES, { message: `duty must be one of: ${DUTIES.join(', ')}` }) duty: Duty;
  @ApiProperty({ example: '2026-03-01' }) @Validate(CalendarDateConstraint) grantedOn: string;
  @ApiProperty({ example: '2027-02-28' }) @Validate(CalendarDateConstraint) expiresOn: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

export class RenewQualificationDto implements RenewQualificationRequest {
  @ApiPropertyOptional({ example: '2026-12-05' }) @IsOptional() @Validate(CalendarDateConstraint) grantedOn?: string;
  @ApiProperty({ example: '2027-12-04' }) @Validate(CalendarDateConstraint) expiresOn: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(2000) notes?: string;
}

export class WithdrawQualificationDto implements WithdrawQualificationRequest {
  @ApiProperty() @IsString() @MinLength(3, { message: 'reason must say why (at least 3 characters)' }) @MaxLength(1000) reason: string;
}

export class QualificationQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the qualifications of this person' })
  @IsOptional()
  @IsUUID('all', { message: 'userId must be a UUID' })
  userId?: string;
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the qualifications on this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ type: Boolean, description: 'true: withdrawn qualifications too' })
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean({ message: 'includeWithdrawn must be true or false' })
  includeWithdrawn?: boolean;
}

export class MatrixQueryDto {
  @ApiProperty({ format: 'uuid', description: 'The engine whose crew and duties the matrix shows' })
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId: string;
}
