import {
  IsBoolean,
  IsInt,
  IsOptional,
  Max,
  Min,
  IsString,
  Length,
  Validate,
  ValidatorConstraint,
  type ValidatorConstraintInterface,
} from 'class-validator';
import type { UpdateSiteSettingsRequest } from '@crankjournal/shared-types';
import { isKnownTimeZone } from '../../../common/pdf/zoned-time.js';

@ValidatorConstraint({ name: 'timeZone' })
class KnownTimeZone implements ValidatorConstraintInterface {
  validate(v: unknown) {
    return typeof v === 'string' && /^[A-Za-z_]+(\/[A-Za-z0-9_+-]+)*$/.test(v) && isKnownTimeZone(v);
  }
  defaultMessage() {
    return 'timeZone must be a time zone name such as Europe/London or America/Chicago';
  }
}

export class UpdateSiteSettingsDto implements UpdateSiteSettingsRequest {
  @IsOptional() @IsString() @Length(1, 120) worksName?: string;
  @IsOptional() @IsString() @Validate(KnownTimeZone) timeZone?: string;
  @IsOptional() @IsBoolean() wetSignature?: boolean;
  @IsOptional()
  @IsInt({ message: 'depositSharePct must be a whole number of percent' })
  @Min(0)
  @Max(100)
  depositSharePct?: number;
}
